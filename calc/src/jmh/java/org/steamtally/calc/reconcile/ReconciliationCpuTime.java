package org.steamtally.calc.reconcile;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.Locale;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.Snapshot;

/**
 * The CPU time of this thread per reconciliation of the snapshots of {@link ReconciliationBenchmark},
 * beside that of the cycle model: on a machine shared with other builds, wall-clock averages measure
 * the scheduler as much as the code, while a thread's CPU time does not count the time it waits.
 * Ten rounds of 2000 calls each, the first five as warm-up; prints one line per measured round.
 *
 * <p>{@code java -cp calc/target/benchmarks.jar org.steamtally.calc.reconcile.ReconciliationCpuTime}
 */
public final class ReconciliationCpuTime {

    private ReconciliationCpuTime() {
    }

    public static void main(String[] args) {
        ReconciliationSnapshots snapshots = ReconciliationSnapshots.ofRegenerativeExample();
        Reconciler reconciler = Reconciler.compile(snapshots.unit());
        CycleModel model = CycleModel.compile("fernholm", snapshots.unit());
        Snapshot noisy = snapshots.noisy();
        Snapshot biased = snapshots.biased();
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        int calls = 2000;
        long sink = 0;
        for (int round = 0; round < 10; round++) {
            long c0 = mx.getCurrentThreadCpuTime();
            for (int k = 0; k < calls; k++) {
                sink += reconciler.reconcile(noisy).result().iterations();
            }
            long c1 = mx.getCurrentThreadCpuTime();
            for (int k = 0; k < calls; k++) {
                sink += reconciler.reconcile(biased).result().suspects().size();
            }
            long c2 = mx.getCurrentThreadCpuTime();
            for (int k = 0; k < calls; k++) {
                sink += model.evaluate(noisy).closure().size();
            }
            long c3 = mx.getCurrentThreadCpuTime();
            if (round >= 5) {
                System.out.printf(Locale.ROOT,
                        "round %d: reconcile (passes) %.1f µs, reconcile (gross error) %.1f µs, cycle model %.1f µs"
                                + " CPU per snapshot%n",
                        round - 4, (c1 - c0) / 1e3 / calls, (c2 - c1) / 1e3 / calls, (c3 - c2) / 1e3 / calls);
            }
        }
        if (sink == 42) {
            System.out.println();
        }
    }
}
