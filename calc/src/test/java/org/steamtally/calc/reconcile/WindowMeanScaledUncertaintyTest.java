package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.lang.reflect.RecordComponent;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.SensorUncertainties;
import org.steamtally.calc.plant.UnitDescription;

/**
 * The window's one compiled evaluator, handed the sensors' uncertainties divided by √n_eff at
 * evaluation time, gives the record of an evaluator compiled from the unit with those uncertainties
 * (the standard uncertainty of a mean of n_eff readings, GUM, JCGM 100:2008, 4.2.3), and the window
 * compiles once however n_eff changes.
 */
class WindowMeanScaledUncertaintyTest {

    private static final UnitDescription UNIT = RegenerativeExample.unit();
    private static final String SITE = "fernholm";
    private static final long SEED = 20261202L;
    /**
     * Relative tolerance of every number of the two records. Both do the same arithmetic on the same
     * uncertainties (u · (1/√k) either way), so they agree bit for bit today; the tolerance leaves
     * room for a reordering of sums only, and is far below the reconciliation's own convergence
     * tolerance of 1e-6 standard uncertainties, so a real difference in the weights would show.
     */
    private static final double RELATIVE_TOLERANCE = 1e-9;
    /** Absolute floor for numbers that are zero in one record, e.g. a balance that closes exactly. */
    private static final double ABSOLUTE_TOLERANCE = 1e-9;

    /**
     * One window: its length, the snapshots fed, the sensor (if any) that is MISSING in the first
     * {@code dropouts} snapshots, and the bias on TT-311 in its standard uncertainties, so that some
     * cases pass the global test and some fail it and name suspects.
     */
    static Stream<Arguments> windows() {
        return Stream.of(
                Arguments.of(50, 1, null, 0, 0.0),
                Arguments.of(50, 2, null, 0, 3.0),
                Arguments.of(50, 5, null, 0, 0.0),
                Arguments.of(50, 12, null, 0, 2.0),
                Arguments.of(50, 50, null, 0, 2.0),
                // wrapped: 13 snapshots through a window of 8, full, the sum in slot order
                Arguments.of(8, 13, null, 0, 1.5),
                // FT-101 missing from 2 of 6 snapshots: n_eff = 4 for every sensor
                Arguments.of(10, 6, "FT-101", 2, 2.0),
                // a redundant temperature missing from 9 of 20: n_eff = 11
                Arguments.of(20, 20, "TT-101", 9, 0.0));
    }

    @ParameterizedTest(name = "window {0}, {1} snapshots, {2} missing from {3}, TT-311 +{4} u")
    @MethodSource("windows")
    void windowMeanEqualsAReconciliationCompiledWithUncertaintiesDividedByRootNEff(int window, int fed,
            String dropped, int dropouts, double biasSigmas) {
        List<Snapshot> snapshots = noisySnapshots(fed, dropped, dropouts, biasSigmas);
        WindowMeanEvaluator w = WindowMeanEvaluator.compile(SITE, UNIT, window);
        UnitResult actual = null;
        for (Snapshot s : snapshots) {
            actual = w.evaluate(s);
        }
        int held = Math.min(fed, window);
        int nEff = held - (dropped == null ? 0 : Math.max(0, dropouts - (fed - held)));
        Snapshot mean = meanOfWindow(snapshots, window);
        UnitResult expected = ReconcilingEvaluator.compile(SITE, WindowMeanEvaluator.meanUncertainties(UNIT, nEff))
                .evaluate(mean);
        assertSameToRounding("record", expected, actual);
        UnitResult a = actual;
        double u = UNIT.sensors().get(RegenerativeExample.index(UNIT, "TT-311")).standardUncertaintySi();
        double reported = a.reconciliation().sensors().stream().filter(x -> x.id().equals("TT-311")).findFirst()
                .orElseThrow().sigmaMeasured().getAsDouble();
        // n_eff as worked out by hand above: the reported u is u/√n_eff
        assertEquals(u / Math.sqrt(nEff), reported, 1e-12 * u, "u(TT-311) of the mean at n_eff = " + nEff);
    }

    @Test
    void theCasesIncludeBothAPassedAndAFailedGlobalTest() {
        // guards the parameter list above: suspects are only compared if some case names one
        UnitResult failed = evaluateWindow(50, noisySnapshots(12, null, 0, 2.0));
        UnitResult passed = evaluateWindow(50, noisySnapshots(5, null, 0, 0.0));
        assertAll(
                () -> assertEquals("failed", failed.reconciliation().status()),
                () -> assertFalse(failed.reconciliation().suspects().isEmpty(), "suspects"),
                () -> assertEquals("passed", passed.reconciliation().status()));
    }

