package org.steamtally.calc.reconcile;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Reconciliation of one snapshot of the regenerative example (deploy/examples/regenerative.yaml:
 * 36 sensors, 35 of them used by the balances, 5 declared constants, 16 flowing states, 17
 * balances, redundancy 4). Target: at most 1 ms per snapshot.
 *
 * <ul>
 *   <li>{@code reconcileNoisy}: every sensor off its consistent value by seeded noise within its
 *       uncertainty; the global test passes: one solve.</li>
 *   <li>{@code reconcileWithGrossError}: the same with an 8σ bias on TT-311; the global test fails,
 *       so serial elimination solves a second time.</li>
 *   <li>{@code fullRecord}: what {@code replay} does per snapshot: cycle model on the raw values,
 *       reconciliation, cycle model on the reconciled values.</li>
 *   <li>{@code cycleModelBaseline}: the cycle model alone, for comparison.</li>
 * </ul>
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class ReconciliationBenchmark {

    private Reconciler reconciler;
    private ReconcilingEvaluator evaluator;
    private CycleModel model;
    private Snapshot noisy;
    private Snapshot biased;

    @Setup
    public void setUp() {
        ReconciliationSnapshots snapshots = ReconciliationSnapshots.ofRegenerativeExample();
        UnitDescription unit = snapshots.unit();
        reconciler = Reconciler.compile(unit);
        evaluator = ReconcilingEvaluator.compile("fernholm", unit);
        model = CycleModel.compile("fernholm", unit);
        noisy = snapshots.noisy();
        biased = snapshots.biased();
        // A benchmark of the wrong path would measure nothing useful.
        require(reconciler.reconcile(noisy).result(), ReconciliationResult.PASSED);
        ReconciliationResult failed = reconciler.reconcile(biased).result();
        require(failed, ReconciliationResult.FAILED);
        String expected = ReconciliationSnapshots.BIASED_SENSOR;
        if (failed.suspects().isEmpty() || !failed.suspects().get(0).id().equals(expected)) {
            throw new IllegalStateException("expected " + expected + " as first suspect, got " + failed.suspects());
        }
    }

    private static void require(ReconciliationResult r, String status) {
        if (!r.status().equals(status)) {
            throw new IllegalStateException("expected " + status + ", got " + r.status() + " (chi2 " + r.chi2() + ")");
        }
    }

    @Benchmark
    public Reconciliation reconcileNoisy() {
        return reconciler.reconcile(noisy);
    }

    @Benchmark
    public Reconciliation reconcileWithGrossError() {
        return reconciler.reconcile(biased);
    }

    @Benchmark
    public UnitResult fullRecord() {
        return evaluator.evaluate(noisy);
    }

    @Benchmark
    public UnitResult cycleModelBaseline() {
        return model.evaluate(noisy);
    }
}
