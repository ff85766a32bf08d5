package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicReference;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmRecord;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.alarm.AlarmState;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Fault;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.dashboard.alarm.AlarmView;
import org.steamtally.dashboard.push.InMemoryLiveResults;
import org.steamtally.dashboard.store.StoredAlarmEvent;

/**
 * The per-unit pipeline in simulated time: snapshots of the simulated regenerative example, with the
 * daemon's clock moved one second per snapshot, so that on-delays pass without waiting.
 */
class UnitMonitorTest {

    private static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");
    /** The second feedwater meter: redundant in the regenerative example (check-config's report). */
    private static final String SENSOR = "FT-421";

    @TempDir
    Path dataDir;

    /** A clock the test moves; reads are thread-safe. */
    static final class StepClock extends Clock {
        private final AtomicReference<Instant> now = new AtomicReference<>(T0);

        void set(Instant t) {
            now.set(t);
        }

        @Override
        public java.time.ZoneId getZone() {
            return ZoneOffset.UTC;
        }

        @Override
        public Clock withZone(java.time.ZoneId zone) {
            return this;
        }

        @Override
        public Instant instant() {
            return now.get();
        }
    }

    /** A unit's monitor fed from a queue the test fills, with a recording store and live results. */
    record Rig(UnitMonitor monitor, LinkedBlockingQueue<Snapshot> queue, RecordingStore store,
                       InMemoryLiveResults live) {
    }

    static Rig rig(PlantDescription plant, StepClock clock, Path dataDir) {
        UnitDescription unit = plant.units().get(0);
        LinkedBlockingQueue<Snapshot> queue = new LinkedBlockingQueue<>();
        RecordingStore store = new RecordingStore();
        InMemoryLiveResults live = new InMemoryLiveResults(plant, clock, Duration.ofSeconds(10));
        UnitMonitor m = new UnitMonitor(plant.siteId(), unit, AlarmSettings.DEFAULTS,
                timeout -> Optional.ofNullable(queue.poll(timeout.toMillis(), TimeUnit.MILLISECONDS)), store, live,
                new AlarmStateFile(dataDir, unit.id()), new SimpleMeterRegistry(), clock);
        return new Rig(m, queue, store, live);
    }

