package org.steamtally.calc.cycle;

import java.util.List;
import java.util.Objects;
import java.util.OptionalDouble;

/**
 * The verdict of the window channel beside a result record: the reconciliation of the mean of the
 * last snapshots (see {@code org.steamtally.calc.reconcile.WindowMeanEvaluator}), summarised. The
 * record's own {@code reconciliation} stays that of the single snapshot.
 *
 * <p>JSON (result record, object {@code window_reconciliation}, absent when the channel is off):
 * {@code length_s, length, samples, status, passed, chi2, chi2_limit, redundancy, suspects[]}, the
 * suspects in the form of the record's {@code suspects[]}.
 *
 * @param lengthS    the window's length in seconds of plant time (snapshots × snapshot period), &gt; 0
 * @param length     the window's length in snapshots, ≥ 1
 * @param samples    the snapshots the window held for this mean, 1 to {@code length}; below
 *                   {@code length} while the window fills (after a start or a restart)
 * @param status     the reconciliation's status of the mean, as {@link ReconciliationResult#status()}
 * @param chi2       the quality criterion of the mean, ≥ 0
 * @param chi2Limit  its χ² quantile; empty without redundancy
 * @param redundancy the redundancy degree
 * @param suspects   the gross-error suspects of the mean, ranked; empty unless its global test failed
 */
public record WindowReconciliation(double lengthS, int length, int samples, String status, double chi2,
                                   OptionalDouble chi2Limit, int redundancy, List<Suspect> suspects) {

    public WindowReconciliation {
        Objects.requireNonNull(status, "status");
        Objects.requireNonNull(chi2Limit, "chi2Limit");
        suspects = List.copyOf(suspects);
        if (!(lengthS > 0.0) || !Double.isFinite(lengthS) || length < 1 || samples < 1 || samples > length) {
            throw new IllegalArgumentException("window reconciliation: length " + lengthS + " s (" + length
                    + " snapshots) must be positive and samples " + samples + " between 1 and the length");
        }
        if (!Double.isFinite(chi2) || chi2 < 0.0 || redundancy < 0
                || chi2Limit.isPresent() && !(Double.isFinite(chi2Limit.getAsDouble()) && chi2Limit.getAsDouble() > 0.0)) {
            throw new IllegalArgumentException("window reconciliation: chi2 " + chi2 + ", limit " + chi2Limit
                    + " and redundancy " + redundancy + " must be finite, not negative, the limit positive");
        }
    }

    /** The summary of the reconciliation of a window's mean. */
    public static WindowReconciliation of(double lengthS, int length, int samples, ReconciliationResult r) {
        return new WindowReconciliation(lengthS, length, samples, r.status(), r.chi2(), r.chi2Limit(), r.redundancy(),
                r.suspects());
    }

    /** Whether the global test of the mean was made and accepted it. */
    public boolean passed() {
        return ReconciliationResult.PASSED.equals(status);
    }

    /** χ² over its quantile (below 1 passes at the reconciliation's level); empty without a test. */
    public OptionalDouble chi2Ratio() {
        return chi2Limit.isPresent() ? OptionalDouble.of(chi2 / chi2Limit.getAsDouble()) : OptionalDouble.empty();
    }
}
