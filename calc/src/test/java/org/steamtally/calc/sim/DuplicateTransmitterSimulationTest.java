package org.steamtally.calc.sim;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;

import java.time.Duration;
import java.time.Instant;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;

/**
 * A duplicate transmitter reads its primary's truth, with its own noise and its own faults: over
 * many seconds the mean of each reading approaches the common truth, the two readings differ from
 * second to second, and a fault on one leaves the other alone.
 */
class DuplicateTransmitterSimulationTest {

    private static final Instant T0 = Instant.parse("2026-12-02T00:00:00Z");

    @Test
    void theDuplicateReadsThePrimarysTruthWithItsOwnNoiseAndFaults() {
        UnitDescription unit = RegenerativeExample.unit();
        TruthModel truth = TruthModel.of(unit, RegenerativeExample.designPoint());
        double bias = 0.05e6; // 5 u of PT-101B (u = 0.01 MPa)
        Simulator sim = Simulator.builder(truth).seed(11)
                .fault(new Fault.Bias("PT-101B", T0, Duration.ofHours(1), bias)).build();
        int p = RegenerativeExample.index(unit, "PT-101");
        int d = RegenerativeExample.index(unit, "PT-101B");
        int n = 400;
        double sumP = 0.0;
        double sumD = 0.0;
        int equal = 0;
        double truthValue = truth.atDesign().valueSi("PT-101");
        for (int s = 0; s < n; s++) {
            double[] v = sim.step(T0.plusSeconds(s)).snapshot().valuesSi();
            sumP += v[p];
            sumD += v[d];
            equal += v[p] == v[d] ? 1 : 0;
        }
        double u = 0.01e6;
        double meanP = sumP / n;
        double meanD = sumD / n;
        int same = equal;
        assertAll(
                () -> assertEquals(truthValue, truth.atDesign().valueSi("PT-101B"), 0.0),
                // standard error of a mean of 400 draws: u / 20; four of them as the bound
                () -> assertEquals(truthValue, meanP, 4 * u / 20),
                () -> assertEquals(truthValue + bias, meanD, 4 * u / 20),
                () -> assertEquals(0, same, "independent noise: the two never read the same"),
                () -> assertNotEquals(meanP, meanD));
    }
}
