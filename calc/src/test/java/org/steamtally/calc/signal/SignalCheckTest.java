package org.steamtally.calc.signal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Random;

import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

class SignalCheckTest {

    static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");

    /** One temperature sensor, u = 1 K; the check's time is the snapshots' timestamps. */
    static UnitDescription oneSensor() {
        Sensor t = new Sensor("TT-1", Quantity.TEMPERATURE, "K", 1.0, UncertaintyBasis.STANDARD, 200.0, 1000.0,
                Duration.ofSeconds(10), Optional.empty());
        return new UnitDescription("u1", "u1", List.of(t), List.of(), List.of(), DeadState.STANDARD);
    }

    static SensorSignal feed(SignalCheck check, long second, double value) {
        return check.check(Snapshot.allGood(T0.plusSeconds(second), "u1", new double[] {value})).sensors().get(0);
    }

    @Test
    void scatterRatioOfASmallSeriesIsTheHandComputedMeanSquareSuccessiveDifferenceOverTheExpectedOne() {
        // Window of 5 readings, declared noise σ = 1 K, so the expected mean square successive
        // difference is 2σ² = 2 K². Series 400, 401, 403, 402, 402.5: differences 1, 2, −1, 0.5,
        // squares 1, 4, 1, 0.25, sum 6.25, mean over the 4 differences 1.5625 K², ratio 1.5625/2 = 0.78125.
        // The learning time constant of 1e9 readings keeps the expected value at 2 K² to 1e-8.
        SignalSettings settings = SignalSettings.DEFAULTS.withWindow(5).withDeclaredNoise(Map.of("TT-1", 1.0))
                .withLearning(1_000_000_000);
        SignalCheck check = new SignalCheck(oneSensor(), settings, 60.0, 1.0);
        double[] series = {400.0, 401.0, 403.0, 402.0, 402.5};
        SensorSignal s = null;
        for (int i = 0; i < series.length; i++) {
            s = feed(check, i, series[i]);
            if (i < series.length - 1) {
                // fewer than n readings: the window is not full, the test does not decide
                assertEquals(SignalVerdict.NOT_DECIDED, s.scatter());
                assertEquals(0.0, s.scatterRatio());
            }
        }
        assertEquals(0.78125, s.scatterRatio(), 1e-8, "hand computation above; the learning moves it by < 1e-8");
        assertEquals(SignalVerdict.PASS, s.scatter());
        assertEquals(2.0, s.expectedMssdSi2(), 1e-8, "2σ²");
        // The sixth reading pushes the first difference out: differences 2, −1, 0.5, 7.5 (cut to
        // 25 × 2 = 50 K² at most; 56.25 is above that), squares 4 + 1 + 0.25 + 50 = 55.25, mean 13.8125.
        SensorSignal next = feed(check, 5, 410.0);
        assertEquals(13.8125 / 2.0, next.scatterRatio(), 1e-7, "hand computation above");
        // Four differences scatter so much by chance (ν = 2.9) that 6.9 is still below the 1e-7 limit.
        assertTrue(next.scatterLimit() > 6.90625, "limit " + next.scatterLimit());
        assertEquals(SignalVerdict.PASS, next.scatter());
    }

    @Test
    void ratioVarianceIsVonNeumannsAndMatchesASeededSimulation() {
        // n = 5, m = 4: (3m − 1)/m² = 11/16 (derivation in SignalSettings.ratioVariance).
        assertEquals(11.0 / 16.0, SignalSettings.ratioVariance(5), 1e-15);
        // von Neumann's form 4σ⁴(3n − 4)/(n − 1)² over (2σ²)², n = 60: (180 − 4)/59² (recalled from memory).
        assertEquals(176.0 / (59.0 * 59.0), SignalSettings.ratioVariance(60), 1e-15);
        Random random = new Random(20261202L);
        int windows = 200_000;
        int n = 10;
        double sum = 0.0;
        double sumSq = 0.0;
        for (int w = 0; w < windows; w++) {
            double prev = random.nextGaussian();
            double s = 0.0;
            for (int i = 1; i < n; i++) {
                double x = random.nextGaussian();
                s += (x - prev) * (x - prev);
                prev = x;
            }
            double r = s / (n - 1) / 2.0;
            sum += r;
            sumSq += r * r;
        }
        double mean = sum / windows;
        double var = sumSq / windows - mean * mean;
        // 200,000 windows: the sample variance's relative standard error is about √(2/200000)·√(kurtosis
        // factor) < 1 %; 3 % leaves margin. Seed 20261202.
        assertEquals(1.0, mean, 0.01);
        assertEquals(SignalSettings.ratioVariance(n), var, 0.03 * var);
    }

