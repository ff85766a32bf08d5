package org.steamtally.calc.alarm;

import java.util.Locale;

/**
 * How soon an operator should look, in the four levels common in ISA-18.2 practice. Ordered from
 * least to most pressing, so {@code compareTo} sorts by urgency.
 */
public enum AlarmPriority {
    LOW,
    MEDIUM,
    HIGH,
    URGENT;

    /** The name used in the plant description, e.g. {@code "medium"}. */
    public String key() {
        return name().toLowerCase(Locale.ROOT);
    }
}
