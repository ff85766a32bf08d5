package org.steamtally.calc.cycle;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
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
 * A reheat-regenerative unit of our own invention for the benchmarks: 15 flowing states and 4
 * ideal references, 33 sensors. HP section with one extraction to the HP closed heater, reheater,
 * IP/LP section with extractions to the deaerator and the LP closed heater (whose drain cascades
 * to the condenser), the exhaust enthalpy from the condenser's cooling-water duty, condensate and
 * feed pumps with motor-power meters, a fuel-flow meter and a generator on both sections. The
 * values are one consistent operating point (sections of 88 % and 90 %, pumps of about 80 %).
 */
public final class RegenerativeUnitFixture {

    private final List<Sensor> sensors = new ArrayList<>();
    private final List<Double> values = new ArrayList<>();
    private final List<StateDefinition> states = new ArrayList<>();

    private RegenerativeUnitFixture() {
    }

    /** The unit description. */
    public static UnitDescription unit() {
        return build().description();
    }

    /** One value per sensor, in the unit's sensor order. */
    public static double[] values() {
        return build().values.stream().mapToDouble(Double::doubleValue).toArray();
    }

    /** When {@link #snapshot} is taken. */
    public static final Instant SNAPSHOT_TIME = Instant.parse("2026-03-01T12:00:00Z");

    /** One all-good snapshot of the unit at {@link #values}, the input the benchmarks evaluate. */
    public static Snapshot snapshot() {
        return Snapshot.allGood(SNAPSHOT_TIME, unit().id(), values());
    }

    private static RegenerativeUnitFixture build() {
        RegenerativeUnitFixture f = new RegenerativeUnitFixture();
        f.measured("main_steam", 16.5e6, 811.0, true, 150.0);
        f.measured("hp_extraction", 4.2e6, 610.0, false, 0.0);
        f.measured("cold_reheat", 3.9e6, 601.0, false, 0.0);
        f.measured("hot_reheat", 3.6e6, 811.0, false, 0.0);
        f.measured("ip_extraction", 0.8e6, 600.5, false, 0.0);
        f.measured("lp_extraction", 0.15e6, 430.5, false, 0.0);
        f.pressure("exhaust", 7e3, new StateFix.EnergyBalance("p_exhaust", "condenser"));
        f.pressure("condensate", 7e3, new StateFix.SaturatedLiquid("p_condensate"));
        f.measured("condensate_pumped", 1.0e6, 312.25, false, 0.0);
        f.measured("lp_heater_out", 0.95e6, 380.5, false, 0.0);
        f.pressure("lp_drain", 0.15e6, new StateFix.SaturatedLiquid("p_lp_drain"));
        f.pressure("deaerator_out", 0.8e6, new StateFix.SaturatedLiquid("p_deaerator_out"));
        f.measured("feed_pumped", 17.5e6, 446.6, false, 0.0);
        f.measured("feedwater", 17.3e6, 523.4, false, 0.0);
        f.pressure("hp_drain", 4.2e6, new StateFix.SaturatedLiquid("p_hp_drain"));
        f.reference("hp_ideal", "main_steam", "cold_reheat");
        f.reference("lp_ideal", "hot_reheat", "exhaust");
        f.reference("condensate_pump_ideal", "condensate", "condensate_pumped");
        f.reference("feed_pump_ideal", "deaerator_out", "feed_pumped");
        f.sensor("m_cw", Quantity.MASS_FLOW, COOLING_WATER_FLOW, 0.005 * COOLING_WATER_FLOW, 0.0, 20_000.0);
        f.sensor("T_cw_in", Quantity.TEMPERATURE, 293.0, 0.3, 273.15, 900.0);
        f.sensor("T_cw_out", Quantity.TEMPERATURE, 306.0, 0.3, 273.15, 900.0);
        f.sensor("P_gen", Quantity.POWER, GENERATOR_POWER, 0.002 * GENERATOR_POWER, 0.0, 2e9);
        f.sensor("P_condensate_pump", Quantity.POWER, CONDENSATE_PUMP_POWER, 0.01 * CONDENSATE_PUMP_POWER, 0.0, 2e9);
        f.sensor("P_feed_pump", Quantity.POWER, FEED_PUMP_POWER, 0.01 * FEED_PUMP_POWER, 0.0, 2e9);
        f.sensor("m_fuel", Quantity.MASS_FLOW, FUEL_FLOW, 0.01 * FUEL_FLOW, 0.0, 20_000.0);
        return f;
    }

