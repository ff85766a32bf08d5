package org.steamtally.calc.reconcile;

import java.util.Objects;
import java.util.Optional;
import org.steamtally.calc.cycle.ReconciliationResult;

/**
 * What {@link Reconciler#reconcile} gives: the record part for the result, and the sensor values
 * the cycle metrics can be computed from instead of the raw ones.
 */
public final class Reconciliation {

    private final ReconciliationResult result;
    private final double[] reconciledValues;
    private final double[] excludingSuspectsValues;

    Reconciliation(ReconciliationResult result, double[] reconciledValues, double[] excludingSuspectsValues) {
        this.result = Objects.requireNonNull(result, "result");
        this.reconciledValues = reconciledValues;
        this.excludingSuspectsValues = excludingSuspectsValues;
    }

    public ReconciliationResult result() {
        return result;
    }

    /**
     * One value per sensor of the unit, SI: the reconciled value of every sensor that took part, the
     * snapshot's own value for the others. Present only when the global test passed.
     */
    public Optional<double[]> reconciledValues() {
        return Optional.ofNullable(reconciledValues).map(double[]::clone);
    }

    /**
     * One value per sensor: the snapshot's values with each confirmed suspect replaced by what the
     * remaining measurements give for it. Present only when serial elimination confirmed its
     * suspects and each named one is determined by the rest.
     */
    public Optional<double[]> excludingSuspectsValues() {
        return Optional.ofNullable(excludingSuspectsValues).map(double[]::clone);
    }
}
