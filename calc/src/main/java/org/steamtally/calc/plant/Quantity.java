package org.steamtally.calc.plant;

/** What a sensor measures, with the SI unit its values carry inside steamtally. */
public enum Quantity {
    PRESSURE("Pa"),
    TEMPERATURE("K"),
    MASS_FLOW("kg/s"),
    POWER("W"),
    ENERGY_RATE("W");

    private final String siUnit;

    Quantity(String siUnit) {
        this.siUnit = siUnit;
    }

    public String siUnit() {
        return siUnit;
    }
}