    @Test
    void scatterLimitIsTheChiSquareQuantileOfTheMatchedDegreesOfFreedom() {
        // n = 60: Var = 176/3481, ν = 2/Var = 39.557; the 1 − 1e-7 quantile of χ²_ν over ν.
        SignalSettings s = SignalSettings.DEFAULTS;
        double nu = 2.0 * 3481.0 / 176.0;
        assertEquals(org.steamtally.calc.reconcile.ChiSquare.quantile(1.0 - 1e-7, nu) / nu, s.scatterQuantile(), 1e-12);
        assertEquals(2.634, s.scatterQuantile(), 0.001, "value printed by the check, kept as a guard");
    }

    @Test
    void frozenValueFailsOnceUnchangedForTheLimitByTheSnapshotsTimestamps() {
        SignalCheck check = new SignalCheck(oneSensor(), SignalSettings.DEFAULTS, 60.0, 1.0);
        feed(check, 0, 400.0);
        assertEquals(SignalVerdict.PASS, feed(check, 1, 400.25).frozen());
        SensorSignal s = null;
        for (int t = 2; t <= 60; t++) {
            s = feed(check, t, 400.25);
            if (t < 61) {
                assertEquals(SignalVerdict.PASS, s.frozen(), "unchanged for " + (t - 1) + " s");
            }
        }
        assertEquals(59.0, s.frozenS());
        s = feed(check, 61, 400.25);
        assertEquals(60.0, s.frozenS());
        assertEquals(SignalVerdict.FAIL, s.frozen());
        assertTrue(s.failed());
        // Any change starts afresh; time between snapshots counts, not their number.
        s = feed(check, 62, 400.2500001);
        assertEquals(SignalVerdict.PASS, s.frozen());
        assertEquals(0.0, s.frozenS());
        assertEquals(SignalVerdict.FAIL, feed(check, 122, 400.2500001).frozen());
    }

    @Test
    void changesWithinTheDeclaredResolutionCountAsUnchanged() {
        SignalSettings settings = SignalSettings.DEFAULTS.withResolution(Map.of("TT-1", 0.01));
        SignalCheck check = new SignalCheck(oneSensor(), settings, 30.0, 1.0);
        for (int t = 0; t < 30; t++) {
            feed(check, t, 400.0 + (t % 2 == 0 ? 0.0 : 0.005));
        }
        SensorSignal s = feed(check, 30, 400.005);
        assertEquals(30.0, s.frozenS());
        assertEquals(SignalVerdict.FAIL, s.frozen());
        assertEquals(SignalVerdict.PASS, feed(check, 31, 400.02).frozen());
    }

    @Test
    void scatterTestDoesNotDecideDuringTheWarmUpAndDecidesAfterIt() {
        // No declared noise: the first 100 differences are learned, the test says nothing meanwhile.
        SignalSettings settings = SignalSettings.DEFAULTS.withWindow(10).withWarmUp(100);
        SignalCheck check = new SignalCheck(oneSensor(), settings, 60.0, 1.0);
        Random random = new Random(7L);
        for (int t = 0; t <= 100; t++) {
            SensorSignal s = feed(check, t, 400.0 + random.nextGaussian());
            assertEquals(SignalVerdict.NOT_DECIDED, s.scatter(), "reading " + t);
            assertEquals(0.0, s.scatterRatio());
        }
        SensorSignal s = feed(check, 101, 400.0 + random.nextGaussian());
        assertTrue(s.scatter() != SignalVerdict.NOT_DECIDED);
        // learned 2σ² = 2 K² from 100 differences: relative standard error √(3/100) ≈ 17 %, so 50 % is safe
        assertEquals(2.0, s.expectedMssdSi2(), 1.0);
    }

    @Test
    void aSensorThatStartsMovingOnlyAfterTheWarmUpIsLearnedAfreshNotJudgedOnOneDifference() {
        SignalSettings settings = SignalSettings.DEFAULTS.withWindow(10).withWarmUp(100);
        // held for 200 s from the start: frozen from 60 s on, so what was learned before is dropped
        SignalCheck check = new SignalCheck(oneSensor(), settings, 60.0, 1.0);
        for (int t = 0; t < 200; t++) {
            assertEquals(SignalVerdict.NOT_DECIDED, feed(check, t, 400.0).scatter());
        }
        Random random = new Random(11L);
        for (int t = 200; t < 600; t++) {
            SensorSignal s = feed(check, t, 400.0 + random.nextGaussian());
            assertTrue(s.scatter() != SignalVerdict.FAIL, "second " + t + ": ratio " + s.scatterRatio());
            if (t < 300) {
                assertEquals(SignalVerdict.NOT_DECIDED, s.scatter(), "second " + t + ": warming up afresh");
            }
        }
    }

