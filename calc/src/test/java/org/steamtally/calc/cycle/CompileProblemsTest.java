package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.StateFix;

/** A unit description the model cannot solve is rejected at compile time with every problem named. */
class CompileProblemsTest {

    /** A simple cycle: boiler, turbine, condenser, pump. */
    private static UnitBuilder simple() {
        return new UnitBuilder("simple")
                .saturatedLiquid("condensate", 10e3)
                .measured("feedwater", 10.5e6, 320.0)
                .measured("main_steam", 10e6, 773.15)
                .wet("exhaust", 10e3, 0.88)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of(), Optional.empty()))
                .component(new Component.Condenser("condenser", List.of("exhaust"), "condensate", Optional.empty()))
                .component(new Component.Pump("pump1", "condensate", "feedwater", Optional.empty(), Optional.empty()));
    }

    private static List<String> problems(UnitBuilder unit) {
        CycleModelException e = assertThrows(CycleModelException.class, unit::model);
        assertTrue(e.getMessage().startsWith("unit \"" + unit.unit().id() + "\" cannot be modelled"), e.getMessage());
        return e.problems();
    }

    private static void assertProblem(List<String> problems, String expected) {
        assertTrue(problems.contains(expected), "expected\n  " + expected + "\namong\n  " + String.join("\n  ", problems));
    }

    @Test
    void simpleCycleWithOneFlowSensorCompiles() {
        assertDoesNotThrow(() -> simple().flow("main_steam", 50.0).model());
    }

    @Test
    void flowsWithoutAnyMeasurementCannotClose() {
        assertProblem(problems(simple()), "mass balance cannot close: the flows of states "
                + "[condensate, feedwater, main_steam, exhaust] are not fixed by any measured flow or balance"
                + " (no state of the unit has a flow sensor)");
    }

    @Test
    void looseExtractionFlowIsNamed() {
        // An extraction led straight into the condenser: no balance says how much is bled off.
        UnitBuilder unit = new UnitBuilder("loose")
                .saturatedLiquid("condensate", 10e3)
                .measured("feedwater", 10.5e6, 320.0)
                .measured("main_steam", 10e6, 773.15)
                .flow("main_steam", 50.0)
                .measured("bleed", 1e6, 500.0)
                .wet("exhaust", 10e3, 0.88)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of("bleed"),
                        Optional.empty()))
                .component(new Component.Condenser("condenser", List.of("exhaust", "bleed"), "condensate",
                        Optional.empty()))
                .component(new Component.Pump("pump1", "condensate", "feedwater", Optional.empty(), Optional.empty()));
        assertProblem(problems(unit), "mass balance cannot close: the flows of states [bleed, exhaust] are not"
                + " fixed by any measured flow or balance");
    }

    @Test
    void redundantFlowSensorIsRejected() {
        // States are taken in declaration order: feedwater's sensor comes first, main steam's is the surplus.
        UnitBuilder unit = simple().flow("main_steam", 50.0).flow("feedwater", 50.0);
        assertProblem(problems(unit), "flows are over-determined: flow sensor \"m_main_steam\" on state \"main_steam\""
                + " measures a flow that the balances and the flow sensors before it already fix; redundant flow"
                + " measurements are not reconciled, so declare only one of them as a state's flow sensor");
    }

    @Test
    void energyBalanceWithoutIndependentMeasurementIsRejected() {
        UnitBuilder unit = simple().flow("main_steam", 50.0).balanced("exhaust", 10e3, "pump1");
        assertProblem(problems(unit), "state \"exhaust\" is fixed by the energy balance of \"pump1\", which has no"
                + " independent measurement");
        UnitBuilder condenser = simple().flow("main_steam", 50.0).balanced("exhaust", 10e3, "condenser");
        assertProblem(problems(condenser), "state \"exhaust\" is fixed by the energy balance of \"condenser\", which"
                + " has no independent measurement");
    }

    @Test
    void energyBalanceOfAComponentTheStateDoesNotTouchIsRejected() {
        UnitBuilder unit = simple().flow("main_steam", 50.0)
                .power("P_gen", 40e6)
                .component(new Component.Generator("generator", List.of("turbine"), "P_gen",
                        new org.steamtally.calc.plant.UncertainConstant(0.985, 0.002)))
                .balanced("condensate", 10e3, "generator");
        assertProblem(problems(unit), "state \"condensate\" is fixed by the energy balance of \"generator\", but it"
                + " is not a port of the turbine sections on that shaft");
    }

    @Test
    void unknownAndMismatchedSensorsAreNamed() {
        UnitBuilder unit = simple().flow("main_steam", 50.0)
                .fix("main_steam", new StateFix.MeasuredPressureTemperature("PT-9", "p_feedwater"));
        List<String> problems = problems(unit);
        assertProblem(problems, "state \"main_steam\": pressure sensor \"PT-9\" is not a sensor of unit \"simple\"");
        assertProblem(problems, "state \"main_steam\": temperature sensor \"p_feedwater\" measures PRESSURE, not"
                + " TEMPERATURE");
    }

    @Test
    void eachProblemCarriesTheElementItConcerns() {
        UnitBuilder unit = simple().flow("main_steam", 50.0).flow("feedwater", 50.0)
                .fix("main_steam", new StateFix.MeasuredPressureTemperature("PT-9", "T_main_steam"))
                .component(new Component.Mixer("mixer", List.of("nowhere"), "elsewhere"));
        CycleModelException e = assertThrows(CycleModelException.class, unit::model);
        assertEquals(e.problems(), e.located().stream().map(CycleModelException.Problem::message).toList());
        assertTrue(e.located().contains(new CycleModelException.Problem(CycleModelException.Element.STATE, "main_steam",
                "state \"main_steam\": pressure sensor \"PT-9\" is not a sensor of unit \"simple\"")), e.getMessage());
        assertTrue(e.located().contains(new CycleModelException.Problem(CycleModelException.Element.COMPONENT, "mixer",
                "component \"mixer\": port \"nowhere\" is not a state of unit \"simple\"")), e.getMessage());
    }

    @Test
    void brokenPortsAreNamed() {
        UnitBuilder unit = simple().flow("main_steam", 50.0)
                .ideal("exhaust_ideal", "main_steam", "exhaust")
                .component(new Component.Mixer("mixer", List.of("exhaust_ideal", "nowhere"), "main_steam"));
        List<String> problems = problems(unit);
        assertProblem(problems, "component \"mixer\": port \"exhaust_ideal\" is an ideal reference state, which"
                + " carries no flow and sits on no port");
        assertProblem(problems, "component \"mixer\": port \"nowhere\" is not a state of unit \"simple\"");
        assertProblem(problems, "state \"main_steam\" is the outlet of 2 components [boiler, mixer]: every flowing"
                + " state leaves exactly one component");
    }

    @Test
    void balancedStateCannotEnterAHeaterBalance() {
        UnitBuilder unit = new UnitBuilder("bad")
                .saturatedLiquid("condensate", 10e3)
                .measured("pumped", 0.5e6, 320.0)
                .saturatedLiquid("deaerator_out", 0.45e6)
                .measured("feedwater", 10.5e6, 425.0)
                .measured("main_steam", 10e6, 773.15)
                .flow("main_steam", 50.0)
                .balanced("bleed", 0.45e6, "turbine")
                .wet("exhaust", 10e3, 0.88)
                .power("P_gen", 40e6)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of("bleed"),
                        Optional.empty()))
                .component(new Component.Condenser("condenser", List.of("exhaust"), "condensate", Optional.empty()))
                .component(new Component.Pump("pump1", "condensate", "pumped", Optional.empty(), Optional.empty()))
                .component(new Component.OpenFeedwaterHeater("deaerator", List.of("pumped", "bleed"), "deaerator_out"))
                .component(new Component.Pump("pump2", "deaerator_out", "feedwater", Optional.empty(), Optional.empty()))
                .component(new Component.Generator("generator", List.of("turbine"), "P_gen",
                        new org.steamtally.calc.plant.UncertainConstant(0.985, 0.002)));
        assertProblem(problems(unit), "state \"bleed\" takes its enthalpy from the energy balance of \"generator\""
                + " after the flows are solved, so it cannot enter the energy balance of \"deaerator\", which the"
                + " flows are solved from");
    }

    @Test
    void sensorOfTheWrongQuantityOnAGeneratorIsNamed() {
        UnitBuilder unit = simple().flow("main_steam", 50.0)
                .sensor("P_gen", Quantity.MASS_FLOW, 1.0, 0.1, 0.0, 10.0)
                .component(new Component.Generator("generator", List.of("turbine", "pump1"), "P_gen",
                        new org.steamtally.calc.plant.UncertainConstant(1.2, 0.002)));
        List<String> problems = problems(unit);
        assertProblem(problems, "component \"generator\": power sensor \"P_gen\" measures MASS_FLOW, not POWER");
        assertProblem(problems, "generator \"generator\": \"pump1\" is not a turbine section of unit \"simple\"");
        assertProblem(problems, "component \"generator\": efficiency must lie within 0 (exclusive) and 1, was 1.2");
    }

    @Test
    void energyBalanceThatLeavesNoFlowFreeIsReported() {
        // A mixer with a single inlet whose outlet is hotter: its mass and energy balances
        // together allow only zero flow, whatever flow sensor the loop has.
        UnitBuilder unit = new UnitBuilder("mix")
                .saturatedLiquid("condensate", 10e3)
                .measured("pumped", 10.5e6, 320.0)
                .measured("feedwater", 10.5e6, 330.0)
                .measured("main_steam", 10e6, 773.15)
                .flow("main_steam", 50.0)
                .wet("exhaust", 10e3, 0.88)
                .component(new Component.SteamGenerator("boiler", "feedwater", "main_steam", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "main_steam", "exhaust", List.of(), Optional.empty()))
                .component(new Component.Condenser("condenser", List.of("exhaust"), "condensate", Optional.empty()))
                .component(new Component.Pump("pump1", "condensate", "pumped", Optional.empty(), Optional.empty()))
                .component(new Component.Mixer("mixer", List.of("pumped"), "feedwater"));
        List<String> problems = problems(unit);
        assertTrue(problems.stream().anyMatch(p -> p.startsWith("flows are over-determined: the mass and energy"
                + " balances alone leave no flow free") && p.contains("[\"mixer\"]")), String.join("\n", problems));
    }
}
