package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Suspect;

/**
 * A duplicate transmitter is a second measurement of its primary's quantity. On the flow network of
 * {@link ReconcilerLinearTest} with only the main-steam flow metered, the balances leave the flows
 * without redundancy; a second main-steam meter adds the one constraint x₁ − x₂ = 0, whose weighted
 * least-squares solution is the weighted mean (VDI 2048-1; worked by hand below): x̂ = (x₁/u₁² +
 * x₂/u₂²) / (1/u₁² + 1/u₂²), χ² = (x₁ − x₂)² / (u₁² + u₂²), redundancy numbers r_i = u_i² / (u₁² + u₂²).
 */
class DuplicateTransmitterTest {

    private static SmallUnit withSecondMeter(double second) {
        return ReconcilerLinearTest.network(false).duplicate("m_msB", "m_ms", second, 1.0);
    }

    @Test
    void aSecondMeterIsReconciledWithItsPrimaryToTheirWeightedMean() {
        // u(m_ms) = 1.0 kg/s (ReconcilerLinearTest.S_MS), u(m_msB) = 1.0 kg/s; readings 100.0 and 101.2
        SmallUnit u = withSecondMeter(101.2);
        ReconciliationResult r = Reconciler.compile(u.unit()).reconcile(u.snapshot()).result();
        Map<String, ReconciledSensor> s = ReconcilerLinearTest.byId(r);
        double mean = (100.0 + 101.2) / 2;
        assertAll(
                () -> assertEquals(ReconciliationResult.PASSED, r.status()),
                () -> assertEquals(1, r.redundancy()),
                () -> assertEquals(1.2 * 1.2 / 2.0, r.chi2(), 1e-9),
                () -> assertEquals(mean, s.get("m_ms").reconciled().getAsDouble(), 1e-9),
                () -> assertEquals(mean, s.get("m_msB").reconciled().getAsDouble(), 1e-9),
                // u(x̂) = u/√2; the test value |v|/σ(v) = 0.6 / (1 · √0.5)
                () -> assertEquals(Math.sqrt(0.5), s.get("m_ms").sigmaReconciled().getAsDouble(), 1e-9),
                () -> assertEquals(0.6 / Math.sqrt(0.5), s.get("m_msB").testValue().getAsDouble(), 1e-9),
                () -> assertEquals("redundant", s.get("m_msB").redundancy()));
    }

    @Test
    void aBiasedSecondMeterIsReportedWithItsPrimaryAsOneEquivalenceSet() {
        SmallUnit u = withSecondMeter(110.0);
        ReconciliationResult r = Reconciler.compile(u.unit()).reconcile(u.snapshot()).result();
        assertEquals(ReconciliationResult.FAILED, r.status());
        Suspect first = r.suspects().get(0);
        assertEquals(Set.of("m_ms", "m_msB"), Set.copyOf(first.equivalenceSet()));
    }

    @Test
    void theSecondMetersBalanceIsListedAmongTheBalancesItEnters() {
        Reconciler rec = Reconciler.compile(withSecondMeter(100.0).unit());
        assertEquals(List.of("same measurand m_ms = m_msB"), rec.balancesOf("m_msB"));
        assertTrue(rec.balancesOf("m_ms").contains("same measurand m_ms = m_msB"));
    }

    @Test
    void theMinimumDetectableBiasOfAPairFollowsBaardasFormula() {
        // r = 0.5 for each of two equal meters; δ₀(α 0.05, β 0.2) = 1.960 + 0.842 = 2.802 (normal quantiles,
        // NIST/SEMATECH e-Handbook table; recalled from memory); MDB = u δ₀ / √r = 1.0 · 2.802 / √0.5 = 3.96 kg/s
        SmallUnit u = withSecondMeter(100.0);
        Reliability.SensorReliability m = Reliability.of(u.unit(), u.values()).stream()
                .filter(x -> x.id().equals("m_msB")).findFirst().orElseThrow();
        assertAll(
                () -> assertEquals(2.802, Reliability.DELTA0_SNAPSHOT, 5e-4),
                // the window suspect limit 4.0 plus z(0.95) = 1.645 (normal quantile, recalled from memory; docs/DETECTION.md)
                () -> assertEquals(5.645, Reliability.DELTA0_WINDOW, 5e-4),
                () -> assertEquals(0.5, m.redundancyNumber(), 1e-9),
                () -> assertEquals(0.5, m.windowRedundancy(), 1e-9),
                () -> assertEquals(2.802 / Math.sqrt(0.5), m.mdbSnapshotSi(), 1e-3),
                // a mean of 50: u/√50 δ₀,window / √r = 5.645 / √25 = 1.129 kg/s
                () -> assertEquals(5.645 / Math.sqrt(25.0), m.mdbWindowSi(), 1e-3),
                () -> assertTrue(m.checkedAtTargetWithinWindow()));
    }

    @Test
    void aSensorTheBalancesCannotCheckHasNoFiniteDetectableBias() {
        SmallUnit u = ReconcilerLinearTest.network(false);
        Reliability.SensorReliability m = Reliability.of(u.unit(), u.values()).stream()
                .filter(x -> x.id().equals("m_ms")).findFirst().orElseThrow();
        assertAll(
                () -> assertEquals(0.0, m.redundancyNumber()),
                () -> assertEquals(Double.POSITIVE_INFINITY, m.mdbSnapshotSi()),
                () -> assertFalse(m.checkedAtTargetWithinWindow()));
    }

    @Test
    void baardasDelta0IsTheSumOfTheTwoNormalQuantiles() {
        // α = 0.001, β = 0.2: 3.29 + 0.84 = 4.13, Baarda's classic value (recalled from memory)
        assertEquals(4.13, Reliability.delta0(0.001, 0.2), 0.005);
        assertThrows(IllegalArgumentException.class, () -> Reliability.delta0(0.0, 0.2));
        assertThrows(IllegalArgumentException.class, () -> Reliability.minimumDetectableBias(1.0, 1.5, 1, 2.8));
    }
}
