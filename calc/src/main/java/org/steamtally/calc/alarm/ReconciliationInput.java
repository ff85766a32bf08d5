package org.steamtally.calc.alarm;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Suspect;

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

    /**
     * The verdict of a reconciliation as the alarm engine takes it; empty when the reconciliation was
     * not run or did not converge, so that the global-test and suspect alarms keep their state. A
     * suspect whose bias the remaining measurements cannot give (no estimate, or none with a positive
     * uncertainty) is not passed on: it cannot be tested on its own, and the global-test alarm, which
     * fails whenever suspects are named, stands for it.
     */
    public static Optional<ReconciliationInput> from(ReconciliationResult result) {
        String status = result.status();
        if (!status.equals(ReconciliationResult.PASSED) && !status.equals(ReconciliationResult.FAILED)
                && !status.equals(ReconciliationResult.NO_REDUNDANCY)) {
            return Optional.empty();
        }
        List<SuspectInput> suspects = new ArrayList<>(result.suspects().size());
        for (Suspect s : result.suspects()) {
            if (s.bias().isPresent() && s.sigmaBias().isPresent() && s.sigmaBias().getAsDouble() > 0.0) {
                List<String> others = s.equivalenceSet().stream().filter(id -> !id.equals(s.id())).toList();
                suspects.add(new SuspectInput(s.id(), s.bias().getAsDouble(), s.sigmaBias().getAsDouble(),
                        s.testValue(), others));
            }
        }
        return Optional.of(new ReconciliationInput(result.chi2(), result.chi2Limit().orElse(0.0),
                result.chi2Limit().isPresent() ? result.redundancy() : 0, suspects));
    }
}
