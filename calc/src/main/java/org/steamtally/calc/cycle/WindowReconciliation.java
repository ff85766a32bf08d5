package org.steamtally.calc.cycle;

import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * The verdict of the window channel beside a result record: the reconciliation of the mean of the
 * last snapshots (see {@code org.steamtally.calc.reconcile.WindowMeanEvaluator}), summarised. The
 * record's own {@code reconciliation} stays that of the single snapshot.
 *
 * <p>JSON (result record, object {@code window_reconciliation}, absent when the channel is off):
 * {@code length_s, length, samples, status, passed, chi2, chi2_limit, redundancy, suspects[]}, the
 * suspects in the form of the record's {@code suspects[]}, then {@code reason} when there is one.
 *
 * <p>Status {@value #WITHHELD}: the window was not representative (snapshots missing from it, or a
 * balance sensor good over only part of it) and its mean was not reconciled; {@code reason} says
 * which, χ² is 0, there is no limit, redundancy and suspects are empty, and the window alarms keep
 * their state.
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
 * @param reason     why the status is {@value #WITHHELD} (or another status that is not a verdict);
 *                   empty for a verdict
 */
public record WindowReconciliation(double lengthS, int length, int samples, String status, double chi2,
                                   OptionalDouble chi2Limit, int redundancy, List<Suspect> suspects,
                                   Optional<String> reason) {

    /** The status of a window whose verdict was withheld: not representative, not reconciled. */
    public static final String WITHHELD = "withheld";

    public WindowReconciliation {
        Objects.requireNonNull(status, "status");
        Objects.requireNonNull(reason, "reason");
        if (WITHHELD.equals(status) && reason.isEmpty()) {
            throw new IllegalArgumentException("window reconciliation: a withheld verdict must say why");
        }
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

    /** A summary without a reason, as written before withheld verdicts existed. */
    public WindowReconciliation(double lengthS, int length, int samples, String status, double chi2,
                                OptionalDouble chi2Limit, int redundancy, List<Suspect> suspects) {
        this(lengthS, length, samples, status, chi2, chi2Limit, redundancy, suspects, Optional.empty());
    }

    /** The summary of the reconciliation of a window's mean. */
    public static WindowReconciliation of(double lengthS, int length, int samples, ReconciliationResult r) {
        return new WindowReconciliation(lengthS, length, samples, r.status(), r.chi2(), r.chi2Limit(), r.redundancy(),
                r.suspects());
    }

    /** The summary of a window that was not representative: no reconciliation, {@code reason} says why. */
    public static WindowReconciliation withheld(double lengthS, int length, int samples, String reason) {
        return new WindowReconciliation(lengthS, length, samples, WITHHELD, 0.0, OptionalDouble.empty(), 0, List.of(),
                Optional.of(reason));
    }

    /** Whether the window withheld its verdict (see {@link #WITHHELD}). */
    public boolean withheld() {
        return WITHHELD.equals(status);
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
