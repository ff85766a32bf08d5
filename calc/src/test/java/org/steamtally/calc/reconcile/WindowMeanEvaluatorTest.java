package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/** The window mean is reconciled with the standard uncertainty of a mean, u/√n (GUM 4.2.3). */
class WindowMeanEvaluatorTest {

    private static final UnitDescription UNIT = RegenerativeExample.unit();

    private static ReconciledSensor sensor(UnitResult r, String id) {
        return r.reconciliation().sensors().stream().filter(s -> s.id().equals(id)).findFirst().orElseThrow();
    }

    private static Snapshot with(String id, double offset, Snapshot.SensorStatus status) {
        double[] v = RegenerativeExample.consistentArray(UNIT);
        int i = RegenerativeExample.index(UNIT, id);
        v[i] += offset;
        Snapshot.SensorStatus[] st = new Snapshot.SensorStatus[v.length];
        Arrays.fill(st, Snapshot.SensorStatus.GOOD);
        st[i] = status;
        return new Snapshot(RegenerativeExample.TS, UNIT.id(), v, st);
    }

    @Test
    void meanOfTheWindowIsReconciledWithTheUncertaintyOfAMean() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 4);
        double u = UNIT.sensors().get(RegenerativeExample.index(UNIT, "FT-101")).standardUncertaintySi();
        double truth = RegenerativeExample.consistentValues().get("FT-101");
        UnitResult r = null;
        // offsets +0.1, −0.1, +0.2, 0 kg/s: mean +0.05 kg/s (by hand)
        for (double d : new double[] {0.1, -0.1, 0.2, 0.0}) {
            r = w.evaluate(with("FT-101", d, Snapshot.SensorStatus.GOOD));
        }
        ReconciledSensor ft = sensor(r, "FT-101");
        assertAll(
                () -> assertEquals(truth + 0.05, ft.measured().getAsDouble(), 1e-12),
                () -> assertEquals(u / 2.0, ft.sigmaMeasured().getAsDouble(), 1e-15));
    }

    @Test
    void windowSlidesSoTheOldestSnapshotLeavesIt() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 2);
        double truth = RegenerativeExample.consistentValues().get("FT-101");
        w.evaluate(with("FT-101", 1.0, Snapshot.SensorStatus.GOOD));
        w.evaluate(with("FT-101", 0.2, Snapshot.SensorStatus.GOOD));
        UnitResult r = w.evaluate(with("FT-101", 0.4, Snapshot.SensorStatus.GOOD));
        assertEquals(truth + 0.3, sensor(r, "FT-101").measured().getAsDouble(), 1e-12);
    }

    @Test
    void sensorMissingFromPartOfTheWindowWidensTheUncertaintyToItsCount() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 4);
        double u = UNIT.sensors().get(RegenerativeExample.index(UNIT, "TT-101")).standardUncertaintySi();
        w.evaluate(with("FT-101", 0.0, Snapshot.SensorStatus.MISSING));
        w.evaluate(with("FT-101", 0.3, Snapshot.SensorStatus.GOOD));
        w.evaluate(with("FT-101", 0.0, Snapshot.SensorStatus.GOOD));
        UnitResult r = w.evaluate(with("FT-101", 0.0, Snapshot.SensorStatus.GOOD));
        double truth = RegenerativeExample.consistentValues().get("FT-101");
        assertAll(
                () -> assertEquals(truth + 0.1, sensor(r, "FT-101").measured().getAsDouble(), 1e-12),
                // three good readings of FT-101 set n_eff for every sensor: never narrower than it should be
                () -> assertEquals(u / Math.sqrt(3.0), sensor(r, "TT-101").sigmaMeasured().getAsDouble(), 1e-15));
    }

    @Test
    void sensorWithNoGoodValueInTheWindowKeepsItsStatus() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 3);
        UnitResult r = null;
        for (int k = 0; k < 3; k++) {
            r = w.evaluate(with("FT-421", 0.0, Snapshot.SensorStatus.STALE));
        }
        ReconciledSensor ft = sensor(r, "FT-421");
        assertAll(
                () -> assertEquals("excluded", ft.redundancy()),
                () -> assertFalse(ft.testValue().isPresent()));
    }

    @Test
    void biasTooSmallForOneSnapshotFailsTheTestOfTheWindowMean() {
        // 2σ on TT-311 (ρ ≈ 0.97): test value about 2 in one snapshot, up to 2 · √25 = 10 over 25
        double u = UNIT.sensors().get(RegenerativeExample.index(UNIT, "TT-311")).standardUncertaintySi();
        UnitResult single = ReconcilingEvaluator.compile("fernholm", UNIT)
                .evaluate(with("TT-311", 2.0 * u, Snapshot.SensorStatus.GOOD));
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 25);
        UnitResult mean = null;
        for (int k = 0; k < 25; k++) {
            mean = w.evaluate(with("TT-311", 2.0 * u, Snapshot.SensorStatus.GOOD));
        }
        double t1 = sensor(single, "TT-311").testValue().getAsDouble();
        double t25 = sensor(mean, "TT-311").testValue().getAsDouble();
        UnitResult m = mean;
        assertAll(
                () -> assertTrue(t1 < 2.2, "one snapshot: " + t1),
                // √25 = 5 if every uncertainty shrank; the declared constants (efficiencies, heating
                // value) keep theirs, so a little less
                () -> assertTrue(t25 > 4.0 * t1 && t25 <= 5.0 * t1 * (1 + 1e-9), t1 + " -> " + t25),
                () -> assertEquals("failed", m.reconciliation().status()),
                () -> assertEquals("TT-311", m.reconciliation().suspects().get(0).id()));
    }

    @Test
    void windowShorterThanOneSnapshotIsRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> WindowMeanEvaluator.compile("fernholm", UNIT, 0));
        assertEquals("window length must be at least 1 snapshot, was 0", e.getMessage());
    }

    @Test
    void snapshotOfAnotherUnitIsRefused() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 3);
        Snapshot other = Snapshot.allGood(RegenerativeExample.TS, "unit9", new double[] {1.0});
        assertTrue(assertThrows(IllegalArgumentException.class, () -> w.evaluate(other)).getMessage()
                .contains("snapshot of unit unit9 with 1 values"));
    }
}
