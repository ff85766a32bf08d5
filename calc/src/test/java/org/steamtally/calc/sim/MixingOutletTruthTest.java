package org.steamtally.calc.sim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.CoolingWater;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

/**
 * A heater drain pumped forward into the feedwater ahead of the heater itself, the mixed outlet's
 * enthalpy declared as the adiabatic mixing of its inlets: the truth must hold the mixing and the
 * heater balance at once, which it reaches by iterating the mixed enthalpy with the flows.
 */
class MixingOutletTruthTest {

    private static Sensor sensor(String id, Quantity q, double u, double max) {
        return new Sensor(id, q, q.siUnit(), u, UncertaintyBasis.STANDARD, 0.0, max, Duration.ofSeconds(5), Optional.empty());
    }

    private static UnitDescription unit() {
        List<Sensor> sensors = List.of(
                sensor("p_main", Quantity.PRESSURE, 2e4, 2e7), sensor("T_main", Quantity.TEMPERATURE, 0.75, 900),
                sensor("m_main", Quantity.MASS_FLOW, 0.2, 100),
                sensor("p_ext", Quantity.PRESSURE, 5e3, 1e7), sensor("T_ext", Quantity.TEMPERATURE, 0.75, 900),
                sensor("p_exh", Quantity.PRESSURE, 25, 2.5e4), sensor("p_cond", Quantity.PRESSURE, 25, 2.5e4),
                sensor("p_fp", Quantity.PRESSURE, 2e4, 2e7), sensor("T_fp", Quantity.TEMPERATURE, 0.25, 600),
                sensor("p_drain", Quantity.PRESSURE, 5e3, 1e7),
                sensor("p_dp", Quantity.PRESSURE, 2e4, 2e7), sensor("T_dp", Quantity.TEMPERATURE, 0.25, 600),
                sensor("p_mixed", Quantity.PRESSURE, 2e4, 2e7),
                sensor("p_fw", Quantity.PRESSURE, 2e4, 2e7), sensor("T_fw", Quantity.TEMPERATURE, 0.25, 600),
                sensor("m_cw", Quantity.MASS_FLOW, 10, 5000), sensor("T_cw_in", Quantity.TEMPERATURE, 0.1, 330),
                sensor("T_cw_out", Quantity.TEMPERATURE, 0.1, 340));
        List<StateDefinition> states = List.of(
                new StateDefinition("main_steam", new StateFix.MeasuredPressureTemperature("p_main", "T_main"),
                        Optional.of("m_main")),
                new StateDefinition("extraction", new StateFix.MeasuredPressureTemperature("p_ext", "T_ext"), Optional.empty()),
                new StateDefinition("exhaust", new StateFix.EnergyBalance("p_exh", "condenser"), Optional.empty()),
                new StateDefinition("condensate", new StateFix.SaturatedLiquid("p_cond"), Optional.empty()),
                new StateDefinition("feed_pumped", new StateFix.MeasuredPressureTemperature("p_fp", "T_fp"), Optional.empty()),
                new StateDefinition("drain", new StateFix.SaturatedLiquid("p_drain"), Optional.empty()),
                new StateDefinition("drain_pumped", new StateFix.MeasuredPressureTemperature("p_dp", "T_dp"), Optional.empty()),
                new StateDefinition("mixed", new StateFix.EnergyBalance("p_mixed", "mixer"), Optional.empty()),
                new StateDefinition("feedwater", new StateFix.MeasuredPressureTemperature("p_fw", "T_fw"), Optional.empty()));
        List<Component> components = List.of(
                new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()),
                new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of("extraction"), Optional.empty()),
                new Component.Condenser("condenser", List.of("exhaust"), "condensate",
                        Optional.of(new CoolingWater("m_cw", "T_cw_in", "T_cw_out", 2e5))),
                new Component.Pump("feed_pump", "condensate", "feed_pumped", Optional.empty(), Optional.empty()),
                new Component.Mixer("mixer", List.of("feed_pumped", "drain_pumped"), "mixed"),
                new Component.ClosedFeedwaterHeater("heater", "mixed", "feedwater", "extraction", List.of(), "drain"),
                new Component.Pump("drain_pump", "drain", "drain_pumped", Optional.empty(), Optional.empty()));
        return new UnitDescription("mix", "mixing test unit", sensors, states, components, DeadState.STANDARD);
    }

    private static TruthModel truth() {
        return TruthModel.of(unit(), DesignPoint.builder()
                .flow("main_steam", 40.0)
                .value("p_main", 8e6).value("T_main", 773.15)
                .value("p_ext", 1.2e6).value("T_ext", 523.15)
                .value("p_exh", 8e3).value("p_cond", 8e3)
                .value("p_fp", 9e6)
                .value("p_drain", 1.1e6)
                .value("p_dp", 9e6)
                .value("p_mixed", 8.9e6)
                .value("p_fw", 8.8e6).value("T_fw", 453.15)
                .value("m_cw", 2000.0).value("T_cw_in", 293.15)
                .isentropicEfficiency("turbine", 0.85)
                .isentropicEfficiency("feed_pump", 0.8)
                .isentropicEfficiency("drain_pump", 0.7)
                .build());
    }

    @ParameterizedTest(name = "load {0}")
    @CsvSource({"1.0", "0.5"})
    void mixedOutletHoldsTheMixingAndTheHeaterBalanceTogether(double load) {
        TruthPoint t = truth().at(new OperatingConditions(load, 0.0));
        TruthState fp = t.state("feed_pumped");
        TruthState dp = t.state("drain_pumped");
        TruthState mixed = t.state("mixed");
        TruthState fw = t.state("feedwater");
        TruthState ext = t.state("extraction");
        TruthState drain = t.state("drain");
        double scale = mixed.massFlowKgPerS() * mixed.enthalpyJPerKg();
        // Mixing: m_out h_out = Σ m_in h_in, and mass.
        assertEquals(fp.massFlowKgPerS() * fp.enthalpyJPerKg() + dp.massFlowKgPerS() * dp.enthalpyJPerKg(),
                mixed.massFlowKgPerS() * mixed.enthalpyJPerKg(), 1e-9 * scale);
        assertEquals(fp.massFlowKgPerS() + dp.massFlowKgPerS(), mixed.massFlowKgPerS(), 1e-9 * mixed.massFlowKgPerS());
        // Heater: the steam's heat goes into the feedwater.
        assertEquals(ext.massFlowKgPerS() * (ext.enthalpyJPerKg() - drain.enthalpyJPerKg()),
                fw.massFlowKgPerS() * (fw.enthalpyJPerKg() - mixed.enthalpyJPerKg()), 1e-9 * scale);
        assertEquals(ext.massFlowKgPerS(), dp.massFlowKgPerS(), 1e-9 * ext.massFlowKgPerS());
        assertEquals(load * 40.0, fw.massFlowKgPerS(), 1e-9);
        assertTrue(mixed.temperatureK() > fp.temperatureK() && mixed.temperatureK() < dp.temperatureK(),
                "the mixed temperature lies between its inlets'");
    }
}
