package org.steamtally.calc.reconcile;

import java.lang.management.ManagementFactory;
import java.lang.management.MemoryMXBean;
import java.lang.management.ThreadMXBean;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.UnitDescription;

/**
 * What a unit's window channel costs at a start, before and after the window kept one compiled
 * evaluator: the CPU time of this thread to compile a 50-snapshot window and fill it (50 snapshots,
 * the noisy and biased ones of {@link ReconciliationBenchmark} in turn), for
 * {@link WindowMeanEvaluatorBaseline} (one compilation per n_eff met, 1 to 50) and
 * {@link WindowMeanEvaluator} (one compilation) alternately, as a daemon starting many units does.
 * The median of the rounds after the first is the cost of each further unit, with the median of each
 * round's saving and ratio (paired within a round, so less moved by the load of a shared machine
 * than the two medians). CPU time, since wall clock on a shared machine measures the scheduler too.
 * Then the heap that ten full windows of each kind hold, after a full collection (approximate: what
 * {@link MemoryMXBean} reports).
 *
 * <p>The first round runs cold (class loading, interpreter, JIT), and in one JVM the first of the two
 * pays that for both; the argument {@code before} or {@code after} runs only that one, for its cold
 * first start in a JVM of its own.
 *
 * <p>{@code java -cp calc/target/benchmarks.jar org.steamtally.calc.reconcile.WindowStartCpuTime [before|after]}
 */
public final class WindowStartCpuTime {

    private static final int WINDOW = 50;
    private static final int ROUNDS = 21;
    private static final int HELD = 10;

    private WindowStartCpuTime() {
    }

    public static void main(String[] args) {
        String only = args.length > 0 ? args[0] : "both";
        if (!only.equals("both") && !only.equals("before") && !only.equals("after")) {
            throw new IllegalArgumentException("argument must be before, after or nothing, was " + only);
        }
        ReconciliationSnapshots snapshots = ReconciliationSnapshots.ofRegenerativeExample();
        UnitDescription unit = snapshots.unit();
        Snapshot[] inputs = {snapshots.noisy(), snapshots.biased()};
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        double[] before = new double[ROUNDS];
        double[] after = new double[ROUNDS];
        long sink = 0;
        for (int round = 0; round < ROUNDS; round++) {
            // alternate which goes first, so neither always runs on the other's warmed caches
            for (int pass = 0; pass < 2; pass++) {
                boolean baseline = (round + pass) % 2 == 0;
                if (only.equals(baseline ? "after" : "before")) {
                    continue;
                }
                long c0 = mx.getCurrentThreadCpuTime();
                if (baseline) {
                    WindowMeanEvaluatorBaseline w = WindowMeanEvaluatorBaseline.compile("fernholm", unit, WINDOW);
                    for (int k = 0; k < WINDOW; k++) {
                        sink += w.evaluate(inputs[k % 2]).closure().size();
                    }
                } else {
                    WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", unit, WINDOW);
                    for (int k = 0; k < WINDOW; k++) {
                        sink += w.evaluate(inputs[k % 2]).closure().size();
                    }
                }
                double ms = (mx.getCurrentThreadCpuTime() - c0) / 1e6;
                (baseline ? before : after)[round] = ms;
            }
        }
        System.out.printf(Locale.ROOT, "start of one unit (compile and fill a %d-snapshot window), ms CPU%n", WINDOW);
        if (!only.equals("both")) {
            double[] rounds = only.equals("before") ? before : after;
            System.out.printf(Locale.ROOT, "  %s alone: first (cold) %.1f, median of next %d %.1f%n", only, rounds[0],
                    ROUNDS - 1, median(rounds));
            return;
        }
        System.out.printf(Locale.ROOT, "  first (cold, the first of the two pays for both): before %7.1f   after %7.1f%n",
                before[0], after[0]);
        double[] saved = new double[ROUNDS];
        double[] ratio = new double[ROUNDS];
        for (int r = 0; r < ROUNDS; r++) {
            saved[r] = before[r] - after[r];
            ratio[r] = after[r] / before[r];
        }
        System.out.printf(Locale.ROOT, "  median of next %d:   before %7.1f   after %7.1f   (paired in each round:"
                + " saved %.1f ms, after/before %.2f)%n", ROUNDS - 1, median(before), median(after), median(saved),
                median(ratio));

        long c0 = mx.getCurrentThreadCpuTime();
        for (int k = 0; k < 10; k++) {
            sink += ReconcilingEvaluator.compile("fernholm", unit).balancesOf("TT-311").size();
        }
        System.out.printf(Locale.ROOT, "one compilation of an evaluator: %.1f ms CPU (mean of 10, warm)%n",
                (mx.getCurrentThreadCpuTime() - c0) / 1e6 / 10);

        MemoryMXBean memory = ManagementFactory.getMemoryMXBean();
        List<Object> held = new ArrayList<>();
        long m0 = usedAfterGc(memory);
        for (int u = 0; u < HELD; u++) {
            WindowMeanEvaluatorBaseline w = WindowMeanEvaluatorBaseline.compile("fernholm", unit, WINDOW);
            for (int k = 0; k < WINDOW + 3; k++) {
                // a full window holds the evaluator of n_eff = 50 and, from the fill, that of 49
                w.evaluate(inputs[k % 2]);
            }
            held.add(w);
        }
        long m1 = usedAfterGc(memory);
        held.clear();
        long m2 = usedAfterGc(memory);
        for (int u = 0; u < HELD; u++) {
            WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", unit, WINDOW);
            for (int k = 0; k < WINDOW + 3; k++) {
                w.evaluate(inputs[k % 2]);
            }
            held.add(w);
        }
        long m3 = usedAfterGc(memory);
        System.out.printf(Locale.ROOT, "heap held per full window: before %.0f kB, after %.0f kB (%d windows, after GC)%n",
                (m1 - m0) / 1024.0 / HELD, (m3 - m2) / 1024.0 / HELD, held.size());
        if (sink == 42) {
            System.out.println();
        }
    }

    private static double median(double[] rounds) {
        double[] warm = Arrays.copyOfRange(rounds, 1, rounds.length);
        Arrays.sort(warm);
        return warm[warm.length / 2];
    }

    private static long usedAfterGc(MemoryMXBean memory) {
        for (int k = 0; k < 3; k++) {
            System.gc();
        }
        return memory.getHeapMemoryUsage().getUsed();
    }
}
