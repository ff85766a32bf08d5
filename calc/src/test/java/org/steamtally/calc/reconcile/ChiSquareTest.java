package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;
import org.junit.jupiter.params.provider.ValueSource;

class ChiSquareTest {

    /** Half a unit in the third printed decimal. */
    private static final double PRINTED_TOLERANCE = 0.0005;

    @ParameterizedTest(name = "dof {0}, p = {1}: {2}")
    @CsvFileSource(resources = "chi-square-critical-values.csv", numLinesToSkip = 3)
    void quantileMatchesPublishedCriticalValue(int dof, double probability, double published) {
        assertEquals(published, ChiSquare.quantile(probability, dof), PRINTED_TOLERANCE);
    }

    /**
     * With two degrees of freedom the χ² distribution is exponential, F(x) = 1 − e^{−x/2}, so the
     * quantile is −2 ln(1 − p) exactly (DLMF 8.4.5 with a = 1: P(1, x) = 1 − e^{−x}).
     */
    @ParameterizedTest
    @ValueSource(doubles = {0.5, 0.9, 0.95, 0.99, 0.999})
    void quantileForTwoDegreesOfFreedomIsTheExponentialOneToRounding(double p) {
        double exact = -2.0 * Math.log(1.0 - p);
        assertEquals(exact, ChiSquare.quantile(p, 2), 1e-12 * exact);
    }

    @Test
    void twoSidedNormalQuantileAt95PerCentIs1Point96() {
        // NIST/SEMATECH e-Handbook 1.3.6.7.1 prints z(0.975) = 1.960; 1.959963984540054 to 16 digits
        // is common practice (recalled from memory), checked here to 1e-12.
        assertEquals(1.959963984540054, ChiSquare.normalTwoSided(0.95), 1e-12);
    }

    @Test
    void logGammaMatchesClosedForms() {
        assertAll(
                // Γ(1/2) = √π, DLMF 5.4.6
                () -> assertEquals(0.5 * Math.log(Math.PI), ChiSquare.logGamma(0.5), 1e-14),
                // Γ(10) = 9! = 362880
                () -> assertEquals(Math.log(362880.0), ChiSquare.logGamma(10.0), 1e-13),
                () -> assertEquals(0.0, ChiSquare.logGamma(1.0), 1e-15),
                () -> assertEquals(0.0, ChiSquare.logGamma(2.0), 1e-15));
    }

    @ParameterizedTest
    @ValueSource(doubles = {0.01, 0.5, 1.0, 2.0, 7.5, 40.0})
    void regularisedGammaOfOrderOneIsOneMinusExponential(double x) {
        // DLMF 8.4.5: γ(1, x) = 1 − e^{−x}
        assertAll(
                () -> assertEquals(-Math.expm1(-x), ChiSquare.regularizedGammaP(1.0, x), 1e-14),
                () -> assertEquals(Math.exp(-x), ChiSquare.regularizedGammaQ(1.0, x), 1e-14 + 1e-13 * Math.exp(-x)));
    }

    @Test
    void quantileIsTheInverseOfTheDistributionFunction() {
        for (int dof = 1; dof <= 60; dof++) {
            double x = ChiSquare.quantile(0.95, dof);
            assertEquals(0.95, ChiSquare.cdf(x, dof), 1e-12, "dof " + dof);
        }
    }

    @Test
    void badArgumentsAreRefusedWithTheValue() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ChiSquare.quantile(1.0, 3));
        assertTrue(e.getMessage().contains("was 1.0"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> ChiSquare.quantile(0.95, 0));
        assertThrows(IllegalArgumentException.class, () -> ChiSquare.logGamma(-1.0));
    }
}
