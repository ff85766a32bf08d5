package org.steamtally.deploy.props;

import com.fasterxml.jackson.core.io.NumberOutput;

/**
 * Writes a double as the shortest decimal that reads back ({@link Double#parseDouble}) to the same
 * double, in the layout of {@link Double#toString(double)} (plain for 10⁻³ ≤ |d| &lt; 10⁷, otherwise
 * {@code 1.65E7} style). Java 17's own {@code Double.toString} sometimes gives a longer decimal than
 * needed (JDK-4511638; fixed in Java 19 with R. Giulietti's Schubfach algorithm); jackson-core ships
 * the same algorithm, which we use.
 */
public final class ShortestDecimal {

    /** Selects jackson-core's Schubfach writer instead of {@code Double.toString}. */
    private static final boolean USE_SCHUBFACH = true;

    private ShortestDecimal() {
    }

    /** The shortest round-trip decimal of {@code value}, which must be finite. */
    public static String format(double value) {
        return NumberOutput.toString(value, USE_SCHUBFACH);
    }
}
