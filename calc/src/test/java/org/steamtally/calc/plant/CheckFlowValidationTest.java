package org.steamtally.calc.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;

/** A state's check-flow meter must be a mass-flow sensor of the unit, on a flowing state. */
class CheckFlowValidationTest {

    private static final List<Sensor> SENSORS = List.of(sensor("P", Quantity.PRESSURE), sensor("T", Quantity.TEMPERATURE),
            sensor("F", Quantity.MASS_FLOW), sensor("G", Quantity.MASS_FLOW));

    private static Sensor sensor(String id, Quantity quantity) {
        return new Sensor(id, quantity, quantity.siUnit(), 1.0, UncertaintyBasis.STANDARD, 0.0, 1e8,
                Duration.ofSeconds(5), Optional.empty());
    }

    private static List<PlantProblem> validate(Optional<String> checkFlow) {
        StateFix pt = new StateFix.MeasuredPressureTemperature("P", "T");
        List<StateDefinition> states = List.of(new StateDefinition("steam", pt, Optional.of("F")),
                new StateDefinition("exhaust", pt, Optional.empty()),
                new StateDefinition("condensate", pt, Optional.empty()),
                new StateDefinition("fw", pt, Optional.empty(), checkFlow));
        List<Component> components = List.of(
                new Component.SteamGenerator("boiler", "fw", "steam", Optional.empty()),
                new Component.TurbineSection("turbine", "steam", "exhaust", List.of(), Optional.empty()),
                new Component.Condenser("condenser", List.of("exhaust"), "condensate", Optional.empty()),
                new Component.Pump("pump", "condensate", "fw", Optional.empty(), Optional.empty()));
        UnitDescription unit = new UnitDescription("u", "u", SENSORS, states, components, DeadState.STANDARD);
        return PlantValidator.validate(new PlantDescription("s", "s", 101_325.0, List.of(unit)));
    }

    @Test
    void checkFlowOnAStreamWhoseFlowTheBalancesFixIsAccepted() {
        assertEquals(List.of(), validate(Optional.of("G")));
    }

    @Test
    void checkFlowThatIsNotAFlowSensorIsNamed() {
        List<PlantProblem> problems = validate(Optional.of("T"));
        assertEquals(1, problems.size(), problems.toString());
        assertTrue(problems.get(0).message().contains("sensor \"T\" measures temperature but is used as the check flow"),
                problems.get(0).message());
        assertTrue(problems.get(0).path().endsWith(".check_flow"), problems.get(0).path());
    }

    @Test
    void stateWithoutCheckFlowKeepsTheThreeArgumentForm() {
        StateDefinition s = new StateDefinition("x", new StateFix.SaturatedLiquid("P"), Optional.empty());
        assertTrue(s.checkFlowSensor().isEmpty());
    }
}
