package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import org.junit.jupiter.api.Test;

/**
 * Bad values in a snapshot never make the evaluation throw: they mark the states, components,
 * figures and closures that depend on them invalid or empty, with a reason, and leave the rest.
 */
class BadSnapshotTest {

    private static UnitResult evaluate(UnitBuilder unit, Snapshot.SensorStatus status, String sensorId) {
        double[] values = unit.values();
        Snapshot.SensorStatus[] statuses = new Snapshot.SensorStatus[values.length];
        Arrays.fill(statuses, Snapshot.SensorStatus.GOOD);
        statuses[unit.index(sensorId)] = status;
        UnitResult result = unit.model().evaluate(new Snapshot(UnitBuilder.TIME, unit.unit().id(), values, statuses));
        Results.assertAllFinite(result);
        return result;
    }

    private static UnitResult evaluate(UnitBuilder unit) {
        UnitResult result = unit.model().evaluate(unit.snapshot());
        Results.assertAllFinite(result);
        return result;
    }

    private static String reason(StateResult s) {
        assertFalse(s.valid(), s.id() + " should be invalid");
        return s.reason().get();
    }

    @Test
    void staleSensorInvalidatesItsStateAndWhatDependsOnIt() {
        UnitResult r = evaluate(ExampleUnits.reheat(), Snapshot.SensorStatus.STALE, "T_cold_reheat");
        StateResult cold = Results.state(r, "cold_reheat");
        assertTrue(reason(cold).contains("sensor \"T_cold_reheat\" is stale"), cold.reason().get());
        assertTrue(cold.pressurePa().isPresent(), "the pressure is still measured");
        assertTrue(cold.enthalpyJPerKg().isEmpty());
        assertFalse(Results.component(r, "hp").valid());
        assertFalse(Results.component(r, "reheater").valid());
        assertTrue(Results.component(r, "lp").valid(), "the LP section does not need the cold reheat");
        assertTrue(Results.component(r, "boiler").valid());
        assertTrue(r.cycle().heatAddedW().isEmpty());
        assertTrue(r.cycle().turbineWorkW().isEmpty());
        assertTrue(r.cycle().thermalEfficiency().isEmpty());
        assertTrue(r.cycle().heatRejectedW().isPresent());
        assertTrue(r.cycle().pumpWorkW().isPresent());
        assertFalse(Results.hasClosure(r, "hp+lp+generator"));
        assertFalse(Results.hasClosure(r, "boiler+fuel"));
        assertFalse(Results.hasClosure(r, "cycle"));
        assertTrue(Results.hasClosure(r, "pump+motor"), "the pump's check needs nothing that is stale");
        assertTrue(Results.state(r, "hot_reheat").valid());
    }

    @Test
    void missingSensorIsNamedInTheReason() {
        UnitResult r = evaluate(ExampleUnits.reheat(), Snapshot.SensorStatus.MISSING, "p_condensate");
        assertTrue(reason(Results.state(r, "condensate")).contains("sensor \"p_condensate\" has no value"));
    }

    @Test
    void implausibleValueIsTreatedLikeAMissingOne() {
        UnitBuilder unit = ExampleUnits.reheat().set("T_hot_reheat", 950.0);
        UnitResult r = evaluate(unit);
        String why = reason(Results.state(r, "hot_reheat"));
        assertTrue(why.contains("outside its plausible range"), why);
        assertFalse(Results.component(r, "lp").valid());
    }

    @Test
    void notANumberMarkedGoodIsStillRejected() {
        UnitResult r = evaluate(ExampleUnits.reheat().set("p_main_steam", Double.NaN));
        assertTrue(reason(Results.state(r, "main_steam")).contains("sensor \"p_main_steam\""));
    }

    @Test
    void badIndependentMeasurementLeavesItsClosureOutAndTheCycleFallsBackToTheSteamSide() {
        UnitResult r = evaluate(ExampleUnits.reheat(), Snapshot.SensorStatus.STALE, "P_gen");
        assertFalse(Results.hasClosure(r, "hp+lp+generator"));
        assertTrue(Results.hasClosure(r, "boiler+fuel"));
        assertTrue(Results.hasClosure(r, "cycle"), "the turbine work comes from the steam side instead");
        assertFalse(Results.component(r, "generator").valid());
        assertTrue(r.cycle().thermalEfficiency().isPresent(), "the steam-side figures need no generator");
    }

    @Test
    void coolingWaterFailureInvalidatesTheStateItFixes() {
        UnitResult r = evaluate(ExampleUnits.reheat(), Snapshot.SensorStatus.STALE, "m_cw");
        String why = reason(Results.state(r, "exhaust"));
        assertTrue(why.contains("energy balance") && why.contains("m_cw"), why);
        assertFalse(Results.component(r, "lp").valid());
        assertFalse(Results.component(r, "condenser").valid());
        assertTrue(r.cycle().heatRejectedW().isEmpty());
    }

