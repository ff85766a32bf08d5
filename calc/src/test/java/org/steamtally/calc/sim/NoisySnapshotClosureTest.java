package org.steamtally.calc.sim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.UnitResult;

/**
 * The simulator's noise and the cycle model's uncertainty propagation agree: with the declared
 * constants exact, every closure's z over many noisy snapshots has mean 0 and standard deviation 1.
 * The model's u(r) is first order; at noise of 0.1 % of the values the second-order terms are some
 * 1e-3 of it, far inside the tolerance.
 */
class NoisySnapshotClosureTest {

    /** Two-sided 99.9 % normal quantile (recalled from memory, printed in every normal table). */
    private static final double Z_999 = 3.29;

    @Test
    void closureZOfNoisySnapshotsIsStandardNormal() {
        int n = 3000;
        TruthModel truth = TruthModel.of(SimpleUnit.unit(true), SimpleUnit.design().build());
        Simulator sim = Simulator.builder(truth).seed(7L).build();
        CycleModel model = CycleModel.compile("fernholm", SimpleUnit.unit(true));
        Map<String, double[]> sums = new LinkedHashMap<>();
        sim.stream(Instant.parse("2026-12-02T00:00:00Z"), Duration.ofSeconds(1)).limit(n).forEach(x -> {
            UnitResult r = model.evaluate(x.snapshot());
            for (ClosureResult c : r.closure()) {
                double[] s = sums.computeIfAbsent(c.id(), k -> new double[3]);
                s[0]++;
                s[1] += c.z();
                s[2] += c.z() * c.z();
            }
        });
        assertEquals(4, sums.size(), sums.keySet().toString());
        // (n − 1) s² is χ² with n − 1 degrees of freedom; bounds by Wilson and Hilferty (1931).
        double a = 2.0 / (9.0 * (n - 1));
        double low = Math.pow(1 - a - Z_999 * Math.sqrt(a), 3);
        double high = Math.pow(1 - a + Z_999 * Math.sqrt(a), 3);
        sums.forEach((id, s) -> {
            assertEquals(n, s[0], 0.0, id + " reported in every snapshot");
            double mean = s[1] / n;
            double variance = (s[2] - n * mean * mean) / (n - 1);
            assertTrue(Math.abs(mean) < Z_999 / Math.sqrt(n), id + ": mean z " + mean);
            assertTrue(variance > low && variance < high, id + ": variance of z " + variance + ", bounds " + low + " to " + high);
        });
    }
}
