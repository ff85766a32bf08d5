package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import java.util.Random;
import java.util.Set;
import java.util.SplittableRandom;
import java.util.TreeSet;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.SensorUncertainties;
import org.steamtally.calc.plant.UnitDescription;

/**
 * One compiled reconciliation serves snapshot after snapshot of its unit: whatever it reconciled
 * before, each call gives exactly what a freshly compiled one gives for that snapshot, and what it
 * handed out earlier does not change later. "Exactly" is record equality, which compares every
 * double bit for bit ({@link Double#compare}), and array equality of the sensor values.
 */
class ReconcilerReuseTest {

    private static final UnitDescription UNIT = RegenerativeExample.unit();
    private static final String SITE = "fernholm";
    private static final long SEED = 20261203L;

    /** A reconciliation case: the snapshot, and the sensors' uncertainties or null for the declared ones. */
    private record Case(String name, Snapshot snapshot, double[] sigma) {
        Reconciliation reconcile(Reconciler r) {
            return sigma == null ? r.reconcile(snapshot) : r.reconcile(snapshot, sigma);
        }

        UnitResult evaluate(ReconcilingEvaluator e) {
            return sigma == null ? e.evaluate(snapshot) : e.evaluate(snapshot, sigma);
        }
    }

    /**
     * Passing and failing snapshots of every shape serial elimination knows: noise only, one gross
     * error, two (two elimination steps), a duplicate pair off together, a stale and an implausible
     * sensor (fewer unknowns and balances), a value far outside its state's region, and the window
     * channel's smaller uncertainties.
     */
    private static List<Case> cases() {
        SplittableRandom random = new SplittableRandom(SEED);
        List<Case> cases = new ArrayList<>();
        cases.add(new Case("noise", snapshot(noisy(random)), null));
        cases.add(new Case("TT-311 +8u", snapshot(biased(noisy(random), 8.0, "TT-311")), null));
        cases.add(new Case("noise again", snapshot(noisy(random)), null));
        cases.add(new Case("FT-101 -10u, TT-421 +9u", snapshot(biased(biased(noisy(random), -10.0, "FT-101"), 9.0,
                "TT-421")), null));
        cases.add(new Case("PT-101 and its duplicate +12u", snapshot(biased(biased(noisy(random), 12.0, "PT-101"),
                12.0, "PT-101B")), null));
        double[] stale = noisy(random);
        Snapshot.SensorStatus[] status = allGood(stale.length);
        status[RegenerativeExample.index(UNIT, "FT-101")] = Snapshot.SensorStatus.STALE;
        cases.add(new Case("FT-101 stale", new Snapshot(RegenerativeExample.TS, UNIT.id(), stale, status), null));
        double[] implausible = noisy(random);
        implausible[RegenerativeExample.index(UNIT, "TT-101")] = -5.0;
        cases.add(new Case("TT-101 implausible, JT-001 +7u", snapshot(biased(implausible, 7.0, "JT-001")), null));
        cases.add(new Case("TT-151 +200u", snapshot(biased(noisy(random), 200.0, "TT-151")), null));
        double[] mean = SensorUncertainties.declared(UNIT.sensors());
        for (int i = 0; i < mean.length; i++) {
            mean[i] /= Math.sqrt(20.0);
        }
        cases.add(new Case("window of 20, TT-311 +3u of the mean", snapshot(biasedBy(noisy(random), 3.0, "TT-311",
                mean)), mean));
        cases.add(new Case("window of 20, noise", snapshot(noisy(random)), mean));
        return cases;
    }

    @Test
    void reconciliationReusedOverInterleavedSnapshotsGivesWhatAFreshOneGivesForEach() {
        List<Case> cases = cases();
        List<Reconciliation> fresh = new ArrayList<>();
        for (Case c : cases) {
            fresh.add(c.reconcile(Reconciler.compile(UNIT)));
        }
        Reconciler reused = Reconciler.compile(UNIT);
        List<Reconciliation> first = new ArrayList<>();
        for (Case c : cases) {
            first.add(c.reconcile(reused));
        }
        List<Integer> order = order(cases.size());
        for (int k : order) {
            assertSame(cases.get(k).name() + " after " + order.indexOf(k) + " others", fresh.get(k),
                    cases.get(k).reconcile(reused));
        }
        // What the first round handed out is untouched by everything reconciled since.
        for (int k = 0; k < cases.size(); k++) {
            assertSame(cases.get(k).name() + ", handed out first", fresh.get(k), first.get(k));
        }
    }

