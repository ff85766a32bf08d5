package org.steamtally.calc.cycle;

/** The phase of a cycle state, as shown to operators and written to the result record. */
public enum Phase {
    /** Compressed (subcooled) liquid. */
    LIQUID("liquid"),
    /** Saturated liquid, saturated vapour or a wet mixture: on the saturation line. */
    TWO_PHASE("two_phase"),
    /** Superheated vapour. */
    VAPOUR("vapour"),
    /** Above the critical pressure and temperature. */
    SUPERCRITICAL("supercritical");

    private final String label;

    Phase(String label) {
        this.label = label;
    }

    /** The name used in the result record. */
    public String label() {
        return label;
    }
}
