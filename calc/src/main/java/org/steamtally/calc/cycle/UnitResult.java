package org.steamtally.calc.cycle;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * The result record of one snapshot of one unit: the contract shared by {@code replay}, the live API
 * and the store. Its JSON form uses snake_case names with the unit in the name; every field is
 * documented in docs/RESULTS.md.
 *
 * @param timestamp      the snapshot's instant ({@code ts}, ISO-8601 UTC)
 * @param site           the site id
 * @param unit           the unit id
 * @param states         states, from the values named by {@code metricsBasis}
 * @param components     components, from the values named by {@code metricsBasis}
 * @param cycle          the cycle's figures, from the values named by {@code metricsBasis}
 * @param closure        first-law checks, always from the values as measured: they check the measurements
 * @param reconciliation the reconciliation of the snapshot and its tests
 * @param metricsBasis   which values {@code states}, {@code components} and {@code cycle} come from
 * @param cycleRaw       the cycle's figures from the values as measured, kept beside {@code cycle}
 * @param windowReconciliation the window channel's verdict on the mean of the last snapshots; empty
 *                       when no window channel runs (replay, or the channel switched off)
 */
public record UnitResult(
        Instant timestamp,
        String site,
        String unit,
        List<StateResult> states,
        List<ComponentResult> components,
        CycleResult cycle,
        List<ClosureResult> closure,
        ReconciliationResult reconciliation,
        MetricsBasis metricsBasis,
        CycleResult cycleRaw,
        Optional<WindowReconciliation> windowReconciliation) {

    public UnitResult {
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(site, "site");
        Objects.requireNonNull(unit, "unit");
        states = List.copyOf(states);
        components = List.copyOf(components);
        Objects.requireNonNull(cycle, "cycle");
        closure = List.copyOf(closure);
        Objects.requireNonNull(reconciliation, "reconciliation");
        Objects.requireNonNull(metricsBasis, "metricsBasis");
        Objects.requireNonNull(cycleRaw, "cycleRaw");
        Objects.requireNonNull(windowReconciliation, "windowReconciliation");
    }

    /** A record without a window channel's verdict. */
    public UnitResult(Instant timestamp, String site, String unit, List<StateResult> states,
                      List<ComponentResult> components, CycleResult cycle, List<ClosureResult> closure,
                      ReconciliationResult reconciliation, MetricsBasis metricsBasis, CycleResult cycleRaw) {
        this(timestamp, site, unit, states, components, cycle, closure, reconciliation, metricsBasis, cycleRaw,
                Optional.empty());
    }

    /** This record with the window channel's verdict beside it. */
    public UnitResult withWindowReconciliation(WindowReconciliation window) {
        return new UnitResult(timestamp, site, unit, states, components, cycle, closure, reconciliation, metricsBasis,
                cycleRaw, Optional.of(window));
    }

    /** A record without reconciliation: every figure from the values as measured. */
    public UnitResult(Instant timestamp, String site, String unit, List<StateResult> states,
                      List<ComponentResult> components, CycleResult cycle, List<ClosureResult> closure) {
        this(timestamp, site, unit, states, components, cycle, closure, ReconciliationResult.notRun(),
                MetricsBasis.RAW, cycle);
    }
}
