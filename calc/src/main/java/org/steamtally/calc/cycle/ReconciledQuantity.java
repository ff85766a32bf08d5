package org.steamtally.calc.cycle;

import java.util.Objects;
import java.util.OptionalDouble;

/**
 * One unmeasured quantity solved by a reconciliation: an unmetered flow, the enthalpy of a state
 * no measurement fixes (a wet turbine exhaust, or a state whose sensors are stale), or the value of
 * a sensor left out by gross-error identification.
 *
 * <p>JSON (result record, {@code reconciliation.unmeasured[]}): {@code id, unit, reconciled,
 * sigma_reconciled, observable}.
 *
 * @param id              {@code <state>.m_kg_per_s}, {@code <state>.h_J_per_kg} or {@code <sensor>.value}
 * @param unit            SI unit
 * @param reconciled      its value; empty when it is not observable
 * @param sigmaReconciled its standard uncertainty; empty when it is not observable
 * @param observable      whether the balances and the measurements determine it
 */
public record ReconciledQuantity(String id, String unit, OptionalDouble reconciled, OptionalDouble sigmaReconciled,
                                 boolean observable) {

    public ReconciledQuantity {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(unit, "unit");
        if (observable != reconciled.isPresent()) {
            throw new IllegalArgumentException("unmeasured " + id + ": a value is given exactly when it is observable");
        }
        for (OptionalDouble v : new OptionalDouble[] {reconciled, sigmaReconciled}) {
            if (v.isPresent() && !Double.isFinite(v.getAsDouble())) {
                throw new IllegalArgumentException("unmeasured " + id + ": values must be finite, was " + v.getAsDouble());
            }
        }
    }
}
