package org.steamtally.calc.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

import org.junit.jupiter.api.Test;

class PlantValidatorTest {

    private static Sensor sensor(String id, Quantity quantity) {
        return new Sensor(id, quantity, quantity.siUnit(), 1.0, UncertaintyBasis.STANDARD, 0.0, 1e8,
                Duration.ofSeconds(5), Optional.empty());
    }

    private static StateDefinition pT(String id, Optional<String> flow) {
        return new StateDefinition(id, new StateFix.MeasuredPressureTemperature("P", "T"), flow);
    }

    private static final List<Sensor> SENSORS = List.of(sensor("P", Quantity.PRESSURE),
            sensor("T", Quantity.TEMPERATURE), sensor("F", Quantity.MASS_FLOW), sensor("J", Quantity.POWER));

    private static List<PlantProblem> validate(List<StateDefinition> states, List<Component> components) {
        UnitDescription unit = new UnitDescription("u", "u", SENSORS, states, components, DeadState.STANDARD);
        return PlantValidator.validate(new PlantDescription("s", "s", 101_325.0, List.of(unit)));
    }

    /** Boiler, turbine with one extraction, condenser, pump, and a closed heater fed by the extraction. */
    private static List<Component> regenerativeLoop() {
        return new ArrayList<>(List.of(
                new Component.SteamGenerator("boiler", "fw", "steam", Optional.empty()),
                new Component.TurbineSection("turbine", "steam", "exhaust", List.of("bleed"), Optional.empty()),
                new Component.Condenser("condenser", List.of("exhaust", "drain"), "condensate", Optional.empty()),
                new Component.Pump("pump", "condensate", "pumped", Optional.empty(), Optional.empty()),
                new Component.ClosedFeedwaterHeater("heater", "pumped", "fw", "bleed", List.of(), "drain")));
    }

    private static List<StateDefinition> regenerativeStates(Optional<String> steamFlow) {
        return List.of(pT("steam", steamFlow), pT("bleed", Optional.empty()), pT("exhaust", Optional.empty()),
                pT("condensate", Optional.empty()), pT("pumped", Optional.empty()), pT("fw", Optional.empty()),
                pT("drain", Optional.empty()));
    }

    @Test
    void extractionFlowFollowsFromTheHeaterBalanceWhenTheMainSteamIsMetered() {
        assertEquals(List.of(), validate(regenerativeStates(Optional.of("F")), regenerativeLoop()));
    }

    @Test
    void unitWithoutAnyFlowSensorIsRefused() {
        List<PlantProblem> problems = validate(regenerativeStates(Optional.empty()), regenerativeLoop());
        assertEquals(1, problems.size(), problems.toString());
        assertEquals(PlantProblem.Kind.DETERMINABILITY, problems.get(0).kind());
    }

    @Test
    void extractionStraightToTheCondenserLeavesItsFlowUndetermined() {
        // Without the heater's energy balance, the split between bleed and exhaust is free.
        List<Component> components = List.of(
                new Component.SteamGenerator("boiler", "condensate", "steam", Optional.empty()),
                new Component.TurbineSection("turbine", "steam", "exhaust", List.of("bleed"), Optional.empty()),
                new Component.Condenser("condenser", List.of("exhaust", "bleed"), "condensate", Optional.empty()));
        List<StateDefinition> states = List.of(pT("steam", Optional.of("F")), pT("bleed", Optional.empty()),
                pT("exhaust", Optional.empty()), pT("condensate", Optional.empty()));
        List<PlantProblem> problems = validate(states, components);
        assertEquals(1, problems.size(), problems.toString());
        assertEquals(PlantProblem.Kind.DETERMINABILITY, problems.get(0).kind());
        assertEquals("units[0].states[1].id", problems.get(0).path());
        assertTrue(problems.get(0).message().startsWith("the flows of states \"bleed\" and \"exhaust\""),
                problems.get(0).message());
    }

    @Test
    void exhaustFixedByATurbineWithoutGeneratorIsRefused() {
        List<StateDefinition> states = new ArrayList<>(regenerativeStates(Optional.of("F")));
        states.set(2, new StateDefinition("exhaust", new StateFix.EnergyBalance("P", "turbine"), Optional.empty()));
        List<PlantProblem> problems = validate(states, regenerativeLoop());
        assertEquals(1, problems.size(), problems.toString());
        assertEquals(PlantProblem.Kind.MEASUREMENT, problems.get(0).kind());
        assertEquals("units[0].states[2].fixed_by.energy_balance.component", problems.get(0).path());
    }

    @Test
    void generatorOnTheTurbineLetsItsBalanceFixTheExhaust() {
        List<StateDefinition> states = new ArrayList<>(regenerativeStates(Optional.of("F")));
        states.set(2, new StateDefinition("exhaust", new StateFix.EnergyBalance("P", "turbine"), Optional.empty()));
        List<Component> components = regenerativeLoop();
        components.add(new Component.Generator("gen", List.of("turbine"), "J", new UncertainConstant(0.98, 0.002)));
        assertEquals(List.of(), validate(states, components));
    }

    @Test
    void flowSensorOfTheWrongQuantityIsNamed() {
        List<StateDefinition> states = new ArrayList<>(regenerativeStates(Optional.of("T")));
        List<PlantProblem> problems = validate(states, regenerativeLoop());
        assertTrue(problems.stream().anyMatch(p -> p.message().equals(
                "sensor \"T\" measures temperature but is used as the flow of state \"steam\"")), problems.toString());
    }
}
