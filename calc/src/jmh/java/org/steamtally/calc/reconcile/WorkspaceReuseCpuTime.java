package org.steamtally.calc.reconcile;

import java.lang.management.ManagementFactory;
import java.util.Arrays;
import java.util.Locale;
import java.util.function.ToLongFunction;
import org.steamtally.calc.cycle.Snapshot;

/**
 * {@link WorkspaceReuseBenchmark} in this thread's CPU time and allocated bytes, for a machine
 * shared with other builds: baseline and reused in turn, in bursts of 200 calls, the order rotated
 * each round; prints the median burst of each and the median of the per-round ratio reused/baseline
 * (paired within a round, so less moved by the load than the medians). 60 rounds, the first 10
 * warm-up.
 *
 * <p>{@code java -cp calc/target/benchmarks.jar org.steamtally.calc.reconcile.WorkspaceReuseCpuTime}
 */
public final class WorkspaceReuseCpuTime {

    private static final int CALLS = 200;
    private static final int ROUNDS = 60;
    private static final int WARM_UP = 10;

    private WorkspaceReuseCpuTime() {
    }

    public static void main(String[] args) {
        ReconciliationSnapshots snapshots = ReconciliationSnapshots.ofRegenerativeExample();
        ReconcilerBaseline baseline = ReconcilerBaseline.compile(snapshots.unit());
        Reconciler reused = Reconciler.compile(snapshots.unit());
        @SuppressWarnings("unchecked")
        ToLongFunction<Snapshot>[] runs = new ToLongFunction[] {
            (ToLongFunction<Snapshot>) x -> baseline.reconcile(x).result().iterations(),
            (ToLongFunction<Snapshot>) x -> reused.reconcile(x).result().iterations()};
        for (Snapshot s : new Snapshot[] {snapshots.noisy(), snapshots.biased()}) {
            double[][][] m = measure(runs, s);
            double[] ratio = new double[ROUNDS - WARM_UP];
            for (int k = 0; k < ratio.length; k++) {
                ratio[k] = m[0][1][k] / m[0][0][k];
            }
            System.out.printf(Locale.ROOT, "%s: median µs CPU per reconciliation baseline %.1f reused %.1f;"
                            + " reused/baseline paired %.3f; bytes allocated per reconciliation baseline %.0f"
                            + " reused %.0f%n",
                    s == snapshots.noisy() ? "noisy, passes" : "gross error on TT-311",
                    median(m[0][0]), median(m[0][1]), median(ratio), median(m[1][0]), median(m[1][1]));
        }
    }

    /** [0] µs CPU and [1] bytes allocated per call, per run and measured round. */
    private static double[][][] measure(ToLongFunction<Snapshot>[] runs, Snapshot s) {
        com.sun.management.ThreadMXBean mx = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        long thread = Thread.currentThread().getId();
        double[][][] out = new double[2][runs.length][ROUNDS - WARM_UP];
        long sink = 0;
        for (int round = 0; round < ROUNDS; round++) {
            for (int i = 0; i < runs.length; i++) {
                int r = (i + round) % runs.length;
                long a0 = mx.getThreadAllocatedBytes(thread);
                long c0 = mx.getCurrentThreadCpuTime();
                for (int k = 0; k < CALLS; k++) {
                    sink += runs[r].applyAsLong(s);
                }
                long c1 = mx.getCurrentThreadCpuTime();
                long a1 = mx.getThreadAllocatedBytes(thread);
                if (round >= WARM_UP) {
                    out[0][r][round - WARM_UP] = (c1 - c0) / 1e3 / CALLS;
                    out[1][r][round - WARM_UP] = (a1 - a0) / (double) CALLS;
                }
            }
        }
        if (sink == 42) {
            System.out.println();
        }
        return out;
    }

    private static double median(double[] values) {
        double[] v = values.clone();
        Arrays.sort(v);
        return v[v.length / 2];
    }
}