    static final double COOLING_WATER_FLOW = 4187.0;
    static final double GENERATOR_POWER = 181.2e6;
    static final double CONDENSATE_PUMP_POWER = 0.157e6;
    static final double FEED_PUMP_POWER = 3.54e6;
    static final double FUEL_FLOW = 18.6;

    private UnitDescription description() {
        UncertainConstant motor = new UncertainConstant(0.95, 0.01);
        List<Component> components = List.of(
                new Component.SteamGenerator("boiler", "feedwater", "main_steam",
                        Optional.of(new FuelMeasurement("m_fuel", new UncertainConstant(25.0e6, 0.25e6),
                                new UncertainConstant(0.88, 0.01)))),
                new Component.TurbineSection("hp", "main_steam", "cold_reheat", List.of("hp_extraction"),
                        Optional.of("hp_ideal")),
                new Component.Reheater("reheater", "cold_reheat", "hot_reheat"),
                new Component.TurbineSection("lp", "hot_reheat", "exhaust", List.of("ip_extraction", "lp_extraction"),
                        Optional.of("lp_ideal")),
                new Component.Condenser("condenser", List.of("exhaust", "lp_drain"), "condensate",
                        Optional.of(new CoolingWater("m_cw", "T_cw_in", "T_cw_out", 0.2e6))),
                new Component.Pump("condensate_pump", "condensate", "condensate_pumped",
                        Optional.of(new MotorMeasurement("P_condensate_pump", motor)),
                        Optional.of("condensate_pump_ideal")),
                new Component.ClosedFeedwaterHeater("lp_heater", "condensate_pumped", "lp_heater_out", "lp_extraction",
                        List.of(), "lp_drain"),
                new Component.OpenFeedwaterHeater("deaerator", List.of("lp_heater_out", "ip_extraction", "hp_drain"),
                        "deaerator_out"),
                new Component.Pump("feed_pump", "deaerator_out", "feed_pumped",
                        Optional.of(new MotorMeasurement("P_feed_pump", motor)), Optional.of("feed_pump_ideal")),
                new Component.ClosedFeedwaterHeater("hp_heater", "feed_pumped", "feedwater", "hp_extraction",
                        List.of(), "hp_drain"),
                new Component.Generator("generator", List.of("hp", "lp"), "P_gen", new UncertainConstant(0.985, 0.002)));
        return new UnitDescription("unit1", "Unit 1", sensors, states, components, DeadState.STANDARD);
    }

    private void sensor(String id, Quantity q, double value, double u, double min, double max) {
        sensors.add(new Sensor(id, q, q.siUnit(), u, UncertaintyBasis.STANDARD, min, max, Duration.ofSeconds(30),
                Optional.empty()));
        values.add(value);
    }

    private void measured(String id, double p, double t, boolean metered, double m) {
        sensor("p_" + id, Quantity.PRESSURE, p, 0.0025 * p, 0.0, 40e6);
        sensor("T_" + id, Quantity.TEMPERATURE, t, 0.3, 273.15, 900.0);
        if (metered) {
            sensor("m_" + id, Quantity.MASS_FLOW, m, 0.005 * m, 0.0, 20_000.0);
        }
        states.add(new StateDefinition(id, new StateFix.MeasuredPressureTemperature("p_" + id, "T_" + id),
                metered ? Optional.of("m_" + id) : Optional.empty()));
    }

    private void pressure(String id, double p, StateFix fix) {
        sensor("p_" + id, Quantity.PRESSURE, p, 0.0025 * p, 0.0, 40e6);
        states.add(new StateDefinition(id, fix, Optional.empty()));
    }

    private void reference(String id, String from, String pressureOf) {
        states.add(new StateDefinition(id, new StateFix.Isentropic(from, pressureOf), Optional.empty()));
    }
}
