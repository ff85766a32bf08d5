package org.steamtally.calc.reconcile;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.Arrays;
import java.util.Locale;
import java.util.function.ToLongFunction;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.SensorUncertainties;

/**
 * {@link ScaledUncertaintyBenchmark} in this thread's CPU time, for a machine shared with other
 * builds: the baseline and the new reconciliation run in turn, in short bursts (200 calls) so that
 * a change of load meets all of them alike, and the median burst of each is printed, with the median
 * of each round's ratio to the baseline (paired within a round, so less moved by the load of the
 * machine than the medians). 60 rounds; the first 10 are warm-up.
 *
 * <p>{@code java -cp calc/target/benchmarks.jar org.steamtally.calc.reconcile.ScaledUncertaintyCpuTime}
 */
public final class ScaledUncertaintyCpuTime {

    private static final int CALLS = 200;
    private static final int ROUNDS = 60;
    private static final int WARM_UP = 10;

    private ScaledUncertaintyCpuTime() {
    }

    public static void main(String[] args) {
        ReconciliationSnapshots snapshots = ReconciliationSnapshots.ofRegenerativeExample();
        ReconcilerBaseline baseline = ReconcilerBaseline.compile(snapshots.unit());
        Reconciler reconciler = Reconciler.compile(snapshots.unit());
        double[] declared = SensorUncertainties.declared(snapshots.unit().sensors());
        String[] names = {"baseline", "declared", "given uncertainties"};
        for (Snapshot s : new Snapshot[] {snapshots.noisy(), snapshots.biased()}) {
            @SuppressWarnings("unchecked")
            ToLongFunction<Snapshot>[] runs = new ToLongFunction[] {
                (ToLongFunction<Snapshot>) x -> baseline.reconcile(x).result().iterations(),
                (ToLongFunction<Snapshot>) x -> reconciler.reconcile(x).result().iterations(),
                (ToLongFunction<Snapshot>) x -> reconciler.reconcile(x, declared).result().iterations()};
            double[][] us = measure(runs, s);
            String label = s == snapshots.noisy() ? "noisy, passes" : "gross error on TT-311";
            StringBuilder line = new StringBuilder(label + ", median µs CPU per reconciliation:");
            for (int r = 0; r < runs.length; r++) {
                line.append(String.format(Locale.ROOT, "  %s %.1f", names[r], median(us[r])));
            }
            for (int r = 1; r < runs.length; r++) {
                double[] ratio = new double[us[r].length];
                for (int k = 0; k < ratio.length; k++) {
                    ratio[k] = us[r][k] / us[0][k];
                }
                line.append(String.format(Locale.ROOT, "; %s/baseline %.3f", names[r], median(ratio)));
            }
            System.out.println(line);
        }
    }

    private static double[][] measure(ToLongFunction<Snapshot>[] runs, Snapshot s) {
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        double[][] us = new double[runs.length][ROUNDS - WARM_UP];
        long sink = 0;
        for (int round = 0; round < ROUNDS; round++) {
            for (int i = 0; i < runs.length; i++) {
                // rotate the order, so that no one always follows the same other
                int r = (i + round) % runs.length;
                long c0 = mx.getCurrentThreadCpuTime();
                for (int k = 0; k < CALLS; k++) {
                    sink += runs[r].applyAsLong(s);
                }
                long c1 = mx.getCurrentThreadCpuTime();
                if (round >= WARM_UP) {
                    us[r][round - WARM_UP] = (c1 - c0) / 1e3 / CALLS;
                }
            }
        }
        if (sink == 42) {
            System.out.println();
        }
        return us;
    }

    private static double median(double[] values) {
        double[] v = values.clone();
        Arrays.sort(v);
        return v[v.length / 2];
    }
}
