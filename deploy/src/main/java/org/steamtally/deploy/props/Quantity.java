package org.steamtally.deploy.props;

/** A quantity that can be one half of a {@code props} input pair, named by its CSV column. */
public enum Quantity {
    /** Pressure p; Pa or kPa. */
    PRESSURE("p"),
    /** Temperature T; K or °C. */
    TEMPERATURE("T"),
    /** Specific enthalpy h; J/kg or kJ/kg. */
    ENTHALPY("h"),
    /** Specific entropy s; J/(kg·K) or kJ/(kg·K). */
    ENTROPY("s"),
    /** Vapour quality x (vapour mass fraction), unitless, 0 to 1. */
    QUALITY("x");

    private final String column;

    Quantity(String column) {
        this.column = column;
    }

    /** The column name in the input and output header, e.g. {@code T}. */
    public String column() {
        return column;
    }
}
