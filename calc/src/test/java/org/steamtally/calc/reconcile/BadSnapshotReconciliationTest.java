package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledQuantity;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/** Stale, missing and implausible sensors lower the redundancy; nothing throws and nothing is NaN. */
class BadSnapshotReconciliationTest {

    private static final UnitDescription UNIT = RegenerativeExample.unit();

    private static Snapshot with(String sensorId, Snapshot.SensorStatus status, double value) {
        double[] v = RegenerativeExample.consistentArray(UNIT);
        Snapshot.SensorStatus[] s = new Snapshot.SensorStatus[v.length];
        Arrays.fill(s, Snapshot.SensorStatus.GOOD);
        int i = RegenerativeExample.index(UNIT, sensorId);
        v[i] = value;
        s[i] = status;
        return new Snapshot(RegenerativeExample.TS, UNIT.id(), v, s);
    }

    @Test
    void staleGeneratorPowerDropsItsBalanceAndItsDuplicatesCheck() {
        ReconciliationResult r = Reconciler.compile(UNIT).reconcile(with("JT-001", Snapshot.SensorStatus.STALE, 1.49e8))
                .result();
        ReconciledSensor p = ReconcilerLinearTest.byId(r).get("JT-001");
        assertAll(
                () -> assertEquals(ReconciliationResult.PASSED, r.status()),
                // 26 less the generator balance and the JT-001 = JT-001B pair: the duplicate no longer
                // has a value to be checked against
                () -> assertEquals(24, r.redundancy()),
                () -> assertEquals("excluded", p.redundancy()),
                () -> assertEquals("just_determined", ReconcilerLinearTest.byId(r).get("JT-001B").redundancy()),
                () -> assertTrue(p.measured().isEmpty()),
                () -> assertTrue(p.reconciled().isEmpty()));
    }

    @Test
    void missingTemperatureMakesTheStateEnthalpyUnmeasuredAndStillObservable() {
        ReconciliationResult r = Reconciler.compile(UNIT)
                .reconcile(with("TT-311", Snapshot.SensorStatus.MISSING, Double.NaN)).result();
        Map<String, ReconciledQuantity> q = ReconcilerLinearTest.unmeasured(r);
        ReconciledQuantity h = q.get("condensate_pumped.h_J_per_kg");
        assertAll(
                () -> assertEquals(ReconciliationResult.PASSED, r.status()),
                () -> assertEquals(25, r.redundancy()),
                () -> assertTrue(h.observable()),
                () -> assertTrue(h.sigmaReconciled().getAsDouble() > 0.0),
                // the pressure of that state now enters no energy balance; only its duplicate checks it,
                // and the two are checked against each other alone: r = 0.5 each
                () -> assertEquals(Math.sqrt(0.5) * UNIT.sensors().get(RegenerativeExample.index(UNIT, "PT-311"))
                        .standardUncertaintySi(), ReconcilerLinearTest.byId(r).get("PT-311").sigmaReconciled()
                        .getAsDouble(), 1e-6 * UNIT.sensors().get(RegenerativeExample.index(UNIT, "PT-311"))
                        .standardUncertaintySi()));
    }

    @Test
    void implausibleReadingIsExcludedLikeAStaleOne() {
        ReconciliationResult r = Reconciler.compile(UNIT).reconcile(with("FT-501", Snapshot.SensorStatus.GOOD, -3.0))
                .result();
        assertAll(
                () -> assertEquals("excluded", ReconcilerLinearTest.byId(r).get("FT-501").redundancy()),
                () -> assertEquals(25, r.redundancy()));
    }

    @Test
    void snapshotWithEverySensorMissingGivesARecordWithoutNaN() {
        double[] v = new double[UNIT.sensors().size()];
        Arrays.fill(v, Double.NaN);
        Snapshot.SensorStatus[] s = new Snapshot.SensorStatus[v.length];
        Arrays.fill(s, Snapshot.SensorStatus.MISSING);
        Snapshot snapshot = new Snapshot(RegenerativeExample.TS, UNIT.id(), v, s);
        UnitResult result = ReconcilingEvaluator.compile("fernholm", UNIT).evaluate(snapshot);
        ReconciliationResult r = result.reconciliation();
        assertAll(
                () -> assertTrue(!r.passed()),
                () -> assertEquals(0, r.redundancy()),
                () -> assertTrue(Double.isFinite(r.chi2())),
                () -> assertEquals("raw", result.metricsBasis().label()));
        for (ReconciledQuantity q : r.unmeasured()) {
            assertTrue(q.reconciled().isEmpty() || Double.isFinite(q.reconciled().getAsDouble()), q.id());
        }
    }
}
