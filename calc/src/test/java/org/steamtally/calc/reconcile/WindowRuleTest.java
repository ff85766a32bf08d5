package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/**
 * The window reconciles its mean only when the window is representative (VDI 2048-1 reconciles
 * means of steady, complete periods): snapshots consecutive, every balance sensor good over
 * (nearly) all of it. The counts in the expectations are worked by hand from {@link WindowRule}:
 * needed = ⌈0.9 · periods⌉.
 */
class WindowRuleTest {

    private static final UnitDescription UNIT = RegenerativeExample.unit();
    private static final Duration PERIOD = Duration.ofSeconds(1);
    private static final WindowRule RULE = WindowRule.of(PERIOD);

    /**
     * The consistent snapshot at second {@code k}, FT-101 offset and with the given status. Every
     * value moves by a few parts in 1e9 from one second to the next, as a new reading does; a value
     * repeated bit for bit is a held one (see {@link #heldReadingsCountOnceInTheUncertaintyOfTheMean}).
     */
    private static Snapshot at(int k, double offset, Snapshot.SensorStatus ft101) {
        double[] v = RegenerativeExample.consistentArray(UNIT);
        for (int j = 0; j < v.length; j++) {
            v[j] += 1e-9 * Math.abs(v[j]) * (k % 7 + 1);
        }
        int i = RegenerativeExample.index(UNIT, "FT-101");
        v[i] += offset;
        Snapshot.SensorStatus[] st = new Snapshot.SensorStatus[v.length];
        Arrays.fill(st, Snapshot.SensorStatus.GOOD);
        st[i] = ft101;
        return new Snapshot(RegenerativeExample.TS.plus(PERIOD.multipliedBy(k)), UNIT.id(), v, st);
    }

    private static Snapshot good(int k) {
        return at(k, 0.01 * (k % 3), Snapshot.SensorStatus.GOOD);
    }

