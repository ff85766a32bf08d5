package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmRecord;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.alarm.AlarmState;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.cycle.WindowReconciliation;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Fault;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.dashboard.alarm.AlarmView;
import org.steamtally.dashboard.push.InMemoryLiveResults;
import org.steamtally.dashboard.store.StoredAlarmEvent;
import org.steamtally.deploy.config.WindowChannelSettings;

/**
 * The window channel in the daemon's per-unit pipeline, in simulated time: snapshots of the simulated
 * regenerative example one second apart, the monitor's clock moved with them, nothing waits for time
 * to pass. The detection figures these tests rest on are in docs/DETECTION.md (TT-311, the
 * condensate temperature after the low-pressure heater: ρ_w 0.95, a 3σ bias detected within 60 s in
 * every trial of the window-mean bench, median 19 s).
 */
class WindowChannelMonitorTest {

    private static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");
    private static final String SENSOR = "TT-311";
    private static final String WINDOW_SUSPECT = "suspect:" + SENSOR;
    /** The window is full after 50 s; the fault starts 20 s later, as in docs/DETECTION.md's trials. */
    private static final int WARM_UP_S = 70;

    @TempDir
    Path dataDir;

    private record Rig(UnitMonitor monitor, LinkedBlockingQueue<Snapshot> queue, RecordingStore store,
                       InMemoryLiveResults live) {
    }

    private Rig rig(PlantDescription plant, UnitMonitorTest.StepClock clock) {
        UnitDescription unit = plant.units().get(0);
        LinkedBlockingQueue<Snapshot> queue = new LinkedBlockingQueue<>();
        RecordingStore store = new RecordingStore();
        InMemoryLiveResults live = new InMemoryLiveResults(plant, clock, Duration.ofSeconds(10));
        UnitMonitor m = new UnitMonitor(plant.siteId(), unit, AlarmSettings.DEFAULTS, WindowChannelSettings.DEFAULTS,
                Duration.ofSeconds(1),
                timeout -> Optional.ofNullable(queue.poll(timeout.toMillis(), TimeUnit.MILLISECONDS)), store, live,
                new AlarmStateFile(dataDir, unit.id()), new SimpleMeterRegistry(), clock);
        return new Rig(m, queue, store, live);
    }