    @Test
    void aSensorWithoutAGoodValueIsNotDecidedAndNothingIsNaN() {
        SignalCheck check = new SignalCheck(oneSensor(), SignalSettings.DEFAULTS, 60.0, 1.0);
        SensorSignal s = check.check(new Snapshot(T0, "u1", new double[] {Double.NaN},
                new Snapshot.SensorStatus[] {Snapshot.SensorStatus.MISSING})).sensors().get(0);
        assertEquals(SignalVerdict.NOT_DECIDED, s.frozen());
        assertEquals(SignalVerdict.NOT_DECIDED, s.scatter());
        assertEquals(0.0, s.frozenS());
        assertEquals(0.0, s.scatterRatio());
        s = feed(check, 1, Double.NaN);
        assertEquals(SignalVerdict.NOT_DECIDED, s.frozen());
        // a sensor that never moved has learned nothing: no ratio of 0/0
        for (int t = 2; t < 1000; t++) {
            s = feed(check, t, 400.0);
        }
        assertEquals(SignalVerdict.NOT_DECIDED, s.scatter());
        assertEquals(0.0, s.scatterRatio());
        assertEquals(SignalVerdict.FAIL, s.frozen());
    }

    @Test
    void aFailedSensorIsMarkedStaleInTheSnapshotGivenToTheBalances() {
        SignalCheck check = new SignalCheck(oneSensor(), SignalSettings.DEFAULTS, 5.0, 1.0);
        SignalReport r = null;
        for (int t = 0; t <= 5; t++) {
            r = check.check(Snapshot.allGood(T0.plusSeconds(t), "u1", new double[] {400.0}));
        }
        Snapshot in = Snapshot.allGood(T0.plusSeconds(5), "u1", new double[] {400.0});
        Snapshot out = r.excludingFailed(in);
        assertEquals(Snapshot.SensorStatus.STALE, out.status()[0]);
        assertEquals(Snapshot.SensorStatus.GOOD, in.status()[0], "the given snapshot is left as it was");
    }

    @Test
    void aSitesDeclarationsAreNarrowedToEachUnitsOwnSensors() {
        SignalSettings site = SignalSettings.DEFAULTS.withDeclaredNoise(Map.of("TT-1", 0.1, "TT-9", 0.2))
                .withResolution(Map.of("TT-9", 0.01));
        SignalSettings unit = site.forUnit(oneSensor());
        assertEquals(Map.of("TT-1", 0.1), unit.declaredNoiseSi());
        assertEquals(Map.of(), unit.resolutionSi());
        // the declared noise ends the warm-up at once: 2σ² = 0.02 K² from the first reading
        assertEquals(0.02, feed(new SignalCheck(oneSensor(), unit, 60.0, 1.0), 0, 400.0).expectedMssdSi2(), 1e-15);
    }

    @Test
    void badSettingsAreRefusedNamingTheValue() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> SignalSettings.DEFAULTS.withWindow(2));
        assertTrue(e.getMessage().contains("was 2"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> SignalSettings.DEFAULTS.withDeclaredNoise(Map.of("TT-1", -0.5)));
        assertTrue(e.getMessage().contains("TT-1") && e.getMessage().contains("-0.5"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> SignalSettings.DEFAULTS.withResolution(Map.of("TT-1", Double.NaN)));
        assertTrue(e.getMessage().contains("NaN"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> new SignalCheck(oneSensor(),
                SignalSettings.DEFAULTS.withDeclaredNoise(Map.of("TT-9", 0.1)), 60.0, 1.0));
        assertTrue(e.getMessage().contains("TT-9"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> new SignalCheck(oneSensor(), SignalSettings.DEFAULTS, 0.0, 1.0));
        assertTrue(e.getMessage().contains("TT-1") && e.getMessage().contains("was 0.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> new SignalCheck(oneSensor(), SignalSettings.DEFAULTS,
                60.0, Double.POSITIVE_INFINITY));
        assertTrue(e.getMessage().contains("Infinity"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> new SignalCheck(oneSensor(), SignalSettings.DEFAULTS,
                60.0, 1.0).check(Snapshot.allGood(T0, "u2", new double[] {1.0})));
        assertTrue(e.getMessage().contains("u2"), e.getMessage());
    }
}
