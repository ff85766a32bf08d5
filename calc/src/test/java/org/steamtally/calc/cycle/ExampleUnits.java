package org.steamtally.calc.cycle;

import java.util.List;
import java.util.Optional;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.CoolingWater;
import org.steamtally.calc.plant.FuelMeasurement;
import org.steamtally.calc.plant.MotorMeasurement;
import org.steamtally.calc.plant.UncertainConstant;

/**
 * Example units of our own invention (no textbook numbers), with snapshot values chosen to be a
 * consistent operating point: turbine sections of about 87 % to 90 % isentropic efficiency, pumps
 * of about 80 %, and independent measurements a little off the steam side, as real ones are.
 */
final class ExampleUnits {

    static final double GENERATOR_EFFICIENCY = 0.985;
    static final double GENERATOR_EFFICIENCY_U = 0.002;
    static final double MOTOR_EFFICIENCY = 0.95;
    static final double MOTOR_EFFICIENCY_U = 0.01;
    static final double HEATING_VALUE = 25.0e6;
    static final double HEATING_VALUE_U = 0.25e6;
    static final double BOILER_EFFICIENCY = 0.88;
    static final double BOILER_EFFICIENCY_U = 0.01;
    static final double COOLING_WATER_PRESSURE = 0.2e6;

    private ExampleUnits() {
    }

    /**
     * A reheat unit: boiler, HP section, reheater, LP section into a wet exhaust whose enthalpy
     * comes from the condenser's cooling-water duty, condensate pump to the boiler. The generator
     * drives both sections; the boiler has a fuel-flow meter, the pump a motor-power meter.
     */
    static UnitBuilder reheat() {
        return new UnitBuilder("reheat")
                .measured("main_steam", 14e6, 808.0)
                .flow("main_steam", 100.0)
                .measured("cold_reheat", 3.2e6, 596.0)
                .measured("hot_reheat", 3.0e6, 808.0)
                .balanced("exhaust", 9e3, "condenser")
                .saturatedLiquid("condensate", 9e3)
                .measured("feedwater", 15e6, 318.3)
                .ideal("hp_ideal", "main_steam", "cold_reheat")
                .ideal("lp_ideal", "hot_reheat", "exhaust")
                .massFlow("m_cw", 3360.0)
                .temperature("T_cw_in", 295.0)
                .temperature("T_cw_out", 311.0)
                .power("P_gen", 145.2e6)
                .power("P_pump", 1.95e6)
                .massFlow("m_fuel", 16.8)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam",
                        Optional.of(new FuelMeasurement("m_fuel",
                                new UncertainConstant(HEATING_VALUE, HEATING_VALUE_U),
                                new UncertainConstant(BOILER_EFFICIENCY, BOILER_EFFICIENCY_U)))))
                .component(new Component.TurbineSection("hp", "main_steam", "cold_reheat", List.of(),
                        Optional.of("hp_ideal")))
                .component(new Component.Reheater("reheater", "cold_reheat", "hot_reheat"))
                .component(new Component.TurbineSection("lp", "hot_reheat", "exhaust", List.of(),
                        Optional.of("lp_ideal")))
                .component(new Component.Condenser("condenser", List.of("exhaust"), "condensate",
                        Optional.of(new CoolingWater("m_cw", "T_cw_in", "T_cw_out", COOLING_WATER_PRESSURE))))
                .component(new Component.Pump("pump", "condensate", "feedwater",
                        Optional.of(new MotorMeasurement("P_pump",
                                new UncertainConstant(MOTOR_EFFICIENCY, MOTOR_EFFICIENCY_U))),
                        Optional.empty()))
                .component(new Component.Generator("generator", List.of("hp", "lp"), "P_gen",
                        new UncertainConstant(GENERATOR_EFFICIENCY, GENERATOR_EFFICIENCY_U)));
    }

    /**
     * A regenerative unit with one closed and one open feedwater heater: one turbine section with
     * two extractions, the upper to the closed heater, whose drain cascades into the open heater
     * (deaerator), the lower to the open heater. The exhaust enthalpy comes from the generator
     * output; the condenser's cooling water is then an independent check.
     */
    static UnitBuilder regenerative() {
        return new UnitBuilder("regen")
                .measured("main_steam", 10e6, 793.15)
                .flow("main_steam", 80.0)
                .measured("hp_extraction", 1.8e6, 562.0)
                .measured("lp_extraction", 0.45e6, 429.0)
                .balanced("exhaust", 8e3, "turbine")
                .saturatedLiquid("condensate", 8e3)
                .measured("condensate_pumped", 0.5e6, 314.8)
                .saturatedLiquid("deaerator_out", 0.45e6)
                .measured("feed_pumped", 10.5e6, 422.8)
                .measured("feedwater", 10.4e6, 475.0)
                .saturatedLiquid("heater_drain", 1.8e6)
                .ideal("exhaust_ideal", "main_steam", "exhaust")
                .power("P_gen", 79.0e6)
                .massFlow("m_cw", 1880.0)
                .temperature("T_cw_in", 293.0)
                .temperature("T_cw_out", 309.0)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust",
                        List.of("hp_extraction", "lp_extraction"), Optional.of("exhaust_ideal")))
                .component(new Component.Condenser("condenser", List.of("exhaust"), "condensate",
                        Optional.of(new CoolingWater("m_cw", "T_cw_in", "T_cw_out", COOLING_WATER_PRESSURE))))
                .component(new Component.Pump("condensate_pump", "condensate", "condensate_pumped", Optional.empty(),
                        Optional.empty()))
                .component(new Component.OpenFeedwaterHeater("deaerator",
                        List.of("condensate_pumped", "lp_extraction", "heater_drain"), "deaerator_out"))
                .component(new Component.Pump("feed_pump", "deaerator_out", "feed_pumped", Optional.empty(),
                        Optional.empty()))
                .component(new Component.ClosedFeedwaterHeater("hp_heater", "feed_pumped", "feedwater",
                        "hp_extraction", List.of(), "heater_drain"))
                .component(new Component.Generator("generator", List.of("turbine"), "P_gen",
                        new UncertainConstant(GENERATOR_EFFICIENCY, GENERATOR_EFFICIENCY_U)));
    }
}
