package org.steamtally.deploy.daemon;

import java.io.IOException;
import java.time.Clock;
import java.time.Duration;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.steamtally.calc.alarm.AlarmEngine;
import org.steamtally.calc.alarm.AlarmEngineState;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmRecord;
import org.steamtally.calc.alarm.ReconciliationInput;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.cycle.WindowReconciliation;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.reconcile.WindowMeanEvaluator;
import org.steamtally.calc.reconcile.WindowRule;
import org.steamtally.calc.reconcile.WindowVerdict;
import org.steamtally.deploy.config.WindowChannelSettings;

/**
 * The second channel of a unit: the reconciliation of the mean of the last snapshots
 * ({@link WindowMeanEvaluator}) and its own alarm engine, with the raised limits a window mean needs
 * (docs/DETECTION.md). It sees a gross error of a few σ that single snapshots pass, at the price of
 * a delay of up to the window's length.
 *
 * <p>Its alarms are kept apart from the per-snapshot ones: inside its engine they have the ordinary
 * ids ({@code suspect:TT-311}), and everywhere outside (events in the store, the log, the alarm
 * board) the id carries the prefix {@value #ID_PREFIX} ({@code window:suspect:TT-311}) and the text
 * starts by saying it is about the window mean ({@code 50-s mean: ...}). Its engine's state is saved
 * to its own file; the window itself is not saved and starts empty after a restart.
 *
 * <p>A window that is not representative ({@link WindowRule}: snapshots missing from it, or a balance
 * sensor good over only part of it) is not reconciled: the summary has status
 * {@value WindowReconciliation#WITHHELD} and the reason, and the window alarms are held as they are
 * (none raised, none cleared, a change under way starts again with the next verdict).
 *
 * <p>Not thread-safe: used on the unit's one thread, as the per-snapshot evaluator and engine are.
 */
final class WindowChannel {

    /** The prefix of a window alarm's id outside its engine. */
    static final String ID_PREFIX = "window:";
    /** The channel's name in the data directory ({@code alarms/window/}). */
    static final String CHANNEL = "window";

    private final WindowMeanEvaluator evaluator;
    private final WindowRule rule;
    private final AlarmEngine engine;
    private final AlarmStateFile stateFile;
    private final double lengthS;
    private final String textPrefix;

    /** What one snapshot gave: the summary for the result record and the engine's events (engine ids). */
    record Outcome(WindowReconciliation summary, List<AlarmEvent> events) {
    }

    private WindowChannel(WindowMeanEvaluator evaluator, WindowRule rule, AlarmEngine engine, AlarmStateFile stateFile,
                          double lengthS) {
        this.evaluator = evaluator;
        this.rule = rule;
        this.engine = engine;
        this.stateFile = stateFile;
        this.lengthS = lengthS;
        this.textPrefix = seconds(lengthS) + "-s mean: ";
    }

    /**
     * The channel of one unit.
     *
     * @param snapshotPeriod the collector's time between snapshots, which turns the configured length
     *                       into a count of snapshots (rounded to the nearest, at least 1)
     */
    static WindowChannel compile(String site, UnitDescription unit, WindowChannelSettings settings,
                                 Duration snapshotPeriod, AlarmStateFile stateFile, Clock clock) {
        int n = settings.snapshots(snapshotPeriod);
        double lengthS = n * snapshotPeriod.toMillis() / 1000.0;
        return new WindowChannel(WindowMeanEvaluator.compile(site, unit, n), settings.rule(snapshotPeriod),
                new AlarmEngine(unit, settings.alarms(), clock), stateFile, lengthS);
    }

    /** The window's length in snapshots. */
    int length() {
        return evaluator.windowLength();
    }

    /** The window's length in seconds of plant time. */
    double lengthS() {
        return lengthS;
    }

    AlarmEngine engine() {
        return engine;
    }

    AlarmStateFile stateFile() {
        return stateFile;
    }

    /** The means reconciled so far; a withheld verdict adds none. */
    long meansEvaluated() {
        return evaluator.meansEvaluated();
    }

    /**
     * Takes the snapshot into the window and, when the window is representative, reconciles the mean
     * and runs the window alarms on it; otherwise holds the alarms and says why.
     *
     * @throws RuntimeException when the mean cannot be evaluated; the window keeps the snapshot
     */
    Outcome evaluate(Snapshot snapshot) {
        WindowVerdict verdict = evaluator.evaluate(snapshot, rule);
        if (verdict.isWithheld()) {
            return new Outcome(WindowReconciliation.withheld(lengthS, evaluator.windowLength(), evaluator.samples(),
                    verdict.withheld().get()), engine.hold());
        }
        UnitResult mean = verdict.result().get();
        List<AlarmEvent> events = engine.evaluate(snapshot, mean, ReconciliationInput.from(mean.reconciliation()));
        return new Outcome(WindowReconciliation.of(lengthS, evaluator.windowLength(), evaluator.samples(),
                mean.reconciliation()), events);
    }

    /** Puts back the saved alarm state; the lines say what was left out. Empty when nothing was saved. */
    Optional<List<String>> restore() throws IOException {
        Optional<AlarmEngineState> saved = stateFile.load();
        if (saved.isEmpty()) {
            return Optional.empty();
        }
        return Optional.of(engine.restore(saved.get()));
    }

    void save() throws IOException {
        stateFile.save(engine.state());
    }

    /** The event as the world outside the engine sees it: window id, text saying it is of the mean. */
    AlarmEvent outside(AlarmEvent e) {
        return new AlarmEvent(e.time(), e.unitId(), ID_PREFIX + e.alarmId(), e.kind(), e.priority(), e.from(), e.to(),
                e.stimulus(), e.value(), e.limit(), e.user(), e.note(), text(e.text()));
    }

    /** An alarm text of this channel, saying it is about the window mean. */
    String text(String engineText) {
        return textPrefix + engineText;
    }

    /** Whether an id outside the engine is a window alarm's. */
    static boolean isWindowId(String alarmId) {
        return alarmId.startsWith(ID_PREFIX);
    }

    /** The engine's id of a window alarm's outside id. */
    static String engineId(String alarmId) {
        return alarmId.substring(ID_PREFIX.length());
    }

    private static String seconds(double s) {
        return s == Math.rint(s) ? Long.toString((long) s) : String.format(Locale.ROOT, "%.1f", s);
    }
}
