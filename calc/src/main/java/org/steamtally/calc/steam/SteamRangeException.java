package org.steamtally.calc.steam;

/**
 * A water/steam state was asked for outside the range where IAPWS-IF97 defines one, or for an
 * input pair that has no state. The message names the input pair, the offending value with its
 * unit and the valid range, so that a reader can fix the input without reading the code.
 */
public final class SteamRangeException extends IllegalArgumentException {

    private final String pair;
    private final String quantity;
    private final double value;
    private final String unit;
    private final String validRange;

    /**
     * @param pair       the input pair, as written at the API, e.g. {@code "p,T"}
     * @param quantity   the offending quantity's symbol, e.g. {@code "T"}
     * @param value      the offending value, in the unit given
     * @param unit       the SI unit of {@code value}, e.g. {@code "K"}
     * @param validRange the range that would have been accepted, in words, e.g.
     *                   {@code "273.15 K to 2273.15 K"}
     */
    public SteamRangeException(String pair, String quantity, double value, String unit, String validRange) {
        super(pair + ": " + quantity + " = " + format(value) + " " + unit
                + " is outside IAPWS-IF97 (valid: " + validRange + ")");
        this.pair = pair;
        this.quantity = quantity;
        this.value = value;
        this.unit = unit;
        this.validRange = validRange;
    }

    private static String format(double value) {
        return Double.isNaN(value) ? "NaN" : Double.toString(value);
    }

    public String pair() {
        return pair;
    }

    public String quantity() {
        return quantity;
    }

    public double value() {
        return value;
    }

    public String unit() {
        return unit;
    }

    public String validRange() {
        return validRange;
    }
}
