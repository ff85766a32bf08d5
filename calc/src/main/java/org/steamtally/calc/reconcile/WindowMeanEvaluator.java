package org.steamtally.calc.reconcile;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.function.BiFunction;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.SensorUncertainties;
import org.steamtally.calc.plant.UnitDescription;

/**
 * The full result record of the mean of the last {@code n} snapshots: each sensor's good values in
 * the window are averaged, and the mean is reconciled and checked with the sensor's standard
 * uncertainty divided by √n_eff, the standard uncertainty of a mean of n_eff independent readings
 * (GUM, JCGM 100:2008, 4.2.3). Reconciling mean values over a steady period is how VDI 2048-1 treats
 * acceptance measurements; here the period slides by one snapshot.
 *
 * <p>Why: a gross error of a few σ is hard to see in one snapshot. Its individual test value in a
 * single reconciliation is k·ρ, with ρ = σ(v)/u ≤ 1 the share of the sensor's uncertainty the
 * balances can check, so a 3σ bias on a sensor with ρ = 0.4 has a mean test value of 1.2 and passes
 * most snapshots. The window mean shrinks the random part by √n and leaves the bias, so after a full
 * window the test value's mean is k·ρ·√n (3 · 0.4 · √50 ≈ 8.5).
 *
 * <p>What it assumes, and what to keep in mind:
 * <ul>
 *   <li>The readings' errors are independent from one snapshot to the next (white noise). A
 *       declared uncertainty that is mostly systematic (calibration) does not shrink with averaging;
 *       for such a sensor the √n is too optimistic and the window's tests will reject a plant that
 *       is fine. The simulator's noise is white, so the figures in docs/DETECTION.md hold for it.</li>
 *   <li>The plant is steady over the window: on a load ramp the mean of the readings is not a state
 *       the balances describe exactly (the model is nonlinear).</li>
 *   <li>Successive window means share n − 1 readings and are strongly correlated, so the 95 %
 *       level of the per-snapshot tests does not give 5 % of snapshots as false alarms per window;
 *       the alarm limits for window-mean results are set higher (see docs/DETECTION.md).</li>
 *   <li>Declared constants (efficiencies, heating values) keep their uncertainty: they are not
 *       read again every second.</li>
 * </ul>
 * A sensor with no good value in the window keeps the snapshot's own value and status. n_eff is the
 * smallest count of good values over the sensors that have any, so a sensor that dropped out for a
 * while makes the uncertainties of all a little wider than they need be, never narrower.
 *
 * <p>The daemon evaluates through {@link #evaluate(Snapshot, WindowRule)}: a window that is not
 * representative (periods missing, a balance sensor good over only part of it) is not reconciled,
 * and n_eff counts new readings, not values carried over from the snapshot before
 * (docs/DETECTION.md, windows that are not representative).
 *
 * <p>One evaluator is compiled per window, with the declared uncertainties; each mean is evaluated
 * with the sensors' uncertainties divided by √n_eff handed over at evaluation time, so a window that
 * fills after a start or a sensor that drops out costs no compilation, and the window holds one
 * compiled model whatever n_eff it meets. Not thread-safe: one instance per unit and thread.
 */
public final class WindowMeanEvaluator {

    private final UnitDescription unit;
    private final int window;
    private final double[][] values;
    private final boolean[][] good;
    /**
     * Whether the good value is a new reading: not bit for bit the value the sensor had in the
     * snapshot before. The collector carries a sensor's newest reading into every snapshot until its
     * max age (GOOD), so a reading that arrives late, or a source that falls behind, repeats one
     * reading over several snapshots; that reading's noise is one draw, not several.
     */
    private final boolean[][] fresh;
    /** Each held snapshot's timestamp, ms since the epoch, in the same ring as {@link #values}. */
    private final long[] timeMs;
    /** Whether the sensor takes part in a balance: only those decide whether the window is representative. */
    private final boolean[] inBalance;
    /** Per sensor, scratch of one evaluation: the sum and count of its good values in the window. */
    private final double[] sums;
    private final int[] counts;
    private final int[] freshCounts;
    /**
     * The one compiled evaluator: a compiled evaluator is large (its cycle model and
     * reconciliation, about 65 kB) and each compilation costs CPU (0.3 to 0.7 ms warm, far more
     * while the JIT is cold; docs/PERFORMANCE.md), so neither one per n_eff nor a compilation per
     * change of n_eff suits a daemon with a hundred units.
     */
    private final ReconcilingEvaluator evaluator;
    /** The sensors' uncertainties of a mean of {@link #meanCount} readings, SI: kept while n_eff stays. */
    private double[] meanUncertaintySi;
    private int meanCount;
    private int next;
    private int held;
    private long meansEvaluated;

