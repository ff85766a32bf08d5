package org.steamtally.calc.alarm;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.CoolingWater;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.FuelMeasurement;
import org.steamtally.calc.plant.MotorMeasurement;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UncertainConstant;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

/**
 * A reheat unit of our own invention (the same operating point as the cycle model's tests): boiler
 * with a fuel meter, HP and LP sections on one generator, a wet exhaust fixed by the condenser's
 * cooling water, a pump with a motor-power meter. Its snapshot is a consistent operating point, so
 * every closure's |z| is small until a test disturbs a sensor.
 */
final class ReheatUnit {

    static final String UNIT = "reheat";

    final Map<String, Sensor> sensors = new LinkedHashMap<>();
    final Map<String, Double> values = new LinkedHashMap<>();
    private final List<StateDefinition> states = new ArrayList<>();

    ReheatUnit() {
        measured("main_steam", 14e6, 808.0);
        sensor("m_main_steam", Quantity.MASS_FLOW, 100.0, 0.5, 0.0, 200.0);
        measured("cold_reheat", 3.2e6, 596.0);
        measured("hot_reheat", 3.0e6, 808.0);
        pressure("p_exhaust", 9e3);
        pressure("p_condensate", 9e3);
        measured("feedwater", 15e6, 318.3);
        sensor("m_cw", Quantity.MASS_FLOW, 3360.0, 16.8, 0.0, 20_000.0);
        temperature("T_cw_in", 295.0);
        temperature("T_cw_out", 311.0);
        sensor("P_gen", Quantity.POWER, 145.2e6, 0.29e6, 0.0, 2e9);
        sensor("P_pump", Quantity.POWER, 1.95e6, 3.9e3, 0.0, 2e9);
        sensor("m_fuel", Quantity.MASS_FLOW, 16.8, 0.084, 0.0, 200.0);
        state("main_steam", new StateFix.MeasuredPressureTemperature("p_main_steam", "T_main_steam"), "m_main_steam");
        state("cold_reheat", new StateFix.MeasuredPressureTemperature("p_cold_reheat", "T_cold_reheat"), null);
        state("hot_reheat", new StateFix.MeasuredPressureTemperature("p_hot_reheat", "T_hot_reheat"), null);
        state("exhaust", new StateFix.EnergyBalance("p_exhaust", "condenser"), null);
        state("condensate", new StateFix.SaturatedLiquid("p_condensate"), null);
        state("feedwater", new StateFix.MeasuredPressureTemperature("p_feedwater", "T_feedwater"), null);
        state("hp_ideal", new StateFix.Isentropic("main_steam", "cold_reheat"), null);
        state("lp_ideal", new StateFix.Isentropic("hot_reheat", "exhaust"), null);
    }

    private void sensor(String id, Quantity q, double value, double u, double min, double max) {
        sensors.put(id, new Sensor(id, q, q.siUnit(), u, UncertaintyBasis.STANDARD, min, max, Duration.ofSeconds(30),
                Optional.empty()));
        values.put(id, value);
    }

    private void pressure(String id, double p) {
        sensor(id, Quantity.PRESSURE, p, 0.0025 * p, 0.0, 40e6);
    }

    private void temperature(String id, double t) {
        sensor(id, Quantity.TEMPERATURE, t, 0.3, 273.15, 900.0);
    }

    private void measured(String state, double p, double t) {
        pressure("p_" + state, p);
        temperature("T_" + state, t);
    }

    private void state(String id, StateFix fix, String flow) {
        states.add(new StateDefinition(id, fix, Optional.ofNullable(flow)));
    }

    UnitDescription unit() {
        List<Component> components = List.of(
                new Component.SteamGenerator("boiler", "feedwater", "main_steam",
                        Optional.of(new FuelMeasurement("m_fuel", new UncertainConstant(25.0e6, 0.25e6),
                                new UncertainConstant(0.88, 0.01)))),
                new Component.TurbineSection("hp", "main_steam", "cold_reheat", List.of(), Optional.of("hp_ideal")),
                new Component.Reheater("reheater", "cold_reheat", "hot_reheat"),
                new Component.TurbineSection("lp", "hot_reheat", "exhaust", List.of(), Optional.of("lp_ideal")),
                new Component.Condenser("condenser", List.of("exhaust"), "condensate",
                        Optional.of(new CoolingWater("m_cw", "T_cw_in", "T_cw_out", 0.2e6))),
                new Component.Pump("pump", "condensate", "feedwater",
                        Optional.of(new MotorMeasurement("P_pump", new UncertainConstant(0.95, 0.01))), Optional.empty()),
                new Component.Generator("generator", List.of("hp", "lp"), "P_gen", new UncertainConstant(0.985, 0.002)));
        return new UnitDescription(UNIT, UNIT, new ArrayList<>(sensors.values()), states, components,
                DeadState.STANDARD);
    }

    CycleModel model() {
        return CycleModel.compile("fernholm", unit());
    }

    int index(String sensorId) {
        return new ArrayList<>(sensors.keySet()).indexOf(sensorId);
    }

    /** A snapshot of the operating point, with some sensors changed (id, value pairs) and all good. */
    Snapshot snapshot(Instant t, Object... changes) {
        double[] v = values.values().stream().mapToDouble(Double::doubleValue).toArray();
        for (int k = 0; k < changes.length; k += 2) {
            v[index((String) changes[k])] = ((Number) changes[k + 1]).doubleValue();
        }
        return Snapshot.allGood(t, UNIT, v);
    }

    /** A snapshot of the operating point with one sensor given a status other than good. */
    Snapshot snapshotWithStatus(Instant t, String sensorId, Snapshot.SensorStatus status) {
        Snapshot good = snapshot(t);
        Snapshot.SensorStatus[] s = good.status().clone();
        s[index(sensorId)] = status;
        return new Snapshot(t, UNIT, Arrays.copyOf(good.valuesSi(), good.valuesSi().length), s);
    }
}
