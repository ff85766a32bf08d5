package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/**
 * With unbiased normal noise of exactly the declared uncertainties on the consistent operating
 * point of the regenerative example, χ² follows the χ² distribution with the redundancy degree as
 * its degrees of freedom (VDI 2048-1; for linearised constraints a property of the weighted least
 * squares): its mean is the redundancy (here less the share of the declared constants, which are not
 * drawn), and the global test at 95 % rejects at most about 5 % of snapshots.
 * Seeded, so the outcome is fixed; the bounds are about four standard errors of the estimates.
 */
class GlobalTestCalibrationTest {

    private static final long SEED = 20261202L;
    private static final int SNAPSHOTS = 400;

    @Test
    void chiSquareOfUnbiasedNoiseHasTheRedundancyAsMeanAndFailsAboutFivePerCent() {
        UnitDescription unit = RegenerativeExample.unit();
        Reconciler reconciler = Reconciler.compile(unit);
        double[] truth = RegenerativeExample.consistentArray(unit);
        Random random = new Random(SEED);
        double sum = 0.0;
        int failed = 0;
        int redundancy = -1;
        int individualOver = 0;
        int individualCount = 0;
        for (int n = 0; n < SNAPSHOTS; n++) {
            double[] v = truth.clone();
            for (int i = 0; i < v.length; i++) {
                v[i] += random.nextGaussian() * unit.sensors().get(i).standardUncertaintySi();
            }
            ReconciliationResult r = reconciler.reconcile(RegenerativeExample.snapshot(unit, v)).result();
            redundancy = r.redundancy();
            sum += r.chi2();
            failed += r.status().equals(ReconciliationResult.FAILED) ? 1 : 0;
            for (ReconciledSensor s : r.sensors()) {
                // the constants are not drawn here, so only sensors follow the assumed distribution
                if (s.kind().equals("sensor") && s.id().equals("TT-311")) {
                    individualCount++;
                    individualOver += s.testValue().getAsDouble() > r.testLimit() ? 1 : 0;
                }
            }
        }
        // The constants are held at their declared values, not drawn, so their share of χ² is
        // missing: E[χ²] = Σ P_ii over the drawn sensors only (P_ii = 1 − (u(x̂)/u)², from the
        // reconciliation of the exact values), which is the redundancy less the constants' P_ii.
        double expected = 0.0;
        for (ReconciledSensor s : reconciler.reconcile(RegenerativeExample.snapshot(unit, truth)).result().sensors()) {
            if (s.kind().equals("sensor")) {
                double ratio = s.sigmaReconciled().getAsDouble() / s.sigmaMeasured().getAsDouble();
                expected += 1.0 - ratio * ratio;
            }
        }
        double mean = sum / SNAPSHOTS;
        double expectedMean = expected;
        double failedShare = (double) failed / SNAPSHOTS;
        double individualShare = (double) individualOver / individualCount;
        int dof = redundancy;
        String seed = " (seed " + SEED + ")";
        assertAll(
                // 5 from the balances' independent measurements, one per duplicate transmitter (21)
                () -> assertEquals(26, dof),
                // standard error of the mean over 400 draws about √(2·25.2/400) = 0.35
                () -> assertEquals(expectedMean, mean, 1.4, "mean chi2" + seed),
                () -> assertTrue(expectedMean > 25.0 && expectedMean < 26.0, "expected mean " + expectedMean),
                // binomial standard error at 5 %: √(0.05·0.95/400) = 0.011
                () -> assertTrue(failedShare < 0.05 + 0.045, "share failed " + failedShare + seed),
                () -> assertTrue(individualShare < 0.05 + 0.045, "share of TT-311 over 1.96: " + individualShare + seed));
    }
}
