package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.Snapshot;

/**
 * A round with nothing to evaluate (the window channel withholding its verdict) holds every alarm:
 * nothing is raised or cleared by it, and a change under way starts again once there is input.
 * Delays are the defaults of {@link AlarmSettings}: global test off after 30 s, suspect after 60 s.
 */
class HoldEveryAlarmTest {

    private final ReheatUnit plant = new ReheatUnit();
    private final CycleModel model = plant.model();
    private final TestClock clock = new TestClock();
    private final AlarmEngine engine = new AlarmEngine(plant.unit(), AlarmSettings.DEFAULTS, clock);

    private static final ReconciliationInput FAILING = new ReconciliationInput(31.2, 12.59, 6,
            List.of(new SuspectInput("m_cw", 62.0, 11.5, 4.8, List.of())));
    private static final ReconciliationInput PASSING = new ReconciliationInput(5.1, 12.59, 6, List.of());

    private List<AlarmEvent> seconds(int n, Optional<ReconciliationInput> input) {
        List<AlarmEvent> events = new ArrayList<>();
        for (int s = 0; s < n; s++) {
            Snapshot snapshot = plant.snapshot(clock.instant());
            events.addAll(engine.evaluate(snapshot, model.evaluate(snapshot), input));
            clock.seconds(1);
        }
        return events;
    }

    private List<AlarmEvent> held(int n) {
        List<AlarmEvent> events = new ArrayList<>();
        for (int s = 0; s < n; s++) {
            events.addAll(engine.hold());
            clock.seconds(1);
        }
        return events;
    }

    @Test
    void heldRoundsNeitherRaiseNorClearAndRestartAChangeUnderWay() {
        seconds(60, Optional.of(FAILING));
        // 20 s of passing: the global test's 30 s off-delay is under way, not yet over
        List<AlarmEvent> passing = seconds(20, Optional.of(PASSING));
        List<AlarmEvent> whileHeld = held(120);
        // after the hold the off-delay starts again at the first passing round: the round 30 s later clears
        List<AlarmEvent> after = seconds(31, Optional.of(PASSING));
        assertAll(
                () -> assertEquals(List.of(), passing),
                () -> assertEquals(List.of(), whileHeld),
                () -> assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, engine.alarm("suspect:m_cw").orElseThrow().state()),
                () -> assertEquals(1, after.size(), after.toString()),
                () -> assertEquals(AlarmKind.GLOBAL_TEST_ID, after.get(0).alarmId()),
                // 60 failing + 20 passing + 120 held + 30 s: the off-delay counted from the first passing round after
                () -> assertEquals(TestClock.START.plusSeconds(60 + 20 + 120 + 30), after.get(0).time()));
    }

    @Test
    void heldRoundsRaiseNothingOnAnEngineThatWasQuiet() {
        seconds(10, Optional.of(PASSING));
        assertEquals(List.of(), held(300));
    }
}
