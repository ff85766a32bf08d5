package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Suspect;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Gross errors on the regenerative example (deploy/examples/regenerative.yaml), whose balances hold
 * exactly at {@link RegenerativeExample#consistentValues}: a bias is added to one sensor and the
 * reconciliation must name it.
 */
class GrossErrorIdentificationTest {

    private static final UnitDescription UNIT = RegenerativeExample.unit();
    private static final Reconciler RECONCILER = Reconciler.compile(UNIT);

    private static ReconciliationResult withBias(String sensorId, double sigmas) {
        double[] v = RegenerativeExample.consistentArray(UNIT);
        int i = RegenerativeExample.index(UNIT, sensorId);
        v[i] += sigmas * UNIT.sensors().get(i).standardUncertaintySi();
        return RECONCILER.reconcile(RegenerativeExample.snapshot(UNIT, v)).result();
    }

    @Test
    void consistentOperatingPointPassesWithNothingAdjusted() {
        ReconciliationResult r = withBias("TT-101", 0.0);
        assertAll(
                () -> assertEquals(ReconciliationResult.PASSED, r.status()),
                // generator, cooling water, fuel, two motors and the feedwater meter check the
                // balances (the cooling water's check is spent on the wet exhaust's enthalpy): 5;
                // each of the 21 duplicate transmitters adds one
                () -> assertEquals(5 + 21, r.redundancy()),
                // NIST/SEMATECH e-Handbook 1.3.6.7.4: 38.885 for 26 degrees of freedom at 95 %
                () -> assertEquals(38.885, r.chi2Limit().getAsDouble(), 0.0005),
                () -> assertTrue(r.chi2() < 1e-12, "chi2 " + r.chi2()),
                () -> assertTrue(r.suspects().isEmpty()),
                () -> assertTrue(r.iterations() <= 6, "iterations " + r.iterations()));
        for (ReconciledSensor s : r.sensors()) {
            assertEquals(s.measured().getAsDouble(), s.reconciled().getAsDouble(), 1e-6 * s.sigmaMeasured().getAsDouble(),
                    s.id());
        }
    }

    @Test
    void exhaustPressureCannotBeCheckedAndIsLeftAsMeasured() {
        Map<String, ReconciledSensor> s = ReconcilerLinearTest.byId(withBias("TT-101", 0.0));
        ReconciledSensor p = s.get("PT-301");
        assertAll(
                () -> assertEquals("just_determined", p.redundancy()),
                () -> assertTrue(p.testValue().isEmpty()),
                () -> assertEquals(p.sigmaMeasured().getAsDouble(), p.sigmaReconciled().getAsDouble(), 1e-12),
                () -> assertEquals("redundant", s.get("TT-311").redundancy()),
                // declared constants take part as quasi-measurements
                () -> assertEquals("constant", s.get("generator.efficiency").kind()),
                // the feedwater meter is the feedwater's check flow: the balances check it
                () -> assertEquals("redundant", s.get("FT-421").redundancy()));
    }

    /**
     * Sensors whose adjustment the balances check strongly enough for a 9σ bias to fail the global
     * test: with the others exact, χ² = (ρ k)², ρ the checked share, against 38.885 at 26 degrees;
     * ρ is 0.75 for the flow meters, so 9σ (χ² 45.6) and not less.
     */
    @ParameterizedTest
    @CsvSource({"TT-311, 9.0", "TT-311, -9.0", "TT-411, 9.0", "FT-421, 9.0", "FT-101, -9.0"})
    void grossBiasOnARedundantSensorIsNamedFirstAndConfirmed(String sensor, double sigmas) {
        ReconciliationResult r = withBias(sensor, sigmas);
        Suspect first = r.suspects().get(0);
        double u = UNIT.sensors().get(RegenerativeExample.index(UNIT, sensor)).standardUncertaintySi();
        assertAll(
                () -> assertEquals(ReconciliationResult.FAILED, r.status()),
                () -> assertEquals(sensor, first.id()),
                () -> assertTrue(first.confirmed()),
                () -> assertTrue(first.testValue() > r.testLimit()),
                // the others are exact, so the estimate from them recovers the bias to linearisation error
                () -> assertEquals(sigmas * u, first.bias().getAsDouble(), 0.01 * u),
                () -> assertTrue(ReconcilerLinearTest.byId(r).get(sensor).suspect()));
    }

    @Test
    void coolingWaterTemperaturesThatOnlyTheCondenserBalanceSeesComeOutAsOneEquivalenceSet() {
        // checked share 0.54: 14σ gives χ² = (0.54 · 14)² = 57 against 38.885
        ReconciliationResult r = withBias("TT-502", 14.0);
        Suspect first = r.suspects().get(0);
        assertAll(
                () -> assertEquals(ReconciliationResult.FAILED, r.status()),
                () -> assertTrue(first.equivalenceSet().contains("TT-501"), first.equivalenceSet().toString()),
                () -> assertTrue(first.equivalenceSet().contains("TT-502"), first.equivalenceSet().toString()),
                () -> assertTrue(first.equivalenceSet().contains("FT-501"), first.equivalenceSet().toString()),
                () -> assertTrue(first.confirmed()));
    }

    @Test
    void moderateBiasInOneSnapshotDoesNotFailTheGlobalTestEvenOnAPairedSensor() {
        // JT-001 and its duplicate JT-001B: P_ii ≈ 0.5 each, so 5σ moves χ² by about 12.5, below 38.885
        ReconciliationResult r = withBias("JT-001", 5.0);
        assertAll(
                () -> assertEquals(ReconciliationResult.PASSED, r.status()),
                () -> assertTrue(r.suspects().isEmpty()));
    }

    /**
     * The balances alone see almost nothing of the main-steam pressure (checked share below 0.01,
     * docs/DETECTION.md); its duplicate PT-101B checks the pair's difference, but which of the two is
     * off only the balances could say: the pair comes out as one equivalence set, whichever is biased.
     */
    @ParameterizedTest
    @CsvSource({"PT-101", "PT-101B"})
    void biasOnAWeaklyCoupledPairIsReportedAsTheEquivalenceSetOfBoth(String sensor) {
        // P_ii ≈ 0.5: 10σ gives χ² ≈ 50 against 38.885
        ReconciliationResult r = withBias(sensor, 10.0);
        Suspect first = r.suspects().get(0);
        assertAll(
                () -> assertEquals(ReconciliationResult.FAILED, r.status()),
                () -> assertEquals(java.util.Set.of("PT-101", "PT-101B"), java.util.Set.copyOf(first.equivalenceSet())),
                () -> assertTrue(first.confirmed()));
    }
}
