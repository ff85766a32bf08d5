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
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.SensorUncertainties;

/**
 * The reconciliation of {@link ReconciliationBenchmark}'s two snapshots by the frozen copy from
 * before its working arrays were reused ({@link ReconcilerBaseline}) and by the current one, in one
 * run: passing, 8σ gross error (serial elimination), and the gross error with the window channel's
 * path (uncertainties given, here the declared ones).
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class WorkspaceReuseBenchmark {

    private ReconcilerBaseline baseline;
    private Reconciler reused;
    private Snapshot noisy;
    private Snapshot biased;
    private double[] declared;

    @Setup
    public void setUp() {
        ReconciliationSnapshots snapshots = ReconciliationSnapshots.ofRegenerativeExample();
        baseline = ReconcilerBaseline.compile(snapshots.unit());
        reused = Reconciler.compile(snapshots.unit());
        noisy = snapshots.noisy();
        biased = snapshots.biased();
        declared = SensorUncertainties.declared(snapshots.unit().sensors());
        // Comparing times of different answers would mean nothing.
        for (Snapshot s : new Snapshot[] {noisy, biased}) {
            if (!baseline.reconcile(s).result().equals(reused.reconcile(s).result())) {
                throw new IllegalStateException("baseline and reused differ for " + s);
            }
        }
    }

    @Benchmark
    public Reconciliation baselineNoisy() {
        return baseline.reconcile(noisy);
    }

    @Benchmark
    public Reconciliation reusedNoisy() {
        return reused.reconcile(noisy);
    }

    @Benchmark
    public Reconciliation baselineGrossError() {
        return baseline.reconcile(biased);
    }

    @Benchmark
    public Reconciliation reusedGrossError() {
        return reused.reconcile(biased);
    }

    @Benchmark
    public Reconciliation baselineGrossErrorGivenUncertainties() {
        return baseline.reconcile(biased, declared);
    }

    @Benchmark
    public Reconciliation reusedGrossErrorGivenUncertainties() {
        return reused.reconcile(biased, declared);
    }
}