    private static PlantDescription plant() throws Exception {
        return DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText()).plant();
    }

    private static Simulator simulator(UnitDescription unit, long seed) {
        return Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(seed).build();
    }

    /** One snapshot at {@code t}, waiting (with a deadline, not for time to pass) until it is processed. */
    private static void step(Rig rig, Simulator sim, UnitMonitorTest.StepClock clock, Instant t)
            throws InterruptedException {
        clock.set(t);
        long before = rig.monitor().processed();
        rig.queue().add(sim.step(t).snapshot());
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
        while (rig.monitor().processed() < before + 1) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("snapshot at " + t + " not processed");
            }
            Thread.sleep(1);
        }
    }

    private static Optional<AlarmRecord> windowAlarm(UnitMonitor m, String id) {
        return m.windowAlarms().stream().filter(a -> a.id().equals(id)).findFirst();
    }

    private static boolean active(Optional<AlarmRecord> a) {
        return a.map(r -> r.state() == AlarmState.ACTIVE_UNACKNOWLEDGED || r.state() == AlarmState.ACTIVE_ACKNOWLEDGED)
                .orElse(false);
    }

    /** Runs from {@code from} until the window suspect alarm of TT-311 is active; the seconds it took, or -1. */
    private static int runUntilRaised(Rig rig, Simulator sim, UnitMonitorTest.StepClock clock, Instant from, int limitS)
            throws InterruptedException {
        for (int i = 0; i < limitS; i++) {
            step(rig, sim, clock, from.plusSeconds(i));
            if (active(windowAlarm(rig.monitor(), WINDOW_SUSPECT))) {
                return i + 1;
            }
        }
        return -1;
    }

    @Test
    void aThreeSigmaBiasOnAWellCheckedSensorRaisesTheWindowSuspectAlarmNamingItWithinSixtySeconds() throws Exception {
        PlantDescription plant = plant();
        UnitDescription unit = plant.units().get(0);
        UnitMonitorTest.StepClock clock = new UnitMonitorTest.StepClock();
        Simulator sim = simulator(unit, 7);
        Rig rig = rig(plant, clock);
        rig.monitor().start();
        EngineAlarmBoard board = new EngineAlarmBoard(List.of(rig.monitor()));
        assertTrue(rig.monitor().hasWindow());

        for (int i = 0; i < WARM_UP_S; i++) {
            step(rig, sim, clock, T0.plusSeconds(i));
        }
        assertTrue(rig.monitor().windowAlarms().stream().noneMatch(a -> a.state() != AlarmState.NORMAL),
                "no window alarm before the fault: " + rig.monitor().windowAlarms());
        WindowReconciliation full = rig.live().latest(unit.id()).orElseThrow().windowReconciliation().orElseThrow();
        assertEquals(50, full.length());
        assertEquals(50, full.samples(), "the window is full after 70 s");
        assertEquals(50.0, full.lengthS());

        Instant faultStart = T0.plusSeconds(WARM_UP_S);
        Duration faultLength = Duration.ofSeconds(60);
        sim.addFault(new Fault.Bias(SENSOR, faultStart, faultLength, 3 * sim.sigmaOf(SENSOR)));
        int took = runUntilRaised(rig, sim, clock, faultStart, 60);
        assertTrue(took > 0, "window suspect alarm of " + SENSOR + " not raised within 60 s of a 3-sigma bias: "
                + rig.monitor().windowAlarms());
        AlarmRecord raised = windowAlarm(rig.monitor(), WINDOW_SUSPECT).orElseThrow();
        assertEquals(AlarmKind.SUSPECT_SENSOR, raised.kind());
        assertEquals(Optional.of(SENSOR), raised.suspect().map(s -> s.sensorId()));
        // The window's limit, not the per-snapshot 1.96 (docs/DETECTION.md, limits for window means).
        assertEquals(4.0, raised.limit().getAsDouble());

        // Apart from the per-snapshot alarms: its own id in the store, its own wording on the board.
        StoredAlarmEvent stored = rig.store().alarmEvents.stream()
                .filter(e -> e.alarmId().equals("window:" + WINDOW_SUSPECT)).findFirst()
                .orElseThrow(() -> new AssertionError("no window event in the store: " + rig.store().alarmEvents));
        assertEquals("active_unacknowledged", stored.newState());
        AlarmView view = board.list(unit.id()).stream()
                .filter(v -> v.id().equals("window:" + WINDOW_SUSPECT + "@" + unit.id())).findFirst()
                .orElseThrow(() -> new AssertionError("window alarm not on the board: " + board.list(unit.id())));
        assertTrue(view.message().startsWith("50-s mean: "), view.message());
        assertTrue(view.message().contains(SENSOR), view.message());
        assertEquals(Optional.of(SENSOR), view.sensorId());
        UnitResult latest = rig.live().latest(unit.id()).orElseThrow();
        WindowReconciliation w = latest.windowReconciliation().orElseThrow();
        assertFalse(w.passed(), "the window's global test fails while the alarm is up");
        assertTrue(w.suspects().stream().anyMatch(s -> s.id().equals(SENSOR) || s.equivalenceSet().contains(SENSOR)),
                "the window's suspects name " + SENSOR + ": " + w.suspects());

        // An operator acknowledges it like any other alarm.
        AlarmView acked = board.acknowledge(view.id(), "shift-b");
        assertEquals(AlarmView.State.ACKNOWLEDGED, acked.state());
        StoredAlarmEvent ack = rig.store().alarmEvents.get(rig.store().alarmEvents.size() - 1);
        assertEquals("window:" + WINDOW_SUSPECT, ack.alarmId());
        assertEquals(Optional.of("shift-b"), ack.user());

        // The fault ends; the bias leaves the 50-s window, the test value falls below 4.0 − 0.25 and
        // the 60 s off-delay passes: acknowledged and clear is normal (ISA-18.2, C → A).
        Instant after = faultStart.plusSeconds(took);
        int clearedAfter = -1;
        for (int i = 0; i < 240; i++) {
            step(rig, sim, clock, after.plusSeconds(i));
            if (windowAlarm(rig.monitor(), WINDOW_SUSPECT).orElseThrow().state() == AlarmState.NORMAL) {
                clearedAfter = (int) Duration.between(faultStart.plus(faultLength), after.plusSeconds(i + 1)).toSeconds();
                break;
            }
        }
        assertTrue(clearedAfter > 0, "window alarm did not return to normal: " + windowAlarm(rig.monitor(), WINDOW_SUSPECT));
        // Not before the off-delay (60 s) has passed after the end of the fault.
        assertTrue(clearedAfter >= 60, "cleared " + clearedAfter + " s after the fault ended");
        rig.monitor().close();
    }

    @Test
    void anActiveWindowAlarmIsActiveAgainAfterARestartAndTheWindowStartsEmpty() throws Exception {
        PlantDescription plant = plant();
        UnitDescription unit = plant.units().get(0);
        UnitMonitorTest.StepClock clock = new UnitMonitorTest.StepClock();
        Simulator sim = simulator(unit, 7);
        sim.addFault(new Fault.Bias(SENSOR, T0.plusSeconds(WARM_UP_S), Duration.ofHours(1), 3 * sim.sigmaOf(SENSOR)));
        Rig first = rig(plant, clock);
        first.monitor().start();
        for (int i = 0; i < WARM_UP_S; i++) {
            step(first, sim, clock, T0.plusSeconds(i));
        }
        int took = runUntilRaised(first, sim, clock, T0.plusSeconds(WARM_UP_S), 60);
        assertTrue(took > 0, "not raised: " + first.monitor().windowAlarms());
        // No close(): the state was saved when the alarm changed, as it must be for a SIGKILL.
        Path windowState = dataDir.resolve("alarms").resolve("window").resolve("alarm-state-" + unit.id() + ".json");
        assertTrue(Files.exists(windowState), "window alarm state saved to " + windowState);

        Rig second = rig(plant, clock);
        second.monitor().start();
        assertTrue(active(windowAlarm(second.monitor(), WINDOW_SUSPECT)),
                "window alarm not restored: " + second.monitor().windowAlarms());
        // The per-snapshot alarms come from their own file and are not mixed with the window's.
        assertTrue(second.monitor().alarms().stream().noneMatch(a -> a.id().startsWith("window:")));
        Instant resume = T0.plusSeconds(WARM_UP_S + took);
        step(second, sim, clock, resume);
        WindowReconciliation w = second.live().latest(unit.id()).orElseThrow().windowReconciliation().orElseThrow();
        assertEquals(1, w.samples(), "the window starts empty after a restart");
        assertTrue(active(windowAlarm(second.monitor(), WINDOW_SUSPECT)),
                "one snapshot into a new window does not clear the restored alarm (off-delay 60 s)");
        second.monitor().close();
        first.monitor().close();
    }

    @Test
    void withTheChannelSwitchedOffTheRecordHasNoWindowVerdictAndNoWindowAlarmsExist() throws Exception {
        PlantDescription plant = plant();
        UnitDescription unit = plant.units().get(0);
        UnitMonitorTest.StepClock clock = new UnitMonitorTest.StepClock();
        Simulator sim = simulator(unit, 3);
        LinkedBlockingQueue<Snapshot> queue = new LinkedBlockingQueue<>();
        RecordingStore store = new RecordingStore();
        InMemoryLiveResults live = new InMemoryLiveResults(plant, clock, Duration.ofSeconds(10));
        UnitMonitor m = new UnitMonitor(plant.siteId(), unit, AlarmSettings.DEFAULTS,
                WindowChannelSettings.DEFAULTS.withEnabled(false), Duration.ofSeconds(1),
                timeout -> Optional.ofNullable(queue.poll(timeout.toMillis(), TimeUnit.MILLISECONDS)), store, live,
                new AlarmStateFile(dataDir, unit.id()), new SimpleMeterRegistry(), clock);
        m.start();
        Rig rig = new Rig(m, queue, store, live);
        for (int i = 0; i < 3; i++) {
            step(rig, sim, clock, T0.plusSeconds(i));
        }
        assertFalse(m.hasWindow());
        assertTrue(m.windowAlarms().isEmpty());
        assertTrue(live.latest(unit.id()).orElseThrow().windowReconciliation().isEmpty());
        assertFalse(Files.exists(dataDir.resolve("alarms").resolve("window")));
        m.close();
    }
}
