package org.steamtally.deploy.daemon;

import io.micrometer.core.instrument.MeterRegistry;
import io.micrometer.core.instrument.Timer;
import java.io.IOException;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.Callable;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.function.Consumer;
import org.steamtally.calc.alarm.AlarmEngine;
import org.steamtally.calc.alarm.AlarmEngineState;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmRecord;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.alarm.AlarmState;
import org.steamtally.calc.alarm.ReconciliationInput;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.reconcile.ReconcilingEvaluator;
import org.steamtally.calc.signal.SignalCheck;
import org.steamtally.calc.signal.SignalReport;
import org.steamtally.dashboard.push.InMemoryLiveResults;
import org.steamtally.deploy.config.WindowChannelSettings;
import org.steamtally.dashboard.store.ResultStore;
import org.steamtally.dashboard.store.StoredAlarmEvent;
import org.steamtally.dashboard.store.StoredReconciliation;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The monitoring of one unit: each snapshot through the reconciling evaluator and the alarm engine,
 * then to the store, the live results and the alarm listeners. Everything that touches the unit's
 * evaluator or alarm engine (evaluations, operator actions, shelf expiry) runs on the unit's one
 * thread, since neither is thread-safe; operator actions are handed to that thread and waited for.
 * Every change of alarm state is saved to the data directory before the next snapshot is taken, so
 * that a killed daemon comes back with its alarms as they were.
 *
 * <p>When the window channel is on ({@link WindowChannel}), every snapshot also goes into the window
 * mean, whose verdict the result record carries as {@code window_reconciliation} and whose alarms
 * come from a second engine with ids of the form {@code window:<id>}; its records are
 * {@link #windowAlarms()}, its listeners {@link #onWindowAlarmChange}, its actions {@link #actOnWindow}.
 */
public final class UnitMonitor implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(UnitMonitor.class);
    /** How long the intake waits for a snapshot before it looks at shelves and the stop flag again. */
    private static final Duration POLL = Duration.ofMillis(250);
    private static final Duration ACTION_TIMEOUT = Duration.ofSeconds(10);

    /** Where the monitor takes its snapshots from: the collector's slot, or a test's queue. */
    @FunctionalInterface
    public interface SnapshotSource {
        Optional<Snapshot> take(Duration timeout) throws InterruptedException;
    }

    private final String site;
    private final UnitDescription unit;
    private final ReconcilingEvaluator evaluator;
    private final AlarmEngine engine;
    /** Null when the window channel is off. */
    private final WindowChannel window;
    /** Each sensor's own signal (frozen value, excess scatter), tested before the balances see it. */
    private final SignalCheck signals;
    private final SnapshotSource source;
    private final ResultStore store;
    private final InMemoryLiveResults live;
    private final AlarmStateFile stateFile;
    private final Clock clock;
    private final EvaluationSlots slots;
    private final Timer calcTime;
    private final Timer snapshotLatency;
    private final ExecutorService worker;
    private final Thread intake;
    private final List<Consumer<List<AlarmRecord>>> alarmListeners = new CopyOnWriteArrayList<>();
    private final List<Consumer<List<AlarmRecord>>> windowAlarmListeners = new CopyOnWriteArrayList<>();
    private volatile List<AlarmRecord> alarms = List.of();
    private volatile List<AlarmRecord> windowAlarms = List.of();
    private volatile boolean running;
    private volatile long processed;

    /** A monitor of the per-snapshot channel alone (no window channel). */
    public UnitMonitor(String site, UnitDescription unit, AlarmSettings settings, SnapshotSource source,
                       ResultStore store, InMemoryLiveResults live, AlarmStateFile stateFile, MeterRegistry registry,
                       Clock clock) {
        this(site, unit, settings, WindowChannelSettings.DEFAULTS.withEnabled(false), Duration.ofSeconds(1), source,
                store, live, stateFile, registry, clock);
    }

    /**
     * A monitor with the window channel as {@code window} says; its alarm state is saved beside
     * {@code stateFile}'s, under {@code alarms/window/} of the same data directory.
     *
     * @param snapshotPeriod the collector's time between snapshots, which turns the window's length
     *                       into a count of snapshots
     */
    public UnitMonitor(String site, UnitDescription unit, AlarmSettings settings, WindowChannelSettings window,
                       Duration snapshotPeriod, SnapshotSource source, ResultStore store, InMemoryLiveResults live,
                       AlarmStateFile stateFile, MeterRegistry registry, Clock clock) {
        this(site, unit, settings, window, snapshotPeriod, source, store, live, stateFile, registry, clock,
                EvaluationSlots.unlimited());
    }

    /**
     * As above, evaluating only while it holds one of {@code slots}, which the units of a daemon
     * share.
     */
    UnitMonitor(String site, UnitDescription unit, AlarmSettings settings, WindowChannelSettings window,
                Duration snapshotPeriod, SnapshotSource source, ResultStore store, InMemoryLiveResults live,
                AlarmStateFile stateFile, MeterRegistry registry, Clock clock, EvaluationSlots slots) {
        this.slots = slots;
        this.site = site;
        this.unit = unit;
        this.evaluator = ReconcilingEvaluator.compile(site, unit);
        this.engine = new AlarmEngine(unit, settings, clock);
        this.window = window.enabled() ? WindowChannel.compile(site, unit, window, snapshotPeriod,
                stateFile.forChannel(WindowChannel.CHANNEL), clock)
                : null;
        if (this.window != null && window.snapshots(snapshotPeriod) * snapshotPeriod.toMillis()
                != window.length().toMillis()) {
            LOG.warn("unit {}: window length {} is not a whole number of snapshot periods of {}; using {} snapshots ({} s)",
                    unit.id(), window.length(), snapshotPeriod, this.window.length(), this.window.lengthS());
        }
        this.signals = AlarmEngine.signalCheck(unit, settings, settings.signal().forUnit(unit));
        this.source = source;
        this.store = store;
        this.live = live;
        this.stateFile = stateFile;
        this.clock = clock;
        this.calcTime = Timer.builder("steamtally.calc.time").tag("unit", unit.id())
                .description("evaluation of one snapshot: cycle model, reconciliation and alarms")
                .publishPercentileHistogram().register(registry);
        this.snapshotLatency = Timer.builder("steamtally.snapshot.latency").tag("unit", unit.id())
                .description("from a snapshot's timestamp to its result being stored and published")
                .publishPercentileHistogram().register(registry);
        this.worker = Executors.newSingleThreadExecutor(r -> new Thread(r, "steamtally-unit-" + unit.id()));
        this.intake = new Thread(this::intakeLoop, "steamtally-intake-" + unit.id());
        this.intake.setDaemon(true);
    }

    /** Restores the saved alarm state, if any, and starts taking snapshots. */
    public void start() {
        call(() -> {
            restore();
            alarms = engine.alarms();
            restoreWindow();
            return null;
        });
        running = true;
        intake.start();
    }

    private void restore() {
        try {
            Optional<AlarmEngineState> saved = stateFile.load();
            if (saved.isPresent()) {
                List<String> leftOut = engine.restore(saved.get());
                long active = saved.get().alarms().stream().filter(a -> a.state() != AlarmState.NORMAL).count();
                LOG.info("unit {}: alarm state restored from {} ({} alarms not normal)", unit.id(), stateFile.path(),
                        active);
                leftOut.forEach(l -> LOG.warn("unit {}: {}", unit.id(), l));
            }
        } catch (IOException | IllegalArgumentException e) {
            LOG.error("unit {}: alarm state not restored, starting with every alarm normal: {}", unit.id(),
                    e.getMessage());
        }
    }

    private void restoreWindow() {
        if (window == null) {
            return;
        }
        try {
            Optional<List<String>> leftOut = window.restore();
            if (leftOut.isPresent()) {
                long active = window.engine().alarms().stream().filter(a -> a.state() != AlarmState.NORMAL).count();
                LOG.info("unit {}: window alarm state restored from {} ({} alarms not normal); the window starts empty",
                        unit.id(), window.stateFile().path(), active);
                leftOut.get().forEach(l -> LOG.warn("unit {}: window {}", unit.id(), l));
            }
        } catch (IOException | IllegalArgumentException e) {
            LOG.error("unit {}: window alarm state not restored, starting with every window alarm normal: {}",
                    unit.id(), e.getMessage());
        }
        windowAlarms = window.engine().alarms();
    }

    public String unitId() {
        return unit.id();
    }

    public UnitDescription unit() {
        return unit;
    }

    /**
     * The balances a sensor takes part in, fixed when the unit was compiled; safe from any thread
     * (see {@link ReconcilingEvaluator#balancesOf}).
     */
    public List<String> balancesOf(String sensorId) {
        return evaluator.balancesOf(sensorId);
    }

    /** Snapshots evaluated so far. */
    public long processed() {
        return processed;
    }

    /** The unit's alarms as of the last change, every state included. */
    public List<AlarmRecord> alarms() {
        return alarms;
    }

    /** Calls {@code listener} on the unit's thread with the records of the alarms that changed. */
    public void onAlarmChange(Consumer<List<AlarmRecord>> listener) {
        alarmListeners.add(listener);
    }

    /** Whether the window channel runs. */
    public boolean hasWindow() {
        return window != null;
    }

    /**
     * The window channel's alarms as of the last change, with their engine ids (no {@code window:}
     * prefix, which {@link #windowAlarmId} adds) and texts; empty when the channel is off.
     */
    public List<AlarmRecord> windowAlarms() {
        return windowAlarms;
    }

    /** The id a window alarm has outside its engine (store, log, board): {@code window:<engine id>}. */
    public static String windowAlarmId(String engineId) {
        return WindowChannel.ID_PREFIX + engineId;
    }

    /** The text a window alarm shows outside its engine: its engine text, said to be of the window mean. */
    public String windowAlarmText(AlarmRecord r) {
        return window == null ? r.text() : window.text(r.text());
    }

    /** Calls {@code listener} on the unit's thread with the records (engine ids) of the window alarms that changed. */
    public void onWindowAlarmChange(Consumer<List<AlarmRecord>> listener) {
        windowAlarmListeners.add(listener);
    }

    /**
     * {@link #act} on the window channel's engine; the action gets the engine's ids (no prefix).
     *
     * @throws IllegalStateException when the window channel is off
     */
    public AlarmRecord actOnWindow(java.util.function.Function<AlarmEngine, AlarmEvent> action) {
        if (window == null) {
            throw new IllegalStateException("unit " + unit.id() + " runs no window channel");
        }
        return call(() -> {
            AlarmEvent e = action.apply(window.engine());
            afterWindowEvents(List.of(e));
            return window.engine().alarm(e.alarmId()).orElseThrow();
        });
    }

    /**
     * Runs an engine action on the unit's thread, then stores its event, saves the state and tells
     * the listeners.
     *
     * @throws RuntimeException the action's own exception, unwrapped
     */
    public AlarmRecord act(java.util.function.Function<AlarmEngine, AlarmEvent> action) {
        return call(() -> {
            AlarmEvent e = action.apply(engine);
            afterEvents(List.of(e));
            return engine.alarm(e.alarmId()).orElseThrow();
        });
    }

    private <T> T call(Callable<T> task) {
        Future<T> f = worker.submit(task);
        try {
            return f.get(ACTION_TIMEOUT.toMillis(), TimeUnit.MILLISECONDS);
        } catch (ExecutionException e) {
            if (e.getCause() instanceof RuntimeException re) {
                throw re;
            }
            throw new IllegalStateException(e.getCause());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while waiting for unit " + unit.id(), e);
        } catch (TimeoutException e) {
            f.cancel(false);
            throw new IllegalStateException("unit " + unit.id() + " did not answer within " + ACTION_TIMEOUT);
        }
    }

    private void intakeLoop() {
        while (running) {
            try {
                Optional<Snapshot> s = source.take(POLL);
                if (!running) {
                    break;
                }
                Future<?> f = worker.submit(() -> {
                    s.ifPresent(this::process);
                    List<AlarmEvent> expired = engine.expireShelves();
                    if (!expired.isEmpty()) {
                        afterEvents(expired);
                    }
                    if (window != null) {
                        List<AlarmEvent> windowExpired = window.engine().expireShelves();
                        if (!windowExpired.isEmpty()) {
                            afterWindowEvents(windowExpired);
                        }
                    }
                });
                f.get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            } catch (ExecutionException | java.util.concurrent.RejectedExecutionException e) {
                LOG.error("unit {}: evaluation failed, snapshot skipped", unit.id(), e);
            }
        }
    }

    /**
     * One snapshot, start to end; a failure is logged and loses only this snapshot. The evaluation
     * holds one of the daemon's evaluation slots; storing, publishing and saving the alarm state do
     * not.
     */
    void process(Snapshot snapshot) {
        Evaluated e;
        slots.acquire();
        try {
            e = evaluate(snapshot);
        } finally {
            slots.release();
        }
        if (e == null) {
            return;
        }
        store.writeResult(e.result()); // the record's reconciliation goes with it (StoredReconciliation.of)
        if (!e.events().isEmpty()) {
            afterEvents(e.events());
        }
        if (!e.windowEvents().isEmpty()) {
            afterWindowEvents(e.windowEvents());
        }
        live.publish(e.result());
        processed++;
        snapshotLatency.record(Duration.between(snapshot.timestamp(), clock.instant()).abs());
    }

    /** A snapshot's result with the alarm events of both channels. */
    private record Evaluated(UnitResult result, List<AlarmEvent> events, List<AlarmEvent> windowEvents) {
    }

    /** Signal checks, cycle model, reconciliation and alarms of both channels; null when it failed (logged). */
    private Evaluated evaluate(Snapshot snapshot) {
        long t0 = System.nanoTime();
        UnitResult result;
        List<AlarmEvent> events;
        // A sensor failing its signal test is left out of the balances, in both channels, as a stale one is.
        Snapshot checked;
        try {
            SignalReport signal = signals.check(snapshot);
            List<AlarmEvent> signalEvents = engine.evaluateSignals(signal);
            checked = signal.excludingFailed(snapshot);
            result = evaluator.evaluate(checked);
            events = engine.evaluate(snapshot, result, ReconciliationInput.from(result.reconciliation()));
            if (!signalEvents.isEmpty()) {
                List<AlarmEvent> all = new ArrayList<>(signalEvents);
                all.addAll(events);
                events = all;
            }
        } catch (RuntimeException e) {
            LOG.error("unit {}: snapshot at {} could not be evaluated: {}", unit.id(), snapshot.timestamp(),
                    e.toString());
            return null;
        } finally {
            calcTime.record(System.nanoTime() - t0, TimeUnit.NANOSECONDS);
        }
        List<AlarmEvent> windowEvents = List.of();
        if (window != null) {
            long t1 = System.nanoTime();
            try {
                WindowChannel.Outcome w = window.evaluate(checked);
                result = result.withWindowReconciliation(w.summary());
                windowEvents = w.events();
            } catch (RuntimeException e) {
                // The per-snapshot result stands on its own; only the window's verdict is lost.
                LOG.error("unit {}: window mean at {} could not be evaluated: {}", unit.id(), snapshot.timestamp(),
                        e.toString());
            } finally {
                calcTime.record(System.nanoTime() - t1, TimeUnit.NANOSECONDS);
            }
        }
        return new Evaluated(result, events, windowEvents);
    }

    private void afterEvents(List<AlarmEvent> events) {
        List<AlarmRecord> changed = new ArrayList<>(events.size());
        for (AlarmEvent e : events) {
            store.writeAlarmEvent(StoredAlarmEvent.of(site, e));
            LOG.info("unit {}: alarm {} {} -> {} ({}): {}", unit.id(), e.alarmId(), e.from().key(), e.to().key(),
                    e.stimulus().key(), e.text());
            engine.alarm(e.alarmId()).ifPresent(changed::add);
        }
        alarms = engine.alarms();
        try {
            stateFile.save(engine.state());
        } catch (IOException e) {
            LOG.error("unit {}: alarm state not saved to {}: {}", unit.id(), stateFile.path(), e.toString());
        }
        for (Consumer<List<AlarmRecord>> l : alarmListeners) {
            try {
                l.accept(changed);
            } catch (RuntimeException ex) {
                LOG.warn("unit {}: alarm listener failed: {}", unit.id(), ex.toString());
            }
        }
    }

    /** {@link #afterEvents} for the window channel: events stored and logged under their window ids. */
    private void afterWindowEvents(List<AlarmEvent> events) {
        List<AlarmRecord> changed = new ArrayList<>(events.size());
        for (AlarmEvent inside : events) {
            AlarmEvent e = window.outside(inside);
            store.writeAlarmEvent(StoredAlarmEvent.of(site, e));
            LOG.info("unit {}: alarm {} {} -> {} ({}): {}", unit.id(), e.alarmId(), e.from().key(), e.to().key(),
                    e.stimulus().key(), e.text());
            window.engine().alarm(inside.alarmId()).ifPresent(changed::add);
        }
        windowAlarms = window.engine().alarms();
        try {
            window.save();
        } catch (IOException e) {
            LOG.error("unit {}: window alarm state not saved to {}: {}", unit.id(), window.stateFile().path(),
                    e.toString());
        }
        for (Consumer<List<AlarmRecord>> l : windowAlarmListeners) {
            try {
                l.accept(changed);
            } catch (RuntimeException ex) {
                LOG.warn("unit {}: window alarm listener failed: {}", unit.id(), ex.toString());
            }
        }
    }

    /** Stops intake, lets the snapshot in hand finish, saves the alarm state. */
    @Override
    public void close() {
        running = false;
        intake.interrupt();
        try {
            intake.join(5_000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        worker.submit(() -> {
            try {
                stateFile.save(engine.state());
            } catch (IOException e) {
                LOG.error("unit {}: alarm state not saved on stop: {}", unit.id(), e.toString());
            }
            if (window != null) {
                try {
                    window.save();
                } catch (IOException e) {
                    LOG.error("unit {}: window alarm state not saved on stop: {}", unit.id(), e.toString());
                }
            }
        });
        worker.shutdown();
        try {
            worker.awaitTermination(10, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
