package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.math.BigDecimal;

/** Comparison of a computed value with a value printed in an IAPWS release. */
final class Published {

    /**
     * Relative allowance for the computation itself: a few hundred ulps of double rounding in the
     * evaluation of a series of up to ~50 terms. It is four orders of magnitude below the
     * half-unit allowance for 9- or 10-digit printed values, so it cannot hide a wrong digit.
     */
    private static final double EVALUATION_ROUNDING = 1e-13;

    private Published() {
    }

    /**
     * Asserts that {@code actual} rounds to {@code printed}: the release prints values rounded to
     * their last digit, so the exact value of the formulation lies within half a unit of that digit
     * (a relative tolerance of 0.5·10^-9 to 5·10^-9 for nine printed digits).
     *
     * @param printed the value exactly as printed, in the release's unit
     * @param actual  the computed value, converted to the release's unit
     */
    static void assertRoundsTo(String printed, double actual, String what) {
        BigDecimal expected = new BigDecimal(printed.trim());
        double halfUnit = expected.ulp().doubleValue() / 2.0;
        double tolerance = halfUnit + EVALUATION_ROUNDING * Math.abs(expected.doubleValue());
        assertEquals(expected.doubleValue(), actual, tolerance, what + " (printed " + printed + ")");
    }
}
