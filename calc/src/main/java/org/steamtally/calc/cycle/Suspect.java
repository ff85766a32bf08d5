package org.steamtally.calc.cycle;

import java.util.List;
import java.util.Objects;
import java.util.OptionalDouble;

/**
 * One sensor named by gross-error identification, in the order serial elimination removed it.
 *
 * <p>JSON (result record, {@code suspects[]}): {@code rank, id, unit, equivalence_set, test_value,
 * bias, sigma_bias, confirmed}.
 *
 * @param rank           1 for the first removed
 * @param id             the sensor (or constant) with the largest individual test value at that step
 *                       (the most plausible member of its equivalence set)
 * @param unit           SI unit of {@code bias}
 * @param equivalenceSet {@code id} and every quantity whose adjustment is so strongly correlated with
 *                       its adjustment that the balances cannot tell them apart; the gross error may be
 *                       in any of them
 * @param testValue      its individual test value when it was removed
 * @param bias           measured value less the value the remaining measurements give for it, SI;
 *                       empty when they do not determine it
 * @param sigmaBias      the standard uncertainty of that bias estimate
 * @param confirmed      true when, with every suspect up to this one removed, the global test passes
 */
public record Suspect(int rank, String id, String unit, List<String> equivalenceSet, double testValue, OptionalDouble bias,
                      OptionalDouble sigmaBias, boolean confirmed) {

    public Suspect {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(unit, "unit");
        equivalenceSet = List.copyOf(equivalenceSet);
        if (rank < 1 || !Double.isFinite(testValue) || bias.isPresent() && !Double.isFinite(bias.getAsDouble())
                || sigmaBias.isPresent() && !Double.isFinite(sigmaBias.getAsDouble())) {
            throw new IllegalArgumentException("suspect " + id + ": rank must be ≥ 1 and the values finite");
        }
    }
}
