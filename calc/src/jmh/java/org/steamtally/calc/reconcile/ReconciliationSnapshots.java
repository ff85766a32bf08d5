package org.steamtally.calc.reconcile;

import java.util.SplittableRandom;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/**
 * The two snapshots of the regenerative example that {@link ReconciliationBenchmark} and
 * {@link ReconciliationCpuTime} reconcile, built once here so that both measure the same inputs.
 *
 * @param unit   the example unit ({@link RegenerativeExample#unit})
 * @param noisy  every sensor off its consistent value by seeded uniform noise within ±0.5 of its
 *               standard uncertainty, so the global test passes
 * @param biased the noisy snapshot with TT-311 raised by 8 standard uncertainties (5 no longer fails the global test with the 26 redundancy degrees the duplicate transmitters bring), so the global
 *               test fails and TT-311 should be the first suspect
 */
record ReconciliationSnapshots(UnitDescription unit, Snapshot noisy, Snapshot biased) {

    /** The sensor that carries the gross error in {@link #biased}. */
    static final String BIASED_SENSOR = "TT-311";

    private static final long SEED = 20261201L;

    static ReconciliationSnapshots ofRegenerativeExample() {
        UnitDescription unit = RegenerativeExample.unit();
        double[] v = RegenerativeExample.consistentArray(unit);
        SplittableRandom random = new SplittableRandom(SEED);
        for (int i = 0; i < v.length; i++) {
            v[i] += random.nextDouble(-0.5, 0.5) * unit.sensors().get(i).standardUncertaintySi();
        }
        double[] b = v.clone();
        int t = RegenerativeExample.index(unit, BIASED_SENSOR);
        b[t] += 8.0 * unit.sensors().get(t).standardUncertaintySi();
        return new ReconciliationSnapshots(unit, RegenerativeExample.snapshot(unit, v),
                RegenerativeExample.snapshot(unit, b));
    }
}
