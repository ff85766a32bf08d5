package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicReference;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
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
 * The suspect-sensor alarm's whole life in the daemon's per-unit pipeline (UnitMonitor: evaluation,
 * reconciliation, alarm engine, store, board), in simulated time: snapshots of the simulated
 * regenerative example, the daemon's clock moved one second per snapshot, so that on- and off-delays
 * pass without waiting. A bias is injected into the redundant feedwater check meter FT-421 for a
 * minute and then ends (the simulator's fault has a duration); the alarm must name the sensor within
 * two minutes and, once the fault is gone, leave the active state after the off-delay of the plant
 * description's alarm settings (60 s by default, docs/ALARMS.md), not before and not much later.
 *
 * <p>The bias is 10 σ, not 3 σ. The per-snapshot suspect test compares the sensor's individual test
 * value with 1.96; FT-421's only balance is against the feedwater meter, so a 3 σ bias shifts the
 * test value to about 3/√2 ≈ 2.1 (hand derivation: the difference of two meters of equal σ has
 * σ√2), which noise keeps crossing in both directions, and the on-delay needs 10 s without
 * interruption. That is a test of detection power, not of the life cycle; 10 σ names the sensor in
 * every snapshot, so the delays alone decide the timing measured here.
 */
class SuspectAlarmOffDelayTest {

    private static final Logger LOG = LoggerFactory.getLogger(SuspectAlarmOffDelayTest.class);
    private static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");
    private static final String SENSOR = "FT-421";
    private static final Duration CLEAN_LEAD = Duration.ofSeconds(15);
    private static final Duration FAULT = Duration.ofSeconds(60);

    @TempDir
    Path dataDir;

    /** A clock the test moves; reads are thread-safe. */
    private static final class StepClock extends Clock {
        private final AtomicReference<Instant> now = new AtomicReference<>(T0);

        @Override
        public ZoneId getZone() {
            return ZoneOffset.UTC;
        }

        @Override
        public Clock withZone(ZoneId zone) {
            return this;
        }

        @Override
        public Instant instant() {
            return now.get();
        }
    }

    private record Run(UnitMonitor monitor, RecordingStore store, Duration offDelay, Duration onDelay,
                       Instant faultStart, Instant faultEnd) {

        /** The first event of the suspect alarm of the sensor into {@code state} at or after {@code from}. */
        Optional<StoredAlarmEvent> firstInto(String state, Instant from) {
            return store.alarmEvents.stream().filter(e -> e.alarmId().equals("suspect:" + SENSOR))
                    .filter(e -> e.newState().equals(state)).filter(e -> !e.timestamp().isBefore(from)).findFirst();
        }
    }

    /**
     * Feeds snapshots one simulated second apart, calling {@code each} before each, until
     * {@code seconds} have passed after the fault's end.
     */
    private Run run(long seed, int secondsAfterFault, java.util.function.BiConsumer<Instant, UnitMonitor> each)
            throws Exception {
        DaemonConfigFiles files = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText());
        PlantDescription plant = files.plant();
        UnitDescription unit = plant.units().get(0);
        AlarmSettings alarms = files.alarms();
        StepClock clock = new StepClock();
        Simulator sim = Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(seed).build();
        Instant faultStart = T0.plus(CLEAN_LEAD);
        Instant faultEnd = faultStart.plus(FAULT);
        sim.addFault(new Fault.Bias(SENSOR, faultStart, FAULT, 10 * sim.sigmaOf(SENSOR)));
        LinkedBlockingQueue<Snapshot> queue = new LinkedBlockingQueue<>();
        RecordingStore store = new RecordingStore();
        UnitMonitor monitor = new UnitMonitor(plant.siteId(), unit, alarms,
                timeout -> Optional.ofNullable(queue.poll(timeout.toMillis(), TimeUnit.MILLISECONDS)), store,
                new InMemoryLiveResults(plant, clock, Duration.ofSeconds(10)), new AlarmStateFile(dataDir, unit.id()),
                new SimpleMeterRegistry(), clock);
        monitor.start();
        try {
            long total = CLEAN_LEAD.plus(FAULT).toSeconds() + secondsAfterFault;
            for (int i = 0; i < total; i++) {
                Instant t = T0.plusSeconds(i);
                clock.now.set(t);
                each.accept(t, monitor);
                long before = monitor.processed();
                queue.add(sim.step(t).snapshot());
                long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
                while (monitor.processed() <= before) {
                    assertTrue(System.nanoTime() < deadline, "snapshot at " + t + " not processed");
                    Thread.sleep(2);
                }
            }
        } finally {
            monitor.close();
        }
        var definition = alarms.definitionOf(AlarmKind.SUSPECT_SENSOR, "suspect:" + SENSOR);
        return new Run(monitor, store, definition.offDelay(), definition.onDelay(), faultStart, faultEnd);
    }

    @Test
    void anUnacknowledgedSuspectAlarmReturnsUnacknowledgedOneOffDelayAfterTheBiasEnds() throws Exception {
        Run run = run(21, 90, (t, m) -> { });
        StoredAlarmEvent raised = run.firstInto("active_unacknowledged", run.faultStart())
                .orElseThrow(() -> new AssertionError("no suspect alarm on " + SENSOR + ": " + run.store().alarmEvents));
        StoredAlarmEvent returned = run.firstInto("returned_unacknowledged", raised.timestamp())
                .orElseThrow(() -> new AssertionError("the alarm never returned: " + run.store().alarmEvents));
        Duration toRaise = Duration.between(run.faultStart(), raised.timestamp());
        Duration toReturn = Duration.between(run.faultEnd(), returned.timestamp());
        LOG.info("suspect alarm on {}: raised {} s after the bias began (on-delay {} s), returned unacknowledged {} s"
                        + " after it ended (off-delay {} s)", SENSOR, toRaise.toSeconds(), run.onDelay().toSeconds(),
                toReturn.toSeconds(), run.offDelay().toSeconds());
        AlarmRecord last = run.monitor().alarms().stream().filter(a -> a.id().equals("suspect:" + SENSOR))
                .findFirst().orElseThrow();
        assertAll(
                () -> assertTrue(toRaise.compareTo(Duration.ofMinutes(2)) <= 0, "named within 2 min: " + toRaise),
                () -> assertTrue(last.suspect().map(s -> s.sensorId() + " " + s.equivalenceSet()).orElse("")
                        .contains(SENSOR), "the alarm names " + SENSOR + ": " + last.suspect()),
                () -> assertTrue(toReturn.compareTo(run.offDelay()) >= 0, "not before the off-delay: " + toReturn),
                // The first clean snapshot starts the off-delay; a second for the step it falls in.
                () -> assertTrue(toReturn.compareTo(run.offDelay().plusSeconds(2)) <= 0,
                        "within the off-delay and a snapshot: " + toReturn),
                () -> assertEquals(AlarmState.RETURNED_UNACKNOWLEDGED, last.state(), "waits for an acknowledgement"),
                () -> assertEquals("active_unacknowledged", returned.oldState()));
    }

    @Test
    void anAcknowledgedSuspectAlarmReturnsToNormalOneOffDelayAfterTheBiasEnds() throws Exception {
        AtomicReference<Instant> acknowledgedAt = new AtomicReference<>();
        Run run = run(22, 90, (t, m) -> {
            if (acknowledgedAt.get() == null && t.isBefore(T0.plus(CLEAN_LEAD).plus(FAULT))) {
                EngineAlarmBoard board = new EngineAlarmBoard(List.of(m));
                board.list(m.unit().id()).stream()
                        .filter(v -> v.sensorId().filter(SENSOR::equals).isPresent())
                        .filter(v -> v.state() == AlarmView.State.UNACKNOWLEDGED).findFirst()
                        .ifPresent(v -> {
                            board.acknowledge(v.id(), "shift-b");
                            acknowledgedAt.set(t);
                        });
            }
        });
        assertTrue(acknowledgedAt.get() != null, "the alarm was up to be acknowledged: " + run.store().alarmEvents);
        StoredAlarmEvent normal = run.firstInto("normal", run.faultEnd())
                .orElseThrow(() -> new AssertionError("the alarm never returned: " + run.store().alarmEvents));
        Duration toNormal = Duration.between(run.faultEnd(), normal.timestamp());
        LOG.info("acknowledged suspect alarm on {}: normal {} s after the bias ended (off-delay {} s)", SENSOR,
                toNormal.toSeconds(), run.offDelay().toSeconds());
        assertAll(
                () -> assertEquals("active_acknowledged", normal.oldState(), "acknowledged, then cleared"),
                () -> assertTrue(toNormal.compareTo(run.offDelay()) >= 0, "not before the off-delay: " + toNormal),
                () -> assertTrue(toNormal.compareTo(run.offDelay().plusSeconds(2)) <= 0,
                        "within the off-delay and a snapshot: " + toNormal));
    }
}
