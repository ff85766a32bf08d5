package org.steamtally.calc.reconcile;

import java.util.List;
import java.util.Objects;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.MetricsBasis;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.SensorUncertainties;
import org.steamtally.calc.plant.UnitDescription;

/**
 * One snapshot to one full result record: the cycle model on the raw values, the reconciliation
 * and its tests, and the cycle model once more on the values the metrics should come from.
 *
 * <ul>
 *   <li>Global test passed: states, components and cycle figures from the reconciled values
 *       ({@code metrics_basis} {@code reconciled}).</li>
 *   <li>Failed, and serial elimination confirmed its suspects, each determined by the other
 *       sensors: from the raw values with each named suspect (the first of its equivalence set)
 *       replaced by its estimate from the others ({@code raw_excluding_suspects}).</li>
 *   <li>Otherwise (failed without such suspects, no redundancy, not converged): from the raw
 *       values ({@code raw}).</li>
 * </ul>
 * The closure checks always come from the raw values, since they check the measurements; the raw
 * cycle figures are kept beside the chosen ones as {@code cycle_raw}.
 *
 * <p>Not thread-safe, like the {@link CycleModel} and the {@link Reconciler} it holds (which reuses
 * its working arrays from call to call): one instance per thread at a time. No record depends on the
 * snapshots evaluated before it, and every record is the caller's own.
 */
public final class ReconcilingEvaluator {

    private final CycleModel model;
    private final Reconciler reconciler;

    private ReconcilingEvaluator(CycleModel model, Reconciler reconciler) {
        this.model = Objects.requireNonNull(model, "model");
        this.reconciler = Objects.requireNonNull(reconciler, "reconciler");
    }

    /**
     * @throws org.steamtally.calc.cycle.CycleModelException when the cycle model rejects the unit
     */
    public static ReconcilingEvaluator compile(String siteId, UnitDescription unit) {
        CycleModel model = CycleModel.compile(siteId, unit);
        return new ReconcilingEvaluator(model, Reconciler.compile(unit));
    }

    /**
     * The balances a sensor (or declared constant) takes part in, fixed when the unit is compiled;
     * see {@link Reconciler#balancesOf}. Safe to call from any thread, unlike {@link #evaluate}.
     */
    public List<String> balancesOf(String quantityId) {
        return reconciler.balancesOf(quantityId);
    }

    /** The full result record of one snapshot; never throws for bad sensor values. */
    public UnitResult evaluate(Snapshot snapshot) {
        return evaluate(snapshot, model.evaluate(snapshot), reconciler.reconcile(snapshot), null);
    }

    /**
     * The full result record of one snapshot whose sensors have the given standard uncertainties
     * instead of the declared ones (the mean of n readings has u/√n): the record an evaluator
     * compiled from the unit with these uncertainties would give, from this one compilation. The
     * closure checks and the reconciliation weigh and test with them; the declared constants keep
     * theirs. Never throws for bad sensor values.
     *
     * @param standardUncertaintySi one standard uncertainty per sensor, SI, in declaration order,
     *                              each positive and finite (see {@link SensorUncertainties})
     * @throws IllegalArgumentException when the uncertainties are not one positive finite value per sensor
     */
    public UnitResult evaluate(Snapshot snapshot, double[] standardUncertaintySi) {
        UnitResult raw = model.evaluate(snapshot, standardUncertaintySi);
        Reconciliation reconciliation = reconciler.reconcile(snapshot, standardUncertaintySi);
        return evaluate(snapshot, raw, reconciliation, standardUncertaintySi);
    }

    /** @param standardUncertaintySi the sensors' uncertainties, or null for the declared ones */
    private UnitResult evaluate(Snapshot snapshot, UnitResult raw, Reconciliation reconciliation,
                                double[] standardUncertaintySi) {
        MetricsBasis basis = MetricsBasis.RAW;
        UnitResult chosen = raw;
        double[] values = reconciliation.reconciledValues().orElse(null);
        if (values != null) {
            basis = MetricsBasis.RECONCILED;
        } else {
            values = reconciliation.excludingSuspectsValues().orElse(null);
            if (values != null) {
                basis = MetricsBasis.RAW_EXCLUDING_SUSPECTS;
            }
        }
        if (values != null) {
            Snapshot basisSnapshot = new Snapshot(snapshot.timestamp(), snapshot.unitId(), values,
                    snapshot.status().clone());
            chosen = standardUncertaintySi == null ? model.evaluate(basisSnapshot)
                    : model.evaluate(basisSnapshot, standardUncertaintySi);
        }
        return new UnitResult(raw.timestamp(), raw.site(), raw.unit(), chosen.states(), chosen.components(),
                chosen.cycle(), raw.closure(), reconciliation.result(), basis, raw.cycle());
    }
}
