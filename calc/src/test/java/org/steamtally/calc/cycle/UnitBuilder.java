package org.steamtally.calc.cycle;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Builds a unit description and a matching snapshot in a few lines. Each measured state gets sensors
 * named {@code p_<state>}, {@code T_<state>}, {@code m_<state>}. The default standard uncertainties
 * are of the size of good plant instruments (our own choice, not from a standard): pressure 0.25 % of
 * reading, temperature 0.3 K, mass flow 0.5 %, electrical power 0.2 %.
 */
final class UnitBuilder {

    static final Instant TIME = Instant.parse("2026-03-01T12:00:00Z");

    private final String unitId;
    private final Map<String, Sensor> sensors = new LinkedHashMap<>();
    private final Map<String, Double> values = new LinkedHashMap<>();
    private final Map<String, StateFix> fixes = new LinkedHashMap<>();
    private final Map<String, String> flowSensors = new LinkedHashMap<>();
    private final List<Component> components = new ArrayList<>();

    UnitBuilder(String unitId) {
        this.unitId = unitId;
    }

    UnitBuilder sensor(String id, Quantity quantity, double value, double u, double min, double max) {
        sensors.put(id, new Sensor(id, quantity, quantity.siUnit(), u, UncertaintyBasis.STANDARD, min, max,
                Duration.ofSeconds(30), Optional.empty()));
        values.put(id, value);
        return this;
    }

    UnitBuilder pressure(String id, double p) {
        return sensor(id, Quantity.PRESSURE, p, 0.0025 * p, 0.0, 40e6);
    }

    UnitBuilder temperature(String id, double t) {
        return sensor(id, Quantity.TEMPERATURE, t, 0.3, 273.15, 900.0);
    }

    UnitBuilder massFlow(String id, double m) {
        return sensor(id, Quantity.MASS_FLOW, m, 0.005 * m, 0.0, 20_000.0);
    }

    UnitBuilder power(String id, double w) {
        return sensor(id, Quantity.POWER, w, 0.002 * w, 0.0, 2e9);
    }

    UnitBuilder measured(String state, double p, double t) {
        pressure("p_" + state, p);
        temperature("T_" + state, t);
        fixes.put(state, new StateFix.MeasuredPressureTemperature("p_" + state, "T_" + state));
        return this;
    }

    UnitBuilder saturatedLiquid(String state, double p) {
        pressure("p_" + state, p);
        fixes.put(state, new StateFix.SaturatedLiquid("p_" + state));
        return this;
    }

    UnitBuilder saturatedVapour(String state, double p) {
        pressure("p_" + state, p);
        fixes.put(state, new StateFix.SaturatedVapour("p_" + state));
        return this;
    }

    UnitBuilder wet(String state, double p, double x) {
        pressure("p_" + state, p);
        fixes.put(state, new StateFix.PressureQuality("p_" + state, x));
        return this;
    }

    UnitBuilder balanced(String state, double p, String componentId) {
        pressure("p_" + state, p);
        fixes.put(state, new StateFix.EnergyBalance("p_" + state, componentId));
        return this;
    }

    UnitBuilder ideal(String state, String from, String pressureOf) {
        fixes.put(state, new StateFix.Isentropic(from, pressureOf));
        return this;
    }

    UnitBuilder fix(String state, StateFix f) {
        fixes.put(state, f);
        return this;
    }

    UnitBuilder flow(String state, double m) {
        massFlow("m_" + state, m);
        flowSensors.put(state, "m_" + state);
        return this;
    }

    UnitBuilder flowSensor(String state, String sensorId) {
        flowSensors.put(state, sensorId);
        return this;
    }

    UnitBuilder component(Component c) {
        components.add(c);
        return this;
    }

    /** Changes a sensor's value in the snapshot. */
    UnitBuilder set(String sensorId, double v) {
        if (!values.containsKey(sensorId)) {
            throw new IllegalArgumentException("no sensor " + sensorId);
        }
        values.put(sensorId, v);
        return this;
    }

    double value(String sensorId) {
        return values.get(sensorId);
    }

    UnitDescription unit() {
        List<StateDefinition> states = new ArrayList<>();
        fixes.forEach((id, f) -> states.add(new StateDefinition(id, f, Optional.ofNullable(flowSensors.get(id)))));
        return new UnitDescription(unitId, unitId, new ArrayList<>(sensors.values()), states, components,
                DeadState.STANDARD);
    }

    CycleModel model() {
        return CycleModel.compile("site", unit());
    }

    double[] values() {
        return values.values().stream().mapToDouble(Double::doubleValue).toArray();
    }

    int index(String sensorId) {
        return new ArrayList<>(sensors.keySet()).indexOf(sensorId);
    }

    Snapshot snapshot() {
        return Snapshot.allGood(TIME, unitId, values());
    }
}
