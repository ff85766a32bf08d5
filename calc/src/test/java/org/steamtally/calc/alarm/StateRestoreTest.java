package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;

import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.Snapshot;

/**
 * The engine's state, taken as plain values and put into a new engine (as after a restart of the
 * daemon), carries on exactly as the old engine would have.
 */
class StateRestoreTest {

    private final ReheatUnit plant = new ReheatUnit();
    private final CycleModel model = plant.model();

    private static List<AlarmEvent> step(AlarmEngine engine, CycleModel model, Snapshot s, Optional<ReconciliationInput> rec) {
        return engine.evaluate(s, model.evaluate(s), rec);
    }

    /** An engine with alarms in several states and one on-delay half run. */
    private AlarmEngine busyEngine(TestClock clock) {
        AlarmEngine engine = new AlarmEngine(plant.unit(), AlarmSettings.DEFAULTS, clock);
        ReconciliationInput failing = new ReconciliationInput(31.2, 12.59, 6,
                List.of(new SuspectInput("m_cw", 62.0, 11.5, 4.8, List.of("T_cw_out"))));
        for (int s = 0; s < 20; s++) {
            step(engine, model, plant.snapshot(clock.instant(), "m_fuel", 18.48, "P_pump", 3e9), Optional.of(failing));
            clock.seconds(1);
        }
        engine.acknowledge("closure:boiler+fuel", "op1");
        engine.shelve("suspect:m_cw", Duration.ofHours(1), "op1", "flow meter under investigation");
        engine.removeFromService("stale:P_pump", "tech1", "motor power transducer removed");
        // T_cold_reheat out of range for 3 s: its on-delay of 5 s is under way.
        for (int s = 0; s < 3; s++) {
            step(engine, model, plant.snapshot(clock.instant(), "m_fuel", 18.48, "P_pump", 3e9,
                    "T_cold_reheat", 901.0), Optional.of(failing));
            clock.seconds(1);
        }
        return engine;
    }

    @Test
    void restoredEngineHoldsTheSameAlarmsAsTheSavedOne() {
        TestClock clock = new TestClock();
        AlarmEngine saved = busyEngine(clock);
        AlarmEngineState state = saved.state();
        assertEquals(AlarmState.ACTIVE_ACKNOWLEDGED, saved.alarm("closure:boiler+fuel").orElseThrow().state());
        assertEquals(AlarmState.SHELVED, saved.alarm("suspect:m_cw").orElseThrow().state());
        assertEquals(AlarmState.OUT_OF_SERVICE, saved.alarm("stale:P_pump").orElseThrow().state());
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, saved.alarm("range:P_pump").orElseThrow().state());
        assertTrue(saved.alarm("range:T_cold_reheat").orElseThrow().pendingCondition());

        AlarmEngine restored = new AlarmEngine(plant.unit(), AlarmSettings.DEFAULTS, clock);
        assertEquals(List.of(), restored.restore(state));
        assertEquals(saved.alarms(), restored.alarms());
        assertEquals(state.alarms(), restored.state().alarms());
    }

    @Test
    void restoredEngineCarriesOnAsTheSavedOneWouldHave() {
        TestClock clockA = new TestClock();
        TestClock clockB = new TestClock();
        AlarmEngine a = busyEngine(clockA);
        AlarmEngine b0 = busyEngine(clockB);
        AlarmEngine b = new AlarmEngine(plant.unit(), AlarmSettings.DEFAULTS, clockB);
        b.restore(b0.state());
        ReconciliationInput passing = new ReconciliationInput(5.0, 12.59, 6, List.of());
        for (int s = 0; s < 4000; s++) {
            Snapshot snapshot = plant.snapshot(clockA.instant(), "T_cold_reheat", 901.0);
            assertEquals(step(a, model, snapshot, Optional.of(passing)), step(b, model, snapshot, Optional.of(passing)),
                    "second " + s);
            clockA.seconds(1);
            clockB.seconds(1);
        }
        // The pending range alarm was raised 2 s after the restart; the suspect cleared while shelved,
        // so when the shelf expired after the hour it returned to normal.
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, b.alarm("range:T_cold_reheat").orElseThrow().state());
        assertEquals(AlarmState.NORMAL, b.alarm("suspect:m_cw").orElseThrow().state());
    }

    @Test
    void recordOfAnAlarmTheUnitNoLongerHasIsLeftOutAndNamed() {
        TestClock clock = new TestClock();
        Instant t = clock.instant();
        AlarmRecord gone = new AlarmRecord("stale:TT-999", AlarmKind.STALE_SENSOR, AlarmPriority.LOW,
                AlarmState.ACTIVE_UNACKNOWLEDGED, t, true, true, t, OptionalDouble.empty(), OptionalDouble.empty(),
                "sensor TT-999 has sent no value yet", Optional.empty(), Optional.empty(), Optional.empty(), Optional.empty());
        AlarmRecord kept = new AlarmRecord("closure:cycle", AlarmKind.CLOSURE, AlarmPriority.MEDIUM,
                AlarmState.RETURNED_UNACKNOWLEDGED, t, false, false, t, OptionalDouble.of(1.2), OptionalDouble.of(3.0),
                "energy balance \"cycle\" closes", Optional.empty(), Optional.empty(), Optional.empty(), Optional.empty());
        AlarmEngine engine = new AlarmEngine(plant.unit(), AlarmSettings.DEFAULTS, clock);
        List<String> leftOut = engine.restore(new AlarmEngineState(ReheatUnit.UNIT, t, List.of(gone, kept)));
        assertEquals(1, leftOut.size());
        assertTrue(leftOut.get(0).startsWith("alarm stale:TT-999: "), leftOut.get(0));
        assertEquals(kept, engine.alarm("closure:cycle").orElseThrow());
    }

    @Test
    void stateOfAnotherUnitIsRefused() {
        AlarmEngine engine = new AlarmEngine(plant.unit(), AlarmSettings.DEFAULTS, new TestClock());
        assertThrows(IllegalArgumentException.class,
                () -> engine.restore(new AlarmEngineState("other", TestClock.START, List.of())));
    }

    @Test
    void inconsistentRecordIsRefusedByName() {
        Instant t = TestClock.START;
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> new AlarmRecord("closure:cycle",
                AlarmKind.CLOSURE, AlarmPriority.MEDIUM, AlarmState.SHELVED, t, false, false, t, OptionalDouble.empty(),
                OptionalDouble.empty(), "x", Optional.empty(), Optional.empty(), Optional.empty(), Optional.empty()));
        assertTrue(e.getMessage().contains("closure:cycle") && e.getMessage().contains("shelved"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> new AlarmRecord("stale:X", AlarmKind.CLOSURE,
                AlarmPriority.MEDIUM, AlarmState.NORMAL, t, false, false, t, OptionalDouble.empty(),
                OptionalDouble.empty(), "x", Optional.empty(), Optional.empty(), Optional.empty(), Optional.empty()));
        assertThrows(IllegalArgumentException.class, () -> new AlarmRecord("stale:X", AlarmKind.STALE_SENSOR,
                AlarmPriority.MEDIUM, AlarmState.ACTIVE_ACKNOWLEDGED, t, false, false, t, OptionalDouble.empty(),
                OptionalDouble.empty(), "x", Optional.empty(), Optional.empty(), Optional.empty(), Optional.empty()));
    }
}
