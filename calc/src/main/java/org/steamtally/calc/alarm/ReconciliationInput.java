package org.steamtally.calc.alarm;

import java.util.List;

/**
 * The reconciliation's verdict on one snapshot, as the alarm engine needs it: the global test and the
 * sensors it names. Without it (the reconciliation not run, or not converged) the global-test and
 * suspect alarms keep their state.
 *
 * @param chi2       the weighted sum of squared adjustments, ≥ 0
 * @param chi2Limit  the χ² quantile it is compared with for the redundancy degree, &gt; 0 when
 *                   {@code redundancy} &gt; 0
 * @param redundancy the redundancy degree; 0 means no test is possible and the global-test alarm
 *                   keeps its state
 * @param suspects   the named sensors, ranked, one entry per sensor; sensors not listed are taken as
 *                   not suspect
 */
public record ReconciliationInput(double chi2, double chi2Limit, int redundancy, List<SuspectInput> suspects) {

    public ReconciliationInput {
        suspects = List.copyOf(suspects);
        if (redundancy < 0) {
            throw new IllegalArgumentException("redundancy must be 0 or more, was " + redundancy);
        }
        if (!(chi2 >= 0.0) || !Double.isFinite(chi2) || !(chi2Limit >= 0.0) || !Double.isFinite(chi2Limit)
                || redundancy > 0 && chi2Limit == 0.0) {
            throw new IllegalArgumentException("chi2 " + chi2 + " and its limit " + chi2Limit
                    + " must be finite and not negative, the limit positive when the redundancy (" + redundancy
                    + ") is");
        }
    }

    /** Whether the global test can be made and fails. */
    public boolean globalTestFails() {
        return redundancy > 0 && chi2 > chi2Limit;
    }
}