    private WindowMeanEvaluator(UnitDescription unit, int window, ReconcilingEvaluator evaluator) {
        this.unit = unit;
        this.window = window;
        int sensors = unit.sensors().size();
        this.values = new double[window][sensors];
        this.good = new boolean[window][sensors];
        this.fresh = new boolean[window][sensors];
        this.timeMs = new long[window];
        this.evaluator = evaluator;
        this.inBalance = new boolean[sensors];
        for (int i = 0; i < sensors; i++) {
            inBalance[i] = !evaluator.balancesOf(unit.sensors().get(i).id()).isEmpty();
        }
        this.sums = new double[sensors];
        this.counts = new int[sensors];
        this.freshCounts = new int[sensors];
    }

    /**
     * @param windowLength the number of snapshots averaged, ≥ 1 (1 is the ordinary per-snapshot evaluation)
     * @throws IllegalArgumentException when the window length is below 1
     * @throws org.steamtally.calc.cycle.CycleModelException when the cycle model rejects the unit
     */
    public static WindowMeanEvaluator compile(String siteId, UnitDescription unit, int windowLength) {
        return compile(siteId, unit, windowLength, ReconcilingEvaluator::compile);
    }

    /**
     * As {@link #compile(String, UnitDescription, int)}, with the evaluator compiled by
     * {@code compiler}: a test hands in one that counts its calls, to see that the window compiles
     * once whatever n_eff it meets.
     */
    static WindowMeanEvaluator compile(String siteId, UnitDescription unit, int windowLength,
                                       BiFunction<String, UnitDescription, ReconcilingEvaluator> compiler) {
        Objects.requireNonNull(siteId, "siteId");
        Objects.requireNonNull(unit, "unit");
        if (windowLength < 1) {
            throw new IllegalArgumentException("window length must be at least 1 snapshot, was " + windowLength);
        }
        return new WindowMeanEvaluator(unit, windowLength, compiler.apply(siteId, unit));
    }

    /** The number of snapshots averaged once the window is full. */
    public int windowLength() {
        return window;
    }

    /** The snapshots the window holds now: up to the window length, fewer while it fills after a start or {@link #clear()}. */
    public int samples() {
        return held;
    }

    /** The means reconciled so far: one per snapshot, none for a verdict withheld. */
    public long meansEvaluated() {
        return meansEvaluated;
    }

    /**
     * Takes the snapshot into the window and returns the result record of the window's mean, time
     * stamped with this snapshot's time; never throws for bad sensor values. The mean is reconciled
     * whatever the window holds; {@link #evaluate(Snapshot, WindowRule)} first asks whether it is
     * representative.
     *
     * @throws IllegalArgumentException when the snapshot is of another unit or has not one value per sensor
     */
    public UnitResult evaluate(Snapshot snapshot) {
        take(snapshot);
        return evaluateMean(snapshot, counts);
    }

    /**
     * Takes the snapshot into the window and, when the window is representative by {@code rule},
     * returns the result record of its mean as {@link #evaluate(Snapshot)} does, but with n_eff
     * counted in new readings ({@link #fresh}): a value repeated from the snapshot before counts
     * once, so a window of held readings is not taken for more independent readings than it has.
     * Otherwise the reason, with no reconciliation run (a withheld verdict costs a pass over the
     * window's flags). A window of noisy, fresh readings gives exactly what {@link #evaluate(Snapshot)} gives.
     *
     * @throws IllegalArgumentException when the snapshot is of another unit or has not one value per sensor
     */
    public WindowVerdict evaluate(Snapshot snapshot, WindowRule rule) {
        Objects.requireNonNull(rule, "rule");
        take(snapshot);
        String reason = unrepresentative(rule);
        return reason == null ? WindowVerdict.of(evaluateMean(snapshot, freshCounts))
                : WindowVerdict.withheld(reason);
    }

    private void take(Snapshot snapshot) {
        int sensors = unit.sensors().size();
        if (!snapshot.unitId().equals(unit.id()) || snapshot.valuesSi().length != sensors) {
            throw new IllegalArgumentException("window of unit " + unit.id() + " (" + sensors
                    + " sensors) was given a snapshot of unit " + snapshot.unitId() + " with "
                    + snapshot.valuesSi().length + " values");
        }
        int before = (next - 1 + window) % window;
        for (int i = 0; i < sensors; i++) {
            double v = snapshot.valuesSi()[i];
            boolean g = snapshot.status()[i] == Snapshot.SensorStatus.GOOD && Double.isFinite(v);
            good[next][i] = g;
            // a deliberate exact comparison: a held reading is the same double, a new one almost never is
            fresh[next][i] = g && (held == 0 || !good[before][i] || values[before][i] != v);
            values[next][i] = v;
        }
        timeMs[next] = snapshot.timestamp().toEpochMilli();
        next = (next + 1) % window;
        held = Math.min(held + 1, window);
        for (int i = 0; i < sensors; i++) {
            double sum = 0.0;
            int count = 0;
            int newReadings = 0;
            for (int w = 0; w < held; w++) {
                if (good[w][i]) {
                    sum += values[w][i];
                    count++;
                    if (fresh[w][i]) {
                        newReadings++;
                    }
                }
            }
            sums[i] = sum;
            counts[i] = count;
            // at least one: the oldest held value may repeat a reading that has left the window
            freshCounts[i] = count > 0 ? Math.max(1, newReadings) : 0;
        }
    }

