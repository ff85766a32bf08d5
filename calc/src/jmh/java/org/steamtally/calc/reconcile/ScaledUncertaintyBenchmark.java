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
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.SensorUncertainties;

/**
 * The per-snapshot reconciliation before and after the sensors' uncertainties became an argument
 * of the evaluation, side by side in one run, on the snapshots of {@link ReconciliationBenchmark}
 * (regenerative example, 57 sensors):
 *
 * <ul>
 *   <li>{@code baseline*}: {@link ReconcilerBaseline}, the code as it was, uncertainties read from
 *       the compiled sensors;</li>
 *   <li>{@code declared*}: {@link Reconciler#reconcile(Snapshot)}, the per-snapshot channel now;</li>
 *   <li>{@code givenUncertainties*}: {@link Reconciler#reconcile(Snapshot, double[])} with the
 *       declared uncertainties (a scale of 1), the window channel's path with its check and copy of
 *       the array.</li>
 * </ul>
 * {@code NoisyPasses}: one solve; {@code GrossError}: the global test fails and serial elimination
 * solves again.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 5, time = 1)
@Measurement(iterations = 10, time = 1)
@Fork(1)
public class ScaledUncertaintyBenchmark {

    private ReconcilerBaseline baseline;
    private Reconciler reconciler;
    private double[] declared;
    private Snapshot noisy;
    private Snapshot biased;

    @Setup
    public void setUp() {
        ReconciliationSnapshots snapshots = ReconciliationSnapshots.ofRegenerativeExample();
        baseline = ReconcilerBaseline.compile(snapshots.unit());
        reconciler = Reconciler.compile(snapshots.unit());
        declared = SensorUncertainties.declared(snapshots.unit().sensors());
        noisy = snapshots.noisy();
        biased = snapshots.biased();
        // the two must give the same record, or the comparison compares different work
        for (Snapshot s : new Snapshot[] {noisy, biased}) {
            ReconciliationResult before = baseline.reconcile(s).result();
            if (!before.equals(reconciler.reconcile(s).result())
                    || !before.equals(reconciler.reconcile(s, declared).result())) {
                throw new IllegalStateException("baseline and new reconciliation differ on " + before.status());
            }
        }
        if (!reconciler.reconcile(biased).result().status().equals(ReconciliationResult.FAILED)) {
            throw new IllegalStateException("the biased snapshot should fail the global test");
        }
    }

    @Benchmark
    public Reconciliation baselineNoisyPasses() {
        return baseline.reconcile(noisy);
    }

    @Benchmark
    public Reconciliation declaredNoisyPasses() {
        return reconciler.reconcile(noisy);
    }

    @Benchmark
    public Reconciliation givenUncertaintiesNoisyPasses() {
        return reconciler.reconcile(noisy, declared);
    }

    @Benchmark
    public Reconciliation baselineGrossError() {
        return baseline.reconcile(biased);
    }

    @Benchmark
    public Reconciliation declaredGrossError() {
        return reconciler.reconcile(biased);
    }

    @Benchmark
    public Reconciliation givenUncertaintiesGrossError() {
        return reconciler.reconcile(biased, declared);
    }
}
