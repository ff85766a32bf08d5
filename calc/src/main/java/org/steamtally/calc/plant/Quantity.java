package org.steamtally.calc.plant;

import java.util.Locale;

/** What a sensor measures, with the SI unit its values carry inside steamtally. */
public enum Quantity {
    PRESSURE("Pa"),
    TEMPERATURE("K"),
    MASS_FLOW("kg/s"),
    POWER("W"),
    ENERGY_RATE("W"),
    /** Energy per unit mass, e.g. a fuel's heating value. */
    SPECIFIC_ENERGY("J/kg");

    private final String siUnit;

    Quantity(String siUnit) {
        this.siUnit = siUnit;
    }

    public String siUnit() {
        return siUnit;
    }

    /** The name used in the plant description, e.g. {@code "mass_flow"}. */
    public String key() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The name for messages, e.g. {@code "mass flow"}. */
    public String label() {
        return key().replace('_', ' ');
    }
}