    @Test
    void sensorStaleForHalfTheWindowWithholdsTheVerdictWithoutReconciling() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 10);
        for (int k = 0; k < 10; k++) {
            assertFalse(w.evaluate(good(k), RULE).isWithheld(), "snapshot " + k);
        }
        WindowVerdict last = null;
        for (int k = 10; k < 15; k++) {
            last = w.evaluate(at(k, 0.0, Snapshot.SensorStatus.STALE), RULE);
        }
        WindowVerdict v = last;
        assertAll(
                () -> assertTrue(v.isWithheld()),
                () -> assertEquals("good values in only part of the window's 10 periods, fewer than the 9 needed"
                        + " (90 %): FT-101 (5)", v.withheld().orElseThrow()),
                // 10 while filling and full, 1 more with FT-101 good in 9 of 10; none after
                () -> assertEquals(11, w.meansEvaluated()));
    }

    @Test
    void windowWithMissingPeriodsIsWithheld() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 10);
        for (int k = 0; k < 5; k++) {
            w.evaluate(good(k), RULE);
        }
        // seconds 5 to 9 never arrive (replaced in the collector's slot, or a stall)
        WindowVerdict v = w.evaluate(good(10), RULE);
        assertAll(
                () -> assertTrue(v.isWithheld()),
                // 6 held over 11 periods, 10 needed
                () -> assertEquals("the window's 6 snapshots span 11 periods of 1 s: 5 missing, at most 1 allowed"
                        + " (90 % of the span must be held)", v.withheld().orElseThrow()),
                () -> assertEquals(5, w.meansEvaluated()));
    }

    @Test
    void windowResumesOnceTheGapHasLeftIt() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 10);
        for (int k = 0; k < 5; k++) {
            w.evaluate(good(k), RULE);
        }
        // seconds 5 to 9 missing, consecutive again from second 10. At second 18 the window holds
        // 4 and 10..18: 15 periods, 14 needed, 10 held. At second 19 it holds 10..19: complete.
        int firstResumed = -1;
        for (int k = 10; k < 30 && firstResumed < 0; k++) {
            if (!w.evaluate(good(k), RULE).isWithheld()) {
                firstResumed = k;
            }
        }
        assertEquals(19, firstResumed);
    }

    @Test
    void windowResumesOnceTheSensorIsGoodInEnoughOfIt() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 10);
        for (int k = 0; k < 10; k++) {
            w.evaluate(good(k), RULE);
        }
        for (int k = 10; k < 15; k++) {
            w.evaluate(at(k, 0.0, Snapshot.SensorStatus.STALE), RULE);
        }
        // good again from second 15: the window holds the last 10, so the stale seconds 10..14 leave
        // it from second 20 on; at second 23 (window 14..23) one is left and FT-101 is good in 9 of 10
        int firstResumed = -1;
        for (int k = 15; k < 30 && firstResumed < 0; k++) {
            if (!w.evaluate(good(k), RULE).isWithheld()) {
                firstResumed = k;
            }
        }
        assertEquals(23, firstResumed);
    }

    @Test
    void fullConsecutiveWindowGivesTheSameResultAsWithoutTheRule() {
        WindowMeanEvaluator ruled = WindowMeanEvaluator.compile("fernholm", UNIT, 10);
        WindowMeanEvaluator plain = WindowMeanEvaluator.compile("fernholm", UNIT, 10);
        UnitResult a = null;
        UnitResult b = null;
        for (int k = 0; k < 15; k++) {
            // one stale snapshot of FT-101 is within the 10 % allowed
            Snapshot s = k == 12 ? at(k, 0.0, Snapshot.SensorStatus.STALE) : at(k, 0.05 * (k % 4), Snapshot.SensorStatus.GOOD);
            a = ruled.evaluate(s, RULE).result().orElseThrow();
            b = plain.evaluate(s);
        }
        UnitResult x = a;
        UnitResult y = b;
        ReconciledSensor fa = x.reconciliation().sensors().get(RegenerativeExample.index(UNIT, "FT-101"));
        ReconciledSensor fb = y.reconciliation().sensors().get(RegenerativeExample.index(UNIT, "FT-101"));
        assertAll(
                // the same arithmetic on the same values: exactly equal
                () -> assertEquals(y.reconciliation().chi2(), x.reconciliation().chi2(), 0.0),
                () -> assertEquals(y.reconciliation().status(), x.reconciliation().status()),
                () -> assertEquals(fb.reconciled(), fa.reconciled()),
                () -> assertEquals(fb.sigmaMeasured(), fa.sigmaMeasured()));
    }

    @Test
    void heldReadingsCountOnceInTheUncertaintyOfTheMean() {
        // FT-101 at second 0 and 1 the same reading (held), then a new one held again: 2 readings in 4
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 4);
        Snapshot a = at(0, 0.2, Snapshot.SensorStatus.GOOD);
        Snapshot b = at(2, -0.2, Snapshot.SensorStatus.GOOD);
        int ft = RegenerativeExample.index(UNIT, "FT-101");
        w.evaluate(a, RULE);
        w.evaluate(withValue(at(1, 0.0, Snapshot.SensorStatus.GOOD), ft, a.valuesSi()[ft]), RULE);
        w.evaluate(b, RULE);
        UnitResult r = w.evaluate(withValue(at(3, 0.0, Snapshot.SensorStatus.GOOD), ft, b.valuesSi()[ft]), RULE)
                .result().orElseThrow();
        UnitResult plain = WindowMeanEvaluator.compile("fernholm", UNIT, 4).evaluate(at(3, 0.0, Snapshot.SensorStatus.GOOD));
        double u = UNIT.sensors().get(RegenerativeExample.index(UNIT, "TT-101")).standardUncertaintySi();
        ReconciledSensor tt = r.reconciliation().sensors().get(RegenerativeExample.index(UNIT, "TT-101"));
        ReconciledSensor fm = r.reconciliation().sensors().get(ft);
        assertAll(
                // the mean is that of the four values as held (by hand: 0.2, 0.2, −0.2, −0.2 → 0)
                () -> assertEquals(RegenerativeExample.consistentValues().get("FT-101"), fm.measured().getAsDouble(),
                        1e-6),
                // n_eff 2, not 4: u/√2 for every sensor (GUM 4.2.3 with two readings)
                () -> assertEquals(u / Math.sqrt(2.0), tt.sigmaMeasured().getAsDouble(), 1e-15),
                () -> assertTrue(plain.reconciliation().sensors().get(ft).sigmaMeasured().isPresent()));
    }

    private static Snapshot withValue(Snapshot s, int index, double value) {
        double[] v = s.valuesSi().clone();
        v[index] = value;
        return new Snapshot(s.timestamp(), s.unitId(), v, s.status());
    }

    @Test
    void sensorOutForTheWholeWindowDoesNotWithholdTheVerdict() {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile("fernholm", UNIT, 5);
        WindowVerdict v = null;
        for (int k = 0; k < 8; k++) {
            v = w.evaluate(at(k, 0.0, Snapshot.SensorStatus.MISSING), RULE);
        }
        assertFalse(v.isWithheld(), () -> "withheld: " + w.meansEvaluated());
    }

    @Test
    void shareOutsideZeroToOneIsRefused() {
        assertAll(
                () -> assertEquals("the window's minimum good share must be above 0 and at most 1, was 0.0",
                        assertThrows(IllegalArgumentException.class, () -> new WindowRule(0.0, PERIOD)).getMessage()),
                () -> assertThrows(IllegalArgumentException.class, () -> new WindowRule(1.01, PERIOD)),
                () -> assertThrows(IllegalArgumentException.class, () -> new WindowRule(Double.NaN, PERIOD)),
                () -> assertEquals("snapshot period must be positive, was PT0S",
                        assertThrows(IllegalArgumentException.class, () -> new WindowRule(0.9, Duration.ZERO))
                                .getMessage()));
    }

    @Test
    void neededCountIsTheShareOfThePeriodsRoundedUp() {
        // by hand: 0.9 · 50 = 45, 0.9 · 55 = 49.5 → 50, 0.9 · 1 = 0.9 → 1
        assertAll(
                () -> assertEquals(45, RULE.needed(50)),
                () -> assertEquals(50, RULE.needed(55)),
                () -> assertEquals(1, RULE.needed(1)));
    }
}
