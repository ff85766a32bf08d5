package org.steamtally.calc.plant;

/**
 * How a state of the cycle is fixed. Two independent properties fix a single-phase state; a
 * saturated or wet state needs its pressure and one more fact; a wet turbine exhaust, which no
 * pressure and temperature can fix, takes its enthalpy from a component's energy balance.
 */
public sealed interface StateFix {

    /** Measured pressure and temperature: compressed liquid or superheated vapour. */
    record MeasuredPressureTemperature(String pressureSensor, String temperatureSensor) implements StateFix {
    }

    /** Measured pressure, saturated liquid (x = 0), e.g. a deaerator outlet or a hotwell. */
    record SaturatedLiquid(String pressureSensor) implements StateFix {
    }

    /** Measured pressure, saturated vapour (x = 1), e.g. a drum outlet. */
    record SaturatedVapour(String pressureSensor) implements StateFix {
    }

    /** Measured pressure and a declared or measured-elsewhere vapour quality, 0 ≤ x ≤ 1. */
    record PressureQuality(String pressureSensor, double quality) implements StateFix {
        public PressureQuality {
            if (!(quality >= 0.0 && quality <= 1.0)) {
                throw new IllegalArgumentException("quality must be within 0 to 1, was " + quality);
            }
        }
    }

    /**
     * Measured pressure; the enthalpy follows from the energy balance of one component, using that
     * component's independent measurement (a condenser's cooling-water duty, a turbine's generator
     * output). That balance then fixes the state and no longer checks anything.
     */
    record EnergyBalance(String pressureSensor, String componentId) implements StateFix {
    }

    /**
     * The ideal reference of an expansion or compression: the entropy of state {@code fromState} at
     * the pressure of state {@code pressureOfState}. Not part of the flow loop; used for isentropic
     * efficiencies and the ideal cycle.
     */
    record Isentropic(String fromState, String pressureOfState) implements StateFix {
    }
}
