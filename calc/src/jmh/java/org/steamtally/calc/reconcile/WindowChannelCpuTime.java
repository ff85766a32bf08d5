package org.steamtally.calc.reconcile;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.Locale;
import org.steamtally.calc.cycle.Snapshot;

/**
 * What the daemon's window channel adds per snapshot: the CPU time of this thread for the
 * per-snapshot evaluation ({@link ReconcilingEvaluator#evaluate}, what {@code fullRecord} of
 * {@link ReconciliationBenchmark} measures) beside that of the 50-snapshot window mean
 * ({@link WindowMeanEvaluator#evaluate}: averaging plus a full evaluation of the mean), on the
 * snapshots of {@link ReconciliationBenchmark}; and, once, the cost of a start: compiling the window
 * (one evaluator) and filling it (docs/PERFORMANCE.md compares that with the window that compiled
 * one evaluator per sample count met). CPU time, since wall
 * clock on a shared machine measures the scheduler too. Ten rounds of 2000 calls, the first five as
 * warm-up.
 *
 * <p>{@code java -cp calc/target/benchmarks.jar org.steamtally.calc.reconcile.WindowChannelCpuTime}
 */
public final class WindowChannelCpuTime {

    private static final int WINDOW = 50;

    private WindowChannelCpuTime() {
    }

    public static void main(String[] args) {
        ReconciliationSnapshots snapshots = ReconciliationSnapshots.ofRegenerativeExample();
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        Snapshot noisy = snapshots.noisy();
        Snapshot biased = snapshots.biased();

        long s0 = mx.getCurrentThreadCpuTime();
        WindowMeanEvaluator window = WindowMeanEvaluator.compile("fernholm", snapshots.unit(), WINDOW);
        for (int k = 0; k < WINDOW; k++) {
            window.evaluate(k % 2 == 0 ? noisy : biased);
        }
        long s1 = mx.getCurrentThreadCpuTime();
        System.out.printf(Locale.ROOT, "start: compile and fill a %d-snapshot window %.1f ms CPU%n", WINDOW,
                (s1 - s0) / 1e6);

        ReconcilingEvaluator single = ReconcilingEvaluator.compile("fernholm", snapshots.unit());
        int calls = 2000;
        long sink = 0;
        for (int round = 0; round < 10; round++) {
            long c0 = mx.getCurrentThreadCpuTime();
            for (int k = 0; k < calls; k++) {
                sink += single.evaluate(k % 2 == 0 ? noisy : biased).closure().size();
            }
            long c1 = mx.getCurrentThreadCpuTime();
            for (int k = 0; k < calls; k++) {
                sink += window.evaluate(k % 2 == 0 ? noisy : biased).closure().size();
            }
            long c2 = mx.getCurrentThreadCpuTime();
            if (round >= 5) {
                System.out.printf(Locale.ROOT, "round %d: per snapshot %.1f µs, window mean %.1f µs CPU per snapshot%n",
                        round - 4, (c1 - c0) / 1e3 / calls, (c2 - c1) / 1e3 / calls);
            }
        }
        if (sink == 42) {
            System.out.println();
        }
    }
}
