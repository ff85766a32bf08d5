package org.steamtally.calc.cycle;

import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * The outcome of one reconciliation (VDI 2048-1 weighted least squares with the balances as
 * constraints) and its quality tests.
 *
 * <p>JSON (result record, object {@code reconciliation}): {@code status, passed, chi2, chi2_limit,
 * redundancy, confidence, test_limit, iterations, reason, sensors[], unmeasured[]}; the suspects are
 * written beside it as {@code suspects[]}.
 *
 * @param status     {@code passed}, {@code failed} (the global test rejects), {@code no_redundancy}
 *                   (nothing to check), {@code not_converged} (the iteration did not settle; see
 *                   {@code reason}) or {@code not_run}
 * @param chi2       the weighted sum of squared adjustments Σ (v_i / u_i)²; 0 when not run
 * @param chi2Limit  the χ² quantile at {@code confidence} for {@code redundancy} degrees of freedom;
 *                   empty without redundancy
 * @param redundancy the redundancy degree: the number of independent balances left once the
 *                   unmeasured quantities are eliminated
 * @param confidence the confidence level of the tests, e.g. 0.95
 * @param testLimit  the two-sided normal quantile the individual test values are compared with
 * @param iterations linearisations used
 * @param reason     why the status is not {@code passed}/{@code failed}/{@code no_redundancy}
 * @param sensors    the measured quantities, in the unit description's order, constants after sensors
 * @param unmeasured the unmeasured quantities
 * @param suspects   gross-error suspects, in the order serial elimination found them; empty unless failed
 */
public record ReconciliationResult(
        String status,
        double chi2,
        OptionalDouble chi2Limit,
        int redundancy,
        double confidence,
        double testLimit,
        int iterations,
        Optional<String> reason,
        List<ReconciledSensor> sensors,
        List<ReconciledQuantity> unmeasured,
        List<Suspect> suspects) {

    public static final String PASSED = "passed";
    public static final String FAILED = "failed";
    public static final String NO_REDUNDANCY = "no_redundancy";
    public static final String NOT_CONVERGED = "not_converged";
    public static final String NOT_RUN = "not_run";

    public ReconciliationResult {
        Objects.requireNonNull(status, "status");
        Objects.requireNonNull(reason, "reason");
        sensors = List.copyOf(sensors);
        unmeasured = List.copyOf(unmeasured);
        suspects = List.copyOf(suspects);
        if (!Double.isFinite(chi2) || chi2 < 0.0 || redundancy < 0 || iterations < 0) {
            throw new IllegalArgumentException("reconciliation: chi2 " + chi2 + ", redundancy " + redundancy
                    + " and iterations " + iterations + " must be finite and not negative");
        }
        if (chi2Limit.isPresent() && !Double.isFinite(chi2Limit.getAsDouble())) {
            throw new IllegalArgumentException("reconciliation: chi2 limit must be finite, was " + chi2Limit);
        }
    }

    /** Whether the global test was made and accepted the measurements. */
    public boolean passed() {
        return PASSED.equals(status);
    }

    /** The record of a unit that was not reconciled. */
    public static ReconciliationResult notRun() {
        return new ReconciliationResult(NOT_RUN, 0.0, OptionalDouble.empty(), 0, 0.95, 1.959963984540054, 0,
                Optional.empty(), List.of(), List.of(), List.of());
    }
}
