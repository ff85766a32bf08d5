package org.steamtally.calc.sim;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;

/**
 * The full-load design operating point of one unit, from which {@link TruthModel} derives every
 * sensor's true value. Everything in SI.
 *
 * <p>What to give:
 * <ul>
 *   <li>{@code referenceFlows}: the mass flow of one state (or of as many as the plant description
 *       meters on its states), kg/s, e.g. main steam; every other flow follows from the balances;</li>
 *   <li>{@code sensorValuesSi}: the pressure sensor of every flowing state; the temperature sensor of
 *       every (p, T)-fixed state except turbine and pump outlets whose temperature is to follow
 *       from an isentropic efficiency; each condenser's cooling-water flow and inlet temperature;
 *       and any sensor that no state or balance uses (held constant);</li>
 *   <li>{@code isentropicEfficiencies}: by turbine-section or pump id, for every section or pump
 *       with an outlet whose temperature is not given, and for every one whose outlet is fixed by an
 *       energy balance (the wet exhaust);</li>
 *   <li>{@code flowMeters}: flow sensors that meter a state's flow without being declared as its
 *       {@code flow} (a second meter kept for reconciliation), sensor id to state id;</li>
 *   <li>{@code turbineCasingLossFraction}: heat lost through the turbine casings, as a fraction of
 *       each section's steam-side work, 0 for none (see docs/SIMULATOR.md).</li>
 * </ul>
 * Values derived from the balances (generator and motor powers, fuel flow, cooling-water outlet
 * temperature, flow sensors) must not be given.
 *
 * @param referenceFlows             state id to mass flow at full load, kg/s, &gt; 0; at least one
 * @param sensorValuesSi             sensor id to its design value, SI
 * @param isentropicEfficiencies     turbine-section or pump id to isentropic efficiency, within (0, 1]
 * @param flowMeters                 flow sensor id to the state whose flow it meters
 * @param turbineCasingLossFraction  within [0, 0.05)
 */
public record DesignPoint(Map<String, Double> referenceFlows, Map<String, Double> sensorValuesSi,
                          Map<String, Double> isentropicEfficiencies, Map<String, String> flowMeters,
                          double turbineCasingLossFraction) {

    public DesignPoint {
        referenceFlows = Map.copyOf(referenceFlows);
        sensorValuesSi = Map.copyOf(sensorValuesSi);
        isentropicEfficiencies = Map.copyOf(isentropicEfficiencies);
        flowMeters = Map.copyOf(flowMeters);
        if (referenceFlows.isEmpty()) {
            throw new IllegalArgumentException("a design point needs the flow of at least one state");
        }
        referenceFlows.forEach((state, m) -> {
            if (!(m > 0.0) || !Double.isFinite(m)) {
                throw new IllegalArgumentException("design flow of state \"" + state + "\" must be a positive number of kg/s, was " + m);
            }
        });
        sensorValuesSi.forEach((sensor, v) -> {
            if (!Double.isFinite(v)) {
                throw new IllegalArgumentException("design value of sensor \"" + sensor + "\" must be finite, was " + v);
            }
        });
        isentropicEfficiencies.forEach((component, eta) -> {
            if (!(eta > 0.0 && eta <= 1.0)) {
                throw new IllegalArgumentException("isentropic efficiency of \"" + component
                        + "\" must lie within 0 (exclusive) and 1, was " + eta);
            }
        });
        if (!(turbineCasingLossFraction >= 0.0 && turbineCasingLossFraction < 0.05)) {
            throw new IllegalArgumentException("turbine casing loss must be a fraction within 0 to 0.05 of the work, was "
                    + turbineCasingLossFraction);
        }
    }

    /** A builder, for readable design points in code. */
    public static Builder builder() {
        return new Builder();
    }

    /** Collects a design point; each method returns the builder. */
    public static final class Builder {
        private final Map<String, Double> flows = new LinkedHashMap<>();
        private final Map<String, Double> values = new LinkedHashMap<>();
        private final Map<String, Double> efficiencies = new LinkedHashMap<>();
        private final Map<String, String> meters = new LinkedHashMap<>();
        private double casingLoss;

        private Builder() {
        }

        /** The full-load flow of a state, kg/s. */
        public Builder flow(String stateId, double kgPerS) {
            flows.put(Objects.requireNonNull(stateId, "stateId"), kgPerS);
            return this;
        }

        /** A sensor's design value, SI. */
        public Builder value(String sensorId, double valueSi) {
            values.put(Objects.requireNonNull(sensorId, "sensorId"), valueSi);
            return this;
        }

        /** A turbine section's or pump's isentropic efficiency, a fraction. */
        public Builder isentropicEfficiency(String componentId, double eta) {
            efficiencies.put(Objects.requireNonNull(componentId, "componentId"), eta);
            return this;
        }

        /** A flow sensor that meters a state's flow without being declared as its flow sensor. */
        public Builder flowMeter(String sensorId, String stateId) {
            meters.put(Objects.requireNonNull(sensorId, "sensorId"), Objects.requireNonNull(stateId, "stateId"));
            return this;
        }

        /** Turbine casing heat loss as a fraction of each section's steam-side work. */
        public Builder turbineCasingLossFraction(double fraction) {
            casingLoss = fraction;
            return this;
        }

        public DesignPoint build() {
            return new DesignPoint(flows, values, efficiencies, meters, casingLoss);
        }
    }
}