    @Test
    void windowCompilesOneEvaluatorWhileItFillsAndWhenASensorDropsOut() {
        AtomicInteger compilations = new AtomicInteger();
        WindowMeanEvaluator w = WindowMeanEvaluator.compile(SITE, UNIT, 50, (site, unit) -> {
            compilations.incrementAndGet();
            return ReconcilingEvaluator.compile(site, unit);
        });
        assertEquals(1, compilations.get(), "after compile");
        List<Snapshot> snapshots = noisySnapshots(60, null, 0, 0.0);
        for (int k = 0; k < 50; k++) {
            w.evaluate(snapshots.get(k));
            assertEquals(1, compilations.get(), "after " + (k + 1) + " snapshots, n_eff = " + (k + 1));
        }
        // FT-101 drops out for 5 snapshots (n_eff 49 to 45), then the window is cleared and fills again
        List<Snapshot> dropout = noisySnapshots(5, "FT-101", 5, 0.0);
        for (Snapshot s : dropout) {
            w.evaluate(s);
        }
        w.clear();
        for (int k = 50; k < 60; k++) {
            w.evaluate(snapshots.get(k));
        }
        assertEquals(1, compilations.get(), "after a dropout and a restart of the window");
    }

    @Test
    void evaluatorGivenTheDeclaredUncertaintiesGivesTheRecordOfTheDeclaredOnes() {
        Snapshot s = noisySnapshots(1, null, 0, 8.0).get(0);
        ReconcilingEvaluator e = ReconcilingEvaluator.compile(SITE, UNIT);
        assertSameToRounding("record", e.evaluate(s), e.evaluate(s, SensorUncertainties.declared(UNIT.sensors())));
    }