    @Test
    void evaluatorReusedOverInterleavedSnapshotsGivesWhatAFreshOneGivesForEach() {
        List<Case> cases = cases();
        List<UnitResult> fresh = new ArrayList<>();
        for (Case c : cases) {
            fresh.add(c.evaluate(ReconcilingEvaluator.compile(SITE, UNIT)));
        }
        ReconcilingEvaluator reused = ReconcilingEvaluator.compile(SITE, UNIT);
        for (int k : order(cases.size())) {
            assertEquals(fresh.get(k), cases.get(k).evaluate(reused), cases.get(k).name());
        }
    }

    @Test
    void theCasesReachEveryOutcomeOfTheReconciliation() {
        // guards the list above: reuse is only checked where the reconciliation went
        Set<String> statuses = new TreeSet<>();
        int mostSuspects = 0;
        boolean confirmed = false;
        for (Case c : cases()) {
            ReconciliationResult r = c.reconcile(Reconciler.compile(UNIT)).result();
            statuses.add(r.status());
            mostSuspects = Math.max(mostSuspects, r.suspects().size());
            confirmed |= r.suspects().stream().anyMatch(s -> s.confirmed());
        }
        int suspects = mostSuspects;
        boolean anyConfirmed = confirmed;
        assertAll(
                () -> assertTrue(statuses.containsAll(List.of(ReconciliationResult.PASSED,
                        ReconciliationResult.FAILED)), "statuses " + statuses),
                () -> assertTrue(suspects >= 2, "most suspects in one snapshot " + suspects),
                () -> assertTrue(anyConfirmed, "a confirmed suspect"));
    }

    // ---------------------------------------------------------------- helpers

    private static void assertSame(String message, Reconciliation expected, Reconciliation actual) {
        assertAll(message,
                () -> assertEquals(expected.result(), actual.result(), "result record"),
                () -> assertArrayEquals(expected.reconciledValues().orElse(null),
                        actual.reconciledValues().orElse(null), "reconciled values"),
                () -> assertArrayEquals(expected.excludingSuspectsValues().orElse(null),
                        actual.excludingSuspectsValues().orElse(null), "values excluding suspects"));
    }

    /** Forwards, backwards, then twice shuffled (seeded): every case after several different ones. */
    private static List<Integer> order(int n) {
        List<Integer> one = new ArrayList<>();
        for (int k = 0; k < n; k++) {
            one.add(k);
        }
        List<Integer> out = new ArrayList<>(one);
        List<Integer> back = new ArrayList<>(one);
        Collections.reverse(back);
        out.addAll(back);
        Random random = new Random(SEED);
        for (int round = 0; round < 2; round++) {
            List<Integer> shuffled = new ArrayList<>(one);
            Collections.shuffle(shuffled, random);
            out.addAll(shuffled);
        }
        return out;
    }

    /** The consistent operating point, every sensor off by seeded noise within ±1 standard uncertainty. */
    private static double[] noisy(SplittableRandom random) {
        double[] v = RegenerativeExample.consistentArray(UNIT);
        for (int i = 0; i < v.length; i++) {
            v[i] += random.nextDouble(-1.0, 1.0) * UNIT.sensors().get(i).standardUncertaintySi();
        }
        return v;
    }

    private static double[] biased(double[] v, double sigmas, String sensorId) {
        return biasedBy(v, sigmas, sensorId, SensorUncertainties.declared(UNIT.sensors()));
    }

    private static double[] biasedBy(double[] v, double sigmas, String sensorId, double[] sigma) {
        int i = RegenerativeExample.index(UNIT, sensorId);
        v[i] += sigmas * sigma[i];
        return v;
    }

    private static Snapshot snapshot(double[] v) {
        return new Snapshot(RegenerativeExample.TS, UNIT.id(), v, allGood(v.length));
    }

    private static Snapshot.SensorStatus[] allGood(int n) {
        Snapshot.SensorStatus[] s = new Snapshot.SensorStatus[n];
        Arrays.fill(s, Snapshot.SensorStatus.GOOD);
        return s;
    }
}