    @Test
    void turbineInletBelowSaturationIsImpossible() {
        // 14 MPa saturates at about 610.7 K: a "superheated" main steam at 600 K is liquid.
        UnitResult r = evaluate(ExampleUnits.reheat().set("T_main_steam", 600.0));
        String why = reason(Results.state(r, "main_steam"));
        assertTrue(why.contains("must be vapour"), why);
        assertTrue(Results.state(r, "main_steam").enthalpyJPerKg().isPresent(), "the measured state is still shown");
        assertFalse(Results.component(r, "hp").valid());
        assertFalse(Results.component(r, "boiler").valid());
    }

    @Test
    void pumpInletAboveSaturationIsImpossible() {
        // 0.5 MPa saturates at about 425 K: condensate at 430 K would be vapour.
        UnitResult r = evaluate(ExampleUnits.regenerative().set("T_condensate_pumped", 430.0));
        String why = reason(Results.state(r, "condensate_pumped"));
        assertTrue(why.contains("must be liquid"), why);
        // The open heater's balance needs it: every solved flow is unknown, the measured one stays.
        assertTrue(Results.state(r, "lp_extraction").massFlowKgPerS().isEmpty());
        assertEquals(80.0, Results.state(r, "main_steam").massFlowKgPerS().getAsDouble(), 0.0);
    }

    @Test
    void pressureThatDoesNotRiseAcrossAPumpInvalidatesItsOutlet() {
        UnitResult r = evaluate(ExampleUnits.reheat().set("p_feedwater", 8e3));
        String why = reason(Results.state(r, "feedwater"));
        assertTrue(why.contains("pressure does not rise across pump \"pump\""), why);
        assertFalse(Results.component(r, "pump").valid());
    }

    @Test
    void pressureThatDoesNotFallAcrossATurbineInvalidatesItsPort() {
        UnitResult r = evaluate(ExampleUnits.reheat().set("p_cold_reheat", 14.5e6).set("T_cold_reheat", 820.0));
        String why = reason(Results.state(r, "cold_reheat"));
        assertTrue(why.contains("pressure does not fall across turbine section \"hp\""), why);
    }

    @Test
    void negativeSolvedFlowInvalidatesItsState() {
        // Feedwater leaving the closed heater colder than it enters asks for a negative extraction.
        UnitResult r = evaluate(ExampleUnits.regenerative().set("T_feedwater", 415.0));
        String why = reason(Results.state(r, "hp_extraction"));
        assertTrue(why.contains("negative flow"), why);
        assertTrue(Results.state(r, "hp_extraction").massFlowKgPerS().isEmpty());
        assertFalse(Results.component(r, "hp_heater").valid());
        assertFalse(Results.component(r, "turbine").valid());
        assertTrue(r.closure().isEmpty(), r.closure().toString());
    }

    @Test
    void stateOutsideIf97IsInvalidWithTheFormulationsMessage() {
        // Zero pressure is inside the sensor's plausible range (from 0 Pa) but has no IF97 state.
        UnitResult r = evaluate(ExampleUnits.reheat().set("p_hot_reheat", 0.0));
        String why = reason(Results.state(r, "hot_reheat"));
        assertTrue(why.contains("IAPWS-IF97"), why);
    }

    @Test
    void snapshotOfAnotherUnitIsAWiringErrorNotABadValue() {
        UnitBuilder unit = ExampleUnits.reheat();
        CycleModel model = unit.model();
        assertThrows(IllegalArgumentException.class,
                () -> model.evaluate(Snapshot.allGood(UnitBuilder.TIME, "other", unit.values())));
        assertThrows(IllegalArgumentException.class,
                () -> model.evaluate(Snapshot.allGood(UnitBuilder.TIME, "reheat", new double[3])));
    }

    @Test
    void everySensorFailingAloneNeverThrowsNorLeaksNaN() {
        UnitBuilder unit = ExampleUnits.regenerative();
        int closures = unit.model().evaluate(unit.snapshot()).closure().size();
        for (var sensor : unit.unit().sensors()) {
            for (Snapshot.SensorStatus status : new Snapshot.SensorStatus[] {
                    Snapshot.SensorStatus.STALE, Snapshot.SensorStatus.MISSING}) {
                UnitResult r = evaluate(unit, status, sensor.id());
                assertTrue(r.states().stream().anyMatch(s -> !s.valid())
                        || r.components().stream().anyMatch(c -> !c.valid())
                        || r.closure().size() < closures, sensor.id());
            }
        }
    }
}