    /** Why the window as held now is not representative by {@code rule}; null when it is. */
    private String unrepresentative(WindowRule rule) {
        long oldest = timeMs[(next - held + window) % window];
        long newest = timeMs[(next - 1 + window) % window];
        long periodMs = rule.snapshotPeriod().toMillis();
        long spanned = newest > oldest ? Math.round((double) (newest - oldest) / periodMs) + 1 : 1;
        int periods = (int) Math.min(Integer.MAX_VALUE, Math.max(held, spanned));
        int needed = rule.needed(periods);
        String share = Math.round(rule.minGoodShare() * 100.0) + " %";
        if (held < needed) {
            return "the window's " + held + " snapshots span " + periods + " periods of " + (periodMs % 1000 == 0 ? periodMs / 1000 + " s" : periodMs + " ms")
                    + ": " + (periods - held) + " missing, at most " + (periods - needed) + " allowed (" + share
                    + " of the span must be held)";
        }
        StringBuilder shortOf = null;
        int more = 0;
        int named = 0;
        for (int i = 0; i < counts.length; i++) {
            if (inBalance[i] && counts[i] > 0 && counts[i] < needed) {
                if (named == 3) {
                    more++;
                    continue;
                }
                shortOf = shortOf == null ? new StringBuilder() : shortOf.append(", ");
                shortOf.append(unit.sensors().get(i).id()).append(" (").append(counts[i]).append(')');
                named++;
            }
        }
        if (shortOf == null) {
            return null;
        }
        return "good values in only part of the window's " + periods + " periods, fewer than the " + needed
                + " needed (" + share + "): " + shortOf + (more > 0 ? " and " + more + " more" : "");
    }

    /**
     * The result record of the mean of the held snapshots, from {@link #take}'s sums; n_eff is the
     * smallest of {@code readings} over the sensors with a good value.
     */
    private UnitResult evaluateMean(Snapshot snapshot, int[] readings) {
        int sensors = unit.sensors().size();
        double[] mean = snapshot.valuesSi().clone();
        Snapshot.SensorStatus[] status = snapshot.status().clone();
        int nEff = Integer.MAX_VALUE;
        for (int i = 0; i < sensors; i++) {
            int count = counts[i];
            if (count > 0) {
                mean[i] = sums[i] / count;
                status[i] = Snapshot.SensorStatus.GOOD;
                nEff = Math.min(nEff, readings[i]);
            }
        }
        if (nEff == Integer.MAX_VALUE) {
            nEff = 1;
        }
        meansEvaluated++;
        return evaluator.evaluate(new Snapshot(snapshot.timestamp(), snapshot.unitId(), mean, status),
                uncertaintiesOfMean(nEff));
    }

    /** Forgets every snapshot, e.g. after a gap in the data or a change of load. */
    public void clear() {
        held = 0;
        next = 0;
    }

    /** Every sensor's standard uncertainty divided by √count, SI, as {@link #meanUncertainties} holds them. */
    private double[] uncertaintiesOfMean(int count) {
        if (meanUncertaintySi == null || meanCount != count) {
            meanUncertaintySi = SensorUncertainties.scaled(unit.sensors(), 1.0 / Math.sqrt(count));
            meanCount = count;
        }
        return meanUncertaintySi;
    }

    /**
     * The unit with every sensor's standard uncertainty divided by √count: that of a mean of count
     * readings. A unit compiled from this is what the window's one evaluator stands for at n_eff =
     * count; tests compare the two.
     */
    static UnitDescription meanUncertainties(UnitDescription unit, int count) {
        double scale = 1.0 / Math.sqrt(count);
        List<Sensor> sensors = new ArrayList<>(unit.sensors().size());
        for (Sensor s : unit.sensors()) {
            sensors.add(s.withStandardUncertaintySi(s.standardUncertaintySi() * scale));
        }
        return new UnitDescription(unit.id(), unit.name(), sensors, unit.states(), unit.components(),
                unit.deadState());
    }
}
