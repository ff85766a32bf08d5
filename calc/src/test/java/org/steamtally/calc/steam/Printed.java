package org.steamtally.calc.steam;

import java.math.BigDecimal;

import static org.junit.jupiter.api.Assertions.assertEquals;

/**
 * A check value as the release prints it. The releases print nine significant digits, so a
 * correct implementation agrees to within half a unit in the last printed digit: that is the
 * tolerance every published-value test here uses, taken from the printed text itself.
 */
final class Printed {

    private Printed() {
    }

    /** Half a unit in the last printed digit of {@code printed}, in the printed unit. */
    static double halfUnitInLastDigit(String printed) {
        return new BigDecimal(printed.trim()).ulp().doubleValue() / 2;
    }

    /**
     * Asserts that {@code actual}, converted to the printed unit by dividing by {@code scale}, agrees
     * with the printed value to half a unit in its last digit.
     */
    static void assertMatches(String printed, double actual, double scale, String what) {
        assertMatches(printed, actual, scale, what, 0.5);
    }

    /**
     * As {@link #assertMatches(String, double, double, String)} with a tolerance of
     * {@code unitsOfLastDigit} units in the last printed digit, for the rare printed value that is
     * itself rounded the other way.
     */
    static void assertMatches(String printed, double actual, double scale, String what, double unitsOfLastDigit) {
        double expected = Double.parseDouble(printed.trim());
        double tolerance = 2 * halfUnitInLastDigit(printed) * unitsOfLastDigit;
        assertEquals(expected, actual / scale, tolerance, what + " against printed " + printed);
    }
}
