package org.steamtally.calc.reconcile;

import java.util.Arrays;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.TreeMap;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.SensorUncertainties;
import org.steamtally.calc.plant.UnitDescription;

/**
 * The frozen baseline and the reused reconciliation, one instance each, over many seeded snapshots
 * of the regenerative example: noise within ±1 u, then on some snapshots one or two sensors biased
 * by up to 30 u, a sensor stale, and the window's uncertainties (u/√20). Every result record and
 * array must be equal bit for bit; prints the count per status and suspect count, and exits 1 on
 * the first difference.
 *
 * <p>{@code java -cp calc/target/benchmarks.jar org.steamtally.calc.reconcile.WorkspaceReuseComparison [count]}
 */
public final class WorkspaceReuseComparison {

    private static final long SEED = 20261204L;

    private WorkspaceReuseComparison() {
    }

    public static void main(String[] args) {
        int count = args.length > 0 ? Integer.parseInt(args[0]) : 2000;
        UnitDescription unit = RegenerativeExample.unit();
        ReconcilerBaseline baseline = ReconcilerBaseline.compile(unit);
        Reconciler reused = Reconciler.compile(unit);
        double[] declared = SensorUncertainties.declared(unit.sensors());
        double[] window = declared.clone();
        for (int i = 0; i < window.length; i++) {
            window[i] /= Math.sqrt(20.0);
        }
        SplittableRandom random = new SplittableRandom(SEED);
        Map<String, Integer> outcomes = new TreeMap<>();
        for (int n = 0; n < count; n++) {
            boolean mean = random.nextInt(4) == 0;
            double[] sigma = mean ? window : declared;
            double[] v = RegenerativeExample.consistentArray(unit);
            for (int i = 0; i < v.length; i++) {
                v[i] += random.nextDouble(-1.0, 1.0) * sigma[i];
            }
            int biases = random.nextInt(3);
            for (int b = 0; b < biases; b++) {
                int i = random.nextInt(v.length);
                v[i] += random.nextDouble(-30.0, 30.0) * sigma[i];
            }
            Snapshot.SensorStatus[] status = new Snapshot.SensorStatus[v.length];
            Arrays.fill(status, Snapshot.SensorStatus.GOOD);
            if (random.nextInt(5) == 0) {
                status[random.nextInt(v.length)] = Snapshot.SensorStatus.STALE;
            }
            Snapshot s = new Snapshot(RegenerativeExample.TS.plusSeconds(n), unit.id(), v, status);
            Reconciliation expected = mean ? baseline.reconcile(s, sigma) : baseline.reconcile(s);
            Reconciliation actual = mean ? reused.reconcile(s, sigma) : reused.reconcile(s);
            ReconciliationResult e = expected.result();
            if (!e.equals(actual.result())
                    || !Arrays.equals(expected.reconciledValues().orElse(null), actual.reconciledValues().orElse(null))
                    || !Arrays.equals(expected.excludingSuspectsValues().orElse(null),
                            actual.excludingSuspectsValues().orElse(null))) {
                System.out.println("snapshot " + n + " differs:\n  baseline " + e + "\n  reused   " + actual.result());
                System.exit(1);
            }
            outcomes.merge(e.status() + ", " + e.suspects().size() + " suspects", 1, Integer::sum);
        }
        System.out.println(count + " snapshots, every record equal bit for bit: " + outcomes);
    }
}