    @Test
    void uncertaintiesOfAnotherCountAreRefusedNamingTheCounts() {
        Reconciler r = Reconciler.compile(UNIT);
        Snapshot s = RegenerativeExample.snapshot(UNIT, RegenerativeExample.consistentArray(UNIT));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> r.reconcile(s, new double[] {1.0, 2.0}));
        assertEquals("unit \"" + UNIT.id() + "\" has " + UNIT.sensors().size()
                + " sensors; was given 2 standard uncertainties", e.getMessage());
    }

    @Test
    void uncertaintyThatIsNotPositiveIsRefusedNamingTheSensorAndValue() {
        ReconcilingEvaluator ev = ReconcilingEvaluator.compile(SITE, UNIT);
        Snapshot s = RegenerativeExample.snapshot(UNIT, RegenerativeExample.consistentArray(UNIT));
        double[] u = SensorUncertainties.declared(UNIT.sensors());
        int i = RegenerativeExample.index(UNIT, "TT-311");
        u[i] = Double.NaN;
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ev.evaluate(s, u));
        assertEquals("unit \"" + UNIT.id() + "\", sensor TT-311: standard uncertainty must be a positive finite"
                + " number, was NaN K", e.getMessage());
        u[i] = 0.0;
        assertTrue(assertThrows(IllegalArgumentException.class, () -> ev.evaluate(s, u)).getMessage()
                .endsWith("was 0.0 K"));
    }

    // ---------------------------------------------------------------- helpers

    private static UnitResult evaluateWindow(int window, List<Snapshot> snapshots) {
        WindowMeanEvaluator w = WindowMeanEvaluator.compile(SITE, UNIT, window);
        UnitResult r = null;
        for (Snapshot s : snapshots) {
            r = w.evaluate(s);
        }
        return r;
    }

    /**
     * Seeded snapshots of the consistent operating point, every sensor off by uniform noise within
     * ±1 standard uncertainty, TT-311 raised by {@code biasSigmas} of its own.
     */
    private static List<Snapshot> noisySnapshots(int count, String dropped, int dropouts, double biasSigmas) {
        double[] base = RegenerativeExample.consistentArray(UNIT);
        SplittableRandom random = new SplittableRandom(SEED);
        int biased = RegenerativeExample.index(UNIT, "TT-311");
        int missing = dropped == null ? -1 : RegenerativeExample.index(UNIT, dropped);
        List<Snapshot> out = new ArrayList<>();
        for (int k = 0; k < count; k++) {
            double[] v = base.clone();
            for (int i = 0; i < v.length; i++) {
                v[i] += random.nextDouble(-1.0, 1.0) * UNIT.sensors().get(i).standardUncertaintySi();
            }
            v[biased] += biasSigmas * UNIT.sensors().get(biased).standardUncertaintySi();
            Snapshot.SensorStatus[] status = new Snapshot.SensorStatus[v.length];
            Arrays.fill(status, Snapshot.SensorStatus.GOOD);
            if (k < dropouts) {
                status[missing] = Snapshot.SensorStatus.MISSING;
                v[missing] = Double.NaN;
            }
            out.add(new Snapshot(RegenerativeExample.TS.plusSeconds(k), UNIT.id(), v, status));
        }
        return out;
    }

    /**
     * The mean a window of {@code window} slots holds after these snapshots, summed in slot order
     * (snapshot k goes to slot k mod window) as the window sums, so the two means are equal bit for
     * bit; time stamped and with the statuses of the last snapshot.
     */
    private static Snapshot meanOfWindow(List<Snapshot> snapshots, int window) {
        Snapshot[] slots = new Snapshot[window];
        for (int k = 0; k < snapshots.size(); k++) {
            slots[k % window] = snapshots.get(k);
        }
        Snapshot last = snapshots.get(snapshots.size() - 1);
        int sensors = UNIT.sensors().size();
        double[] mean = last.valuesSi().clone();
        Snapshot.SensorStatus[] status = last.status().clone();
        for (int i = 0; i < sensors; i++) {
            double sum = 0.0;
            int count = 0;
            for (Snapshot s : slots) {
                if (s != null && s.status()[i] == Snapshot.SensorStatus.GOOD) {
                    sum += s.valuesSi()[i];
                    count++;
                }
            }
            if (count > 0) {
                mean[i] = sum / count;
                status[i] = Snapshot.SensorStatus.GOOD;
            }
        }
        return new Snapshot(last.timestamp(), last.unitId(), mean, status);
    }

    /**
     * Walks two records component by component: every double and OptionalDouble within the
     * tolerances above, everything else (ids, statuses, suspects' names, flags, list sizes) equal.
     */
    private static void assertSameToRounding(String path, Object expected, Object actual) {
        if (expected == null || actual == null) {
            assertEquals(expected, actual, path);
        } else if (expected instanceof Double e) {
            assertClose(path, e, (Double) actual);
        } else if (expected instanceof OptionalDouble e) {
            OptionalDouble a = (OptionalDouble) actual;
            assertEquals(e.isPresent(), a.isPresent(), path + " present");
            if (e.isPresent()) {
                assertClose(path, e.getAsDouble(), a.getAsDouble());
            }
        } else if (expected instanceof Optional<?> e) {
            Optional<?> a = (Optional<?>) actual;
            assertEquals(e.isPresent(), a.isPresent(), path + " present");
            if (e.isPresent()) {
                assertSameToRounding(path, e.get(), a.get());
            }
        } else if (expected instanceof List<?> e) {
            List<?> a = (List<?>) actual;
            assertEquals(e.size(), a.size(), path + " size");
            for (int i = 0; i < e.size(); i++) {
                assertSameToRounding(path + "[" + i + "]", e.get(i), a.get(i));
            }
        } else if (expected instanceof Record) {
            assertEquals(expected.getClass(), actual.getClass(), path);
            for (RecordComponent c : expected.getClass().getRecordComponents()) {
                try {
                    assertSameToRounding(path + "." + c.getName(), c.getAccessor().invoke(expected),
                            c.getAccessor().invoke(actual));
                } catch (ReflectiveOperationException ex) {
                    throw new AssertionError(path + "." + c.getName(), ex);
                }
            }
        } else if (expected instanceof Instant || expected instanceof String || expected instanceof Enum<?>
                || expected instanceof Integer || expected instanceof Boolean) {
            assertEquals(expected, actual, path);
        } else {
            assertEquals(expected, actual, path + " (" + expected.getClass().getSimpleName() + ")");
        }
    }

    private static void assertClose(String path, double expected, double actual) {
        if (Double.isNaN(expected)) {
            assertTrue(Double.isNaN(actual), path + ": expected NaN, was " + actual);
            return;
        }
        double tolerance = Math.max(ABSOLUTE_TOLERANCE, RELATIVE_TOLERANCE * Math.abs(expected));
        assertEquals(expected, actual, tolerance, path);
    }
}
