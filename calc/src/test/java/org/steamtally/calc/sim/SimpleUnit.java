package org.steamtally.calc.sim;

import java.time.Duration;
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
 * A non-reheat unit of our own, shaped like the shipped simple example (boiler, turbine, condenser
 * whose cooling water fixes the wet exhaust, feed pump with motor, generator), built in code so the
 * calc module's tests need no YAML. Standard uncertainties are of the size of good plant instruments
 * (our own choice).
 */
final class SimpleUnit {

    static final double MAIN_STEAM_PA = 9.0e6;
    static final double MAIN_STEAM_K = 783.15;
    static final double EXHAUST_PA = 7.0e3;
    static final double FEED_PA = 10.5e6;
    static final double MAIN_FLOW = 36.0;
    static final double COOLING_FLOW = 1700.0;
    static final double COOLING_IN_K = 291.15;

    private SimpleUnit() {
    }

    private static Sensor sensor(String id, Quantity q, double u, double min, double max) {
        return new Sensor(id, q, q.siUnit(), u, UncertaintyBasis.STANDARD, min, max, Duration.ofSeconds(5),
                Optional.of("fernholm/unit1/" + id));
    }

    static UnitDescription unit() {
        return unit(false);
    }

    /**
     * @param exactConstants efficiencies and heating value without uncertainty, so that every
     *                       closure's u(r) comes from the sensors alone
     */
    static UnitDescription unit(boolean exactConstants) {
        double k = exactConstants ? 0.0 : 1.0;
        List<Sensor> sensors = List.of(
                sensor("PT-101", Quantity.PRESSURE, 15e3, 0, 16e6),
                sensor("TT-101", Quantity.TEMPERATURE, 0.75, 273.15, 873.15),
                sensor("FT-101", Quantity.MASS_FLOW, 0.22, 0, 55),
                sensor("PT-301", Quantity.PRESSURE, 25, 0, 25e3),
                sensor("PT-302", Quantity.PRESSURE, 25, 0, 25e3),
                sensor("PT-401", Quantity.PRESSURE, 20e3, 0, 16e6),
                sensor("TT-401", Quantity.TEMPERATURE, 0.25, 273.15, 373.15),
                sensor("FT-501", Quantity.MASS_FLOW, 17, 0, 2500),
                sensor("TT-501", Quantity.TEMPERATURE, 0.1, 268.15, 318.15),
                sensor("TT-502", Quantity.TEMPERATURE, 0.1, 268.15, 323.15),
                sensor("FT-900", Quantity.MASS_FLOW, 0.04, 0, 8),
                sensor("JT-001", Quantity.POWER, 40e3, 0, 50e6),
                sensor("JT-401", Quantity.POWER, 1.25e3, 0, 1e6));
        List<StateDefinition> states = List.of(
                new StateDefinition("main_steam", new StateFix.MeasuredPressureTemperature("PT-101", "TT-101"),
                        Optional.of("FT-101")),
                new StateDefinition("exhaust", new StateFix.EnergyBalance("PT-301", "condenser"), Optional.empty()),
                new StateDefinition("exhaust_ideal", new StateFix.Isentropic("main_steam", "exhaust"), Optional.empty()),
                new StateDefinition("condensate", new StateFix.SaturatedLiquid("PT-302"), Optional.empty()),
                new StateDefinition("feedwater", new StateFix.MeasuredPressureTemperature("PT-401", "TT-401"),
                        Optional.empty()),
                new StateDefinition("feedwater_ideal", new StateFix.Isentropic("condensate", "feedwater"),
                        Optional.empty()));
        List<Component> components = List.of(
                new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.of(new FuelMeasurement(
                        "FT-900", new UncertainConstant(25.1e6, k * 0.25e6), new UncertainConstant(0.89, k * 0.01)))),
                new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of(), Optional.of("exhaust_ideal")),
                new Component.Condenser("condenser", List.of("exhaust"), "condensate",
                        Optional.of(new CoolingWater("FT-501", "TT-501", "TT-502", 250e3))),
                new Component.Pump("feed_pump", "condensate", "feedwater",
                        Optional.of(new MotorMeasurement("JT-401", new UncertainConstant(0.95, k * 0.01))),
                        Optional.of("feedwater_ideal")),
                new Component.Generator("generator", List.of("turbine"), "JT-001", new UncertainConstant(0.975, k * 0.003)));
        return new UnitDescription("unit1", "simple test unit", sensors, states, components, new DeadState(288.15, 100.8e3));
    }

    static DesignPoint.Builder design() {
        return DesignPoint.builder()
                .flow("main_steam", MAIN_FLOW)
                .value("PT-101", MAIN_STEAM_PA).value("TT-101", MAIN_STEAM_K)
                .value("PT-301", EXHAUST_PA).value("PT-302", EXHAUST_PA)
                .value("PT-401", FEED_PA)
                .value("FT-501", COOLING_FLOW).value("TT-501", COOLING_IN_K)
                .isentropicEfficiency("turbine", 0.86)
                .isentropicEfficiency("feed_pump", 0.80);
    }

    static TruthModel truth() {
        return TruthModel.of(unit(), design().build());
    }
}
