package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmRecord;
import org.steamtally.calc.alarm.AlarmState;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.WindowReconciliation;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Fault;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.deploy.config.WindowChannelSettings;

/**
 * The window channel withholds its verdict on a window that is not representative (a balance
 * sensor good over only part of it, or periods missing from it): no reconciliation is run, the
 * summary says why, and the window alarms stay as they are. Simulated regenerative example at 1 Hz,
 * window 50 s, minimum good share 0.9 (45 of 50 periods); the clock moves with the snapshots.
 */
class WindowChannelRepresentativenessTest {

    private static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");
    /** A balance sensor: the main steam flow, in the mass and energy balances of the boiler and turbine. */
    private static final String STALE = "FT-101";
    /** The sensor with the bias, as in docs/DETECTION.md's window trials (ρ_w 0.95). */
    private static final String BIASED = "TT-311";

    @TempDir
    Path dataDir;

    private final UnitMonitorTest.StepClock clock = new UnitMonitorTest.StepClock();
    private UnitDescription unit;
    private Simulator sim;
    private WindowChannel channel;

    private void rig(long seed) throws Exception {
        PlantDescription plant = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText()).plant();
        unit = plant.units().get(0);
        sim = Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(seed).build();
        channel = WindowChannel.compile(plant.siteId(), unit, WindowChannelSettings.DEFAULTS, Duration.ofSeconds(1),
                new AlarmStateFile(dataDir, unit.id()).forChannel(WindowChannel.CHANNEL), clock);
    }

    /** The snapshot of second {@code s}, with {@code staleId} (when not null) stale. */
    private WindowChannel.Outcome at(int s, String staleId) {
        Instant t = T0.plusSeconds(s);
        clock.set(t);
        Snapshot snapshot = sim.step(t).snapshot();
        if (staleId != null) {
            Snapshot.SensorStatus[] status = snapshot.status().clone();
            status[index(staleId)] = Snapshot.SensorStatus.STALE;
            snapshot = new Snapshot(snapshot.timestamp(), snapshot.unitId(), snapshot.valuesSi(), status);
        }
        return channel.evaluate(snapshot);
    }

    private int index(String id) {
        for (int i = 0; i < unit.sensors().size(); i++) {
            if (unit.sensors().get(i).id().equals(id)) {
                return i;
            }
        }
        throw new AssertionError("no sensor " + id);
    }

    /** What an operator sees of each window alarm: id, state, condition, value and text. */
    private List<String> shown() {
        return channel.engine().alarms().stream()
                .map(a -> a.id() + " " + a.state() + " " + a.conditionActive() + " " + a.value() + " " + a.text())
                .toList();
    }

    private AlarmState state(String engineId) {
        return channel.engine().alarm(engineId).map(AlarmRecord::state).orElse(AlarmState.NORMAL);
    }

    @Test
    void aSensorStaleForHalfTheWindowWithholdsTheVerdictRunsNoSolveAndLeavesTheAlarmsAsTheyAre() throws Exception {
        rig(7);
        sim.addFault(new Fault.Bias(BIASED, T0.plusSeconds(70), Duration.ofHours(1), 3 * sim.sigmaOf(BIASED)));
        int s = 0;
        for (; s < 70; s++) {
            at(s, null);
        }
        // as in WindowChannelMonitorTest: raised within 60 s of the bias
        for (; s < 130 && state("suspect:" + BIASED) == AlarmState.NORMAL; s++) {
            at(s, null);
        }
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, state("suspect:" + BIASED), "raised before the stale span");
        // FT-101 stale for 25 s, half the window: good in 49, 48, ..., 25 of 50 periods. The first five
        // leave 45 of 50, enough; from the sixth on the window is not representative.
        for (int k = 0; k < 5; k++) {
            assertFalse(at(s++, STALE).summary().withheld(), "stale snapshot " + (k + 1));
        }
        List<String> before = shown();
        long solvedBefore = channel.meansEvaluated();
        List<WindowChannel.Outcome> withheld = new ArrayList<>();
        for (int k = 5; k < 25; k++) {
            withheld.add(at(s++, STALE));
        }
        WindowReconciliation last = withheld.get(withheld.size() - 1).summary();
        List<AlarmEvent> events = withheld.stream().flatMap(o -> o.events().stream()).toList();
        assertAll(
                () -> assertTrue(withheld.stream().allMatch(o -> o.summary().withheld())),
                () -> assertEquals(WindowReconciliation.WITHHELD, last.status()),
                () -> assertEquals("good values in only part of the window's 50 periods, fewer than the 45 needed"
                        + " (90 %): FT-101 (25)", last.reason().orElseThrow()),
                () -> assertEquals(50, last.samples()),
                () -> assertFalse(last.passed()),
                () -> assertTrue(last.suspects().isEmpty()),
                // no reconciliation for a withheld verdict
                () -> assertEquals(solvedBefore, channel.meansEvaluated()),
                // the alarms as they were: nothing raised, nothing cleared
                () -> assertEquals(List.of(), events),
                // (a change under way, e.g. the off-delay of a suspect no longer named, starts again)
                () -> assertEquals(before, shown()),
                () -> assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, state("suspect:" + BIASED)));
    }

    @Test
    void aSensorStaleForPartOfTheWindowOnAPlantWithoutFaultRaisesNothing() throws Exception {
        rig(11);
        List<AlarmEvent> events = new ArrayList<>();
        for (int s = 0; s < 200; s++) {
            // stale for 30 s of every 100: half the time the window mixes sub-periods
            events.addAll(at(s, s % 100 >= 40 && s % 100 < 70 ? STALE : null).events());
        }
        assertEquals(List.of(), events);
    }

    @Test
    void theVerdictResumesOnceTheSensorIsGoodInEnoughOfTheWindow() throws Exception {
        rig(5);
        int s = 0;
        for (; s < 60; s++) {
            at(s, null);
        }
        int staleFrom = s;
        for (int k = 0; k < 30; k++) {
            at(s++, STALE);
        }
        // stale at staleFrom .. staleFrom + 29; the window at second k holds k − 49 .. k, so at most 5
        // stale remain from k = staleFrom + 29 + 50 − 5 = staleFrom + 74 on (worked by hand)
        int resumed = -1;
        for (; s < staleFrom + 120 && resumed < 0; s++) {
            WindowReconciliation w = at(s, null).summary();
            if (!w.withheld()) {
                resumed = s;
                assertTrue(w.status().equals("passed") || w.status().equals("failed"), w.toString());
            }
        }
        assertEquals(staleFrom + 74, resumed);
    }

    @Test
    void aWindowWithMissingPeriodsIsWithheldUntilTheGapHasLeftIt() throws Exception {
        rig(3);
        int s = 0;
        for (; s < 60; s++) {
            assertFalse(at(s, null).summary().withheld(), "second " + s);
        }
        // ten seconds of snapshots never arrive (replaced in the collector's slot, or a stall)
        s += 10;
        long solved = channel.meansEvaluated();
        WindowReconciliation first = at(s++, null).summary();
        assertAll(
                () -> assertTrue(first.withheld(), first.toString()),
                // 50 held over 60 periods: 54 needed
                () -> assertEquals("the window's 50 snapshots span 60 periods of 1 s: 10 missing, at most 6 allowed"
                        + " (90 % of the span must be held)", first.reason().orElseThrow()),
                () -> assertEquals(solved, channel.meansEvaluated()));
        // the gap leaves the window once at most 5 periods of it are spanned: 45 snapshots after it
        int resumed = -1;
        int gapEnd = s - 1;
        for (; s < gapEnd + 60 && resumed < 0; s++) {
            if (!at(s, null).summary().withheld()) {
                resumed = s;
            }
        }
        // at second gapEnd + j the window holds j + 1 snapshots after the gap and 49 − j before it,
        // spanning 60 periods while any before it remain; 50 ≥ ⌈0.9 · 60⌉ = 54 fails, so the verdict
        // resumes when the last one before the gap has left: j = 49 (worked by hand)
        assertEquals(gapEnd + 49, resumed);
    }
}
