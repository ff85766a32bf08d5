package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.MetricsBasis;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/** Which values the metrics of the full result record come from. */
class ReconcilingEvaluatorTest {

    private static final UnitDescription UNIT = RegenerativeExample.unit();

    private static UnitResult evaluate(String biased, double sigmas) {
        double[] v = RegenerativeExample.consistentArray(UNIT);
        int i = RegenerativeExample.index(UNIT, biased);
        v[i] += sigmas * UNIT.sensors().get(i).standardUncertaintySi();
        return ReconcilingEvaluator.compile("fernholm", UNIT).evaluate(RegenerativeExample.snapshot(UNIT, v));
    }

    private static StateResult state(UnitResult r, String id) {
        return r.states().stream().filter(s -> s.id().equals(id)).findFirst().orElseThrow();
    }

    @Test
    void passingReconciliationGivesMetricsFromTheReconciledValues() {
        UnitResult r = evaluate("TT-101", 0.0);
        assertAll(
                () -> assertEquals(MetricsBasis.RECONCILED, r.metricsBasis()),
                () -> assertTrue(r.reconciliation().passed()),
                () -> assertTrue(r.cycle().thermalEfficiency().isPresent()),
                () -> assertEquals(r.cycle().thermalEfficiency().getAsDouble(),
                        r.cycleRaw().thermalEfficiency().getAsDouble(), 1e-9),
                () -> assertTrue(r.states().stream().allMatch(StateResult::valid)));
    }

    @Test
    void confirmedSuspectIsReplacedByItsEstimateAndTheRawFiguresAreKeptBeside() {
        // checked share of TT-311 0.99: 9σ gives χ² ≈ 79, above 38.885 at the 26 degrees of the example
        UnitResult r = evaluate("TT-311", 9.0);
        double truth = RegenerativeExample.consistentValues().get("TT-311");
        assertAll(
                () -> assertEquals(MetricsBasis.RAW_EXCLUDING_SUSPECTS, r.metricsBasis()),
                () -> assertEquals("failed", r.reconciliation().status()),
                // estimated from the other sensors, which are exact here
                () -> assertEquals(truth, state(r, "condensate_pumped").temperatureK().getAsDouble(), 0.005),
                () -> assertNotEquals(r.cycle().pumpWorkW().getAsDouble(), r.cycleRaw().pumpWorkW().getAsDouble()));
    }

    @Test
    void closureChecksAlwaysComeFromTheRawValues() {
        UnitResult r = evaluate("TT-311", 5.0);
        ClosureResult motor = r.closure().stream().filter(c -> c.id().equals("condensate_pump+motor")).findFirst()
                .orElseThrow();
        assertTrue(Math.abs(motor.z()) > 3.0, "z " + motor.z());
    }
}