    static void awaitProcessed(UnitMonitor m, long n) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
        while (m.processed() < n) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("only " + m.processed() + " of " + n + " snapshots processed");
            }
            Thread.sleep(5);
        }
    }

    /** Feeds {@code seconds} snapshots, one simulated second apart, waiting for each to be processed. */
    private static void run(Rig rig, Simulator sim, StepClock clock, Instant from, int seconds)
            throws InterruptedException {
        for (int i = 0; i < seconds; i++) {
            Instant t = from.plusSeconds(i);
            clock.set(t);
            long before = rig.monitor().processed();
            rig.queue().add(sim.step(t).snapshot());
            awaitProcessed(rig.monitor(), before + 1);
        }
    }

    private static Optional<AlarmRecord> suspectAlarm(List<AlarmRecord> alarms) {
        return alarms.stream().filter(a -> a.kind() == AlarmKind.SUSPECT_SENSOR)
                .filter(a -> a.state() == AlarmState.ACTIVE_UNACKNOWLEDGED || a.state() == AlarmState.ACTIVE_ACKNOWLEDGED)
                .findFirst();
    }

    @Test
    void aBiasOnARedundantSensorRaisesASuspectAlarmNamingItAndTheAlarmSurvivesARestart() throws Exception {
        PlantDescription plant = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText()).plant();
        UnitDescription unit = plant.units().get(0);
        StepClock clock = new StepClock();
        Simulator sim = Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(7).build();

        Rig first = rig(plant, clock, dataDir);
        first.monitor().start();
        run(first, sim, clock, T0, 15);
        assertTrue(suspectAlarm(first.monitor().alarms()).isEmpty(), "no suspect alarm without a fault");
        double eta = first.live().latest(unit.id()).orElseThrow().cycle().thermalEfficiency().getAsDouble();
        // 0.413 is the design point's efficiency (docs/SIMULATOR.md, example design points).
        assertEquals(0.413, eta, 0.01);

        // 10 σ: far beyond the individual test's 1.96, so one snapshot is enough to name it and the
        // 10 s on-delay decides when the alarm rises.
        sim.addFault(new Fault.Bias(SENSOR, T0.plusSeconds(15), Duration.ofHours(1), 10 * sim.sigmaOf(SENSOR)));
        run(first, sim, clock, T0.plusSeconds(15), 30);
        AlarmRecord raised = suspectAlarm(first.monitor().alarms())
                .orElseThrow(() -> new AssertionError("no suspect alarm after 30 s of a 10-sigma bias: "
                        + first.monitor().alarms()));
        String named = raised.suspect().map(s -> s.sensorId() + " " + s.equivalenceSet()).orElse(raised.id());
        assertTrue(named.contains(SENSOR), "the alarm names " + named);
        assertTrue(first.store().alarmEvents.stream().map(StoredAlarmEvent::alarmId).anyMatch(raised.id()::equals),
                "the transition went to the store");
        assertFalse(first.store().reconciliations.isEmpty(), "the reconciliation went to the store");
        // once, with its result: a second write at the same identity made the embedded store redo
        // every batch as MERGEs, and doubled the reconciliation's points in InfluxDB
        assertEquals(List.of(), first.store().separateReconciliations, "no reconciliation written apart from its result");
        first.monitor().close();

        // A new monitor on the same data directory, as after a kill and restart.
        Rig second = rig(plant, clock, dataDir);
        second.monitor().start();
        AlarmRecord restored = suspectAlarm(second.monitor().alarms())
                .orElseThrow(() -> new AssertionError("alarm not restored: " + second.monitor().alarms()));
        assertEquals(raised.id(), restored.id());
        second.monitor().close();
    }

    @Test
    void anOperatorAcknowledgesThroughTheBoardAndTheEventNamesTheUser() throws Exception {
        PlantDescription plant = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText()).plant();
        UnitDescription unit = plant.units().get(0);
        StepClock clock = new StepClock();
        Simulator sim = Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(11)
                .fault(new Fault.Bias(SENSOR, T0, Duration.ofHours(1), 10 * 0.625)).build();
        Rig rig = rig(plant, clock, dataDir);
        rig.monitor().start();
        EngineAlarmBoard board = new EngineAlarmBoard(List.of(rig.monitor()));
        run(rig, sim, clock, T0, 25);
        AlarmView view = board.list(unit.id()).stream().filter(v -> v.sensorId().filter(SENSOR::equals).isPresent())
                .filter(v -> v.state() == AlarmView.State.UNACKNOWLEDGED).findFirst()
                .orElseThrow(() -> new AssertionError("no suspect alarm on the board: " + board.list(unit.id())));
        // FT-421 is the check meter on the feedwater (examples/regenerative.yaml): its only balance
        // is m_feedwater − m_FT-421 = 0.
        assertEquals(List.of("check flow FT-421 on feedwater"), view.balances());
        AlarmView acked = board.acknowledge(view.id(), "shift-a");
        assertEquals(AlarmView.State.ACKNOWLEDGED, acked.state());
        StoredAlarmEvent last = rig.store().alarmEvents.get(rig.store().alarmEvents.size() - 1);
        assertEquals("acknowledge", last.kind());
        assertEquals(Optional.of("shift-a"), last.user());
        rig.monitor().close();
    }

    @Test
    void aFrozenSensorRaisesItsAlarmAndIsLeftOutOfTheReconciliation() throws Exception {
        PlantDescription plant = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText()).plant();
        UnitDescription unit = plant.units().get(0);
        StepClock clock = new StepClock();
        // frozen from the start: the default limit of 60 s unchanged raises the alarm at the 61st snapshot
        Simulator sim = Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(13)
                .fault(new Fault.Stuck(SENSOR, T0, Duration.ofHours(1), java.util.OptionalDouble.empty())).build();
        Rig rig = rig(plant, clock, dataDir);
        rig.monitor().start();
        run(rig, sim, clock, T0, 62);
        AlarmRecord frozen = rig.monitor().alarms().stream().filter(a -> a.id().equals("frozen:" + SENSOR)).findFirst()
                .orElseThrow();
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, frozen.state(), frozen.text());
        var last = rig.store().reconciliations.get(rig.store().reconciliations.size() - 1);
        assertTrue(last.sensors().stream().noneMatch(s -> s.id().equals(SENSOR)),
                "a frozen sensor is left out of the reconciliation as a stale one is: " + last.sensors());
        var earlier = rig.store().reconciliations.get(10);
        assertTrue(earlier.sensors().stream().anyMatch(s -> s.id().equals(SENSOR)), "before the limit it was in");
        rig.monitor().close();
    }
}
