package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.MotorMeasurement;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertainConstant;

/**
 * A mixer outlet declared as fixed by the mixer's energy balance takes its enthalpy from the
 * adiabatic mixing of the inlets, h_out = Σ m_in h_in / m_out, once the flows are solved: the
 * common case of a closed heater's drain pumped forward into the feedwater line, where measuring the
 * mixed temperature would over-determine the flows. Checked against the same unit worked by hand
 * with the independent {@code com.hummeling:if97}.
 */
class MixerOutletTest {

    private static final double MAIN_FLOW = 80.0;
    private static final double FEED_PA = 1.1e6;
    private static final double MOTOR_EFFICIENCY = 0.95;
    private static final double MOTOR_EFFICIENCY_U = 0.01;
    /** Drain-pump discharge 0.05 K above the drain's saturation temperature (our own choice). */
    private static final double DRAIN_PUMPED_K = IndependentSteam.tSat(0.95e6) + 0.05;

    /**
     * Boiler, turbine with one extraction to a closed heater, condenser, condensate pump through the
     * heater, the heater's drain pumped forward and mixed into the heated condensate, feed pump with
     * a metered motor. Our own operating point.
     */
    private static UnitBuilder unit() {
        double feedwaterK = 445.0;
        return new UnitBuilder("mixing")
                .measured("main_steam", 10e6, 793.15)
                .flow("main_steam", MAIN_FLOW)
                .measured("bleed", 1.0e6, 520.0)
                .wet("exhaust", 10e3, 0.9)
                .saturatedLiquid("condensate", 10e3)
                .measured("pumped", 1.2e6, 319.0)
                .measured("heated", FEED_PA, 440.0)
                .saturatedLiquid("drain", 0.95e6)
                .measured("drain_pumped", FEED_PA, DRAIN_PUMPED_K)
                .balanced("mixed", FEED_PA, "mixer")
                .measured("feedwater", 11e6, feedwaterK)
                .power("P_fp", 80.0 * 11.6e3 / MOTOR_EFFICIENCY)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of("bleed"),
                        Optional.empty()))
                .component(new Component.Condenser("condenser", List.of("exhaust"), "condensate", Optional.empty()))
                .component(new Component.Pump("condensate_pump", "condensate", "pumped", Optional.empty(),
                        Optional.empty()))
                .component(new Component.ClosedFeedwaterHeater("heater", "pumped", "heated", "bleed", List.of(),
                        "drain"))
                .component(new Component.Pump("drain_pump", "drain", "drain_pumped", Optional.empty(), Optional.empty()))
                .component(new Component.Mixer("mixer", List.of("heated", "drain_pumped"), "mixed"))
                .component(new Component.Pump("feed_pump", "mixed", "feedwater",
                        Optional.of(new MotorMeasurement("P_fp", new UncertainConstant(MOTOR_EFFICIENCY,
                                MOTOR_EFFICIENCY_U))), Optional.empty()));
    }

    @Test
    void mixerOutletTakesTheEnthalpyOfAdiabaticMixing() {
        UnitResult result = unit().model().evaluate(unit().snapshot());
        double hBleed = IndependentSteam.h(1.0e6, 520.0);
        double hDrain = IndependentSteam.hLiquid(0.95e6);
        double hPumped = IndependentSteam.h(1.2e6, 319.0);
        double hHeated = IndependentSteam.h(FEED_PA, 440.0);
        double hDrainPumped = IndependentSteam.h(FEED_PA, DRAIN_PUMPED_K);
        // Heater: m_b (h_bleed − h_drain) = m_c (h_heated − h_pumped), with m_b + m_c = m.
        double mBleed = MAIN_FLOW * (hHeated - hPumped) / (hBleed - hDrain + hHeated - hPumped);
        double mCondensate = MAIN_FLOW - mBleed;
        double hMixed = (mCondensate * hHeated + mBleed * hDrainPumped) / MAIN_FLOW;
        double tMixed = IndependentSteam.temperaturePH(FEED_PA, hMixed, 440.0);

        StateResult mixed = Results.state(result, "mixed");
        assertTrue(mixed.valid(), String.valueOf(mixed.reason()));
        // Sums of enthalpies that agree to about 1e-9 between the two IF97 implementations.
        assertEquals(hMixed, mixed.enthalpyJPerKg().getAsDouble(), 1e-8 * hMixed, "h mixed");
        // T(p, h) of a compressed liquid: dT = dh / cp, about 1e-3 J/kg / 4.4 kJ/(kg K).
        assertEquals(tMixed, mixed.temperatureK().getAsDouble(), 1e-5, "T mixed");
        assertEquals(MAIN_FLOW, mixed.massFlowKgPerS().getAsDouble(), 1e-9 * MAIN_FLOW, "m mixed");
        assertEquals(mBleed, Results.state(result, "drain_pumped").massFlowKgPerS().getAsDouble(), 1e-8 * mBleed,
                "m drain pumped");
        assertEquals(Phase.LIQUID, mixed.phase().orElseThrow());
        double feedPumpWork = MAIN_FLOW * (IndependentSteam.h(11e6, 445.0) - hMixed);
        assertEquals(-feedPumpWork, Results.component(result, "feed_pump").workOutW().getAsDouble(),
                1e-7 * feedPumpWork, "feed pump work out");
        ComponentResult mixer = Results.component(result, "mixer");
        assertEquals(0.0, mixer.heatInW().getAsDouble(), 0.0, "adiabatic");
        assertTrue(mixer.exergyDestructionW().getAsDouble() > 0.0, "mixing at different temperatures is irreversible");
        Results.assertAllFinite(result);
    }

    @Test
    void closureUncertaintyThroughTheMixingMatchesCentralDifferences() {
        UnitBuilder unit = unit();
        CycleModel model = unit.model();
        ClosureResult closure = Results.closure(model.evaluate(unit.snapshot()), "feed_pump+motor");
        // GUM eq. 10 by hand: each sensor's sensitivity by a central difference of the whole model,
        // plus the motor efficiency, r = W_pump − P η, whose sensitivity −P is exact.
        double variance = Math.pow(unit.value("P_fp") * MOTOR_EFFICIENCY_U, 2);
        for (Sensor sensor : unit.unit().sensors()) {
            double u = sensor.standardUncertaintySi();
            double x = unit.value(sensor.id());
            double step = 1e-3 * u;
            double up = Results.closure(model.evaluate(unit.set(sensor.id(), x + step).snapshot()), "feed_pump+motor")
                    .residualW();
            double down = Results.closure(model.evaluate(unit.set(sensor.id(), x - step).snapshot()), "feed_pump+motor")
                    .residualW();
            unit.set(sensor.id(), x);
            variance += Math.pow((up - down) / (2 * step) * u, 2);
        }
        // Central differences at 1e-3 u are exact to about 1e-6 relative; the model's pressure
        // sensitivities are forward differences on the IF97 equations: 1e-4 leaves room for both.
        assertEquals(Math.sqrt(variance), closure.sigmaW(), 1e-4 * closure.sigmaW(), closure.toString());
    }

    @Test
    void anInvalidInletLeavesTheMixerOutletInvalidWithItsReason() {
        UnitBuilder unit = unit().set("T_drain_pumped", 950.0);
        UnitResult result = unit.model().evaluate(unit.snapshot());
        StateResult mixed = Results.state(result, "mixed");
        assertFalse(mixed.valid());
        assertTrue(mixed.reason().orElseThrow().startsWith("the mixing in \"mixer\" needs state \"drain_pumped\""),
                mixed.reason().orElseThrow());
        assertTrue(Results.state(result, "heated").valid(), "the rest of the unit is still computed");
        Results.assertAllFinite(result);
    }

    @Test
    void onlyTheOutletOfAMixerCanBeFixedByItsMixing() {
        UnitBuilder unit = unit().balanced("heated", FEED_PA, "mixer");
        CycleModelException e = assertThrows(CycleModelException.class, unit::model);
        assertTrue(e.problems().contains("state \"heated\" is fixed by the energy balance of \"mixer\", but only the"
                + " outlet of a mixer takes its enthalpy from the adiabatic mixing of the mixer's inlets"), e.getMessage());
    }
}
