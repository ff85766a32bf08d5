package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.Suspect;

class ReconciliationInputTest {

    // 11.07: the chi-square quantile at 95 % for 5 degrees of freedom (NIST/SEMATECH e-Handbook of
    // Statistical Methods, table 1.3.6.7.4).
    private static final double CHI2_95_5 = 11.070;

    private static ReconciliationResult result(String status, double chi2, OptionalDouble limit, int redundancy,
                                               List<Suspect> suspects) {
        return new ReconciliationResult(status, chi2, limit, redundancy, 0.95, 1.959963984540054, 3,
                Optional.empty(), List.of(), List.of(), suspects);
    }

    @Test
    void aFailedTestPassesItsVerdictAndSuspectsWithTheirEquivalentSensors() {
        Suspect named = new Suspect(1, "TT-502", "K", List.of("TT-502", "TT-501", "FT-501"), 6.2,
                OptionalDouble.of(-1.4), OptionalDouble.of(0.2), true);
        ReconciliationInput input = ReconciliationInput.from(
                result(ReconciliationResult.FAILED, 41.0, OptionalDouble.of(CHI2_95_5), 5, List.of(named))).orElseThrow();

        assertTrue(input.globalTestFails());
        assertEquals(1, input.suspects().size());
        SuspectInput suspect = input.suspects().get(0);
        assertEquals("TT-502", suspect.sensorId());
        assertEquals(-1.4, suspect.biasSi());
        assertEquals(0.2, suspect.sigmaSi());
        assertEquals(List.of("TT-501", "FT-501"), suspect.equivalenceSet(), "the set without the sensor itself");
    }

    @Test
    void aSuspectWithoutABiasEstimateIsLeftToTheGlobalTest() {
        Suspect unestimated = new Suspect(1, "PT-301", "Pa", List.of("PT-301"), 3.0, OptionalDouble.empty(),
                OptionalDouble.empty(), false);
        ReconciliationInput input = ReconciliationInput.from(
                result(ReconciliationResult.FAILED, 20.0, OptionalDouble.of(CHI2_95_5), 5, List.of(unestimated)))
                .orElseThrow();

        assertTrue(input.globalTestFails());
        assertTrue(input.suspects().isEmpty());
    }

    @Test
    void noRedundancyGivesAVerdictWithoutATest() {
        ReconciliationInput input = ReconciliationInput.from(
                result(ReconciliationResult.NO_REDUNDANCY, 0.0, OptionalDouble.empty(), 0, List.of())).orElseThrow();

        assertEquals(0, input.redundancy());
        assertFalse(input.globalTestFails());
    }

    @Test
    void aReconciliationNotRunOrNotConvergedGivesNoVerdict() {
        assertTrue(ReconciliationInput.from(ReconciliationResult.notRun()).isEmpty());
        assertTrue(ReconciliationInput.from(
                result(ReconciliationResult.NOT_CONVERGED, 0.0, OptionalDouble.empty(), 5, List.of())).isEmpty());
    }
}
