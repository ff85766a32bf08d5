package org.steamtally.calc.alarm;

import java.util.Locale;

/**
 * What an alarm watches. Each kind has its own id form, so that an alarm id names both the kind and
 * its subject and stays the same across restarts.
 */
public enum AlarmKind {
    /** A first-law closure's |z| above its limit: id {@code closure:<closure id>}, e.g. {@code closure:cycle}. */
    CLOSURE("closure:"),
    /** The reconciliation's global test failing (χ² above its quantile): id {@code reconciliation:global}. */
    GLOBAL_TEST("reconciliation:"),
    /** A sensor the reconciliation names as a likely gross error: id {@code suspect:<sensor id>}. */
    SUSPECT_SENSOR("suspect:"),
    /** A sensor with no good value within its max age, or none yet: id {@code stale:<sensor id>}. */
    STALE_SENSOR("stale:"),
    /** A sensor reading outside its plausible range: id {@code range:<sensor id>}. */
    OUT_OF_RANGE("range:"),
    /**
     * A state or component that could not be computed from good inputs: id
     * {@code invalid:state:<state id>} or {@code invalid:component:<component id>}.
     */
    CALCULATION_INVALID("invalid:"),
    /**
     * A sensor whose reading has not changed (beyond its resolution) for longer than the limit, in
     * seconds: id {@code frozen:<sensor id>}. From the signal check, docs/DETECTION.md.
     */
    FROZEN_SENSOR("frozen:"),
    /**
     * A sensor whose reading-to-reading scatter (mean square successive difference over the expected
     * one) is at or above the limit, a factor on the scatter quantile: id {@code erratic:<sensor id>}.
     * From the signal check, docs/DETECTION.md.
     */
    ERRATIC_SENSOR("erratic:"),
    /**
     * The unit as a whole is silent: at least the limit's share of its sensors (a fraction, 1.0 for
     * all) has no good value within its max age, as when its gateway or the broker link is down. One
     * alarm per unit, id {@code silent:unit}; while it is active the unit's stale-sensor and
     * calculation-invalid alarms are suppressed by design, so that one cause raises one alarm.
     */
    SILENT_UNIT("silent:");

    /** The id of the one global-test alarm of a unit. */
    public static final String GLOBAL_TEST_ID = "reconciliation:global";

    /** The id of the one silent-unit alarm of a unit. */
    public static final String SILENT_UNIT_ID = "silent:unit";

    private final String idPrefix;

    AlarmKind(String idPrefix) {
        this.idPrefix = idPrefix;
    }

    /** The start of every id of this kind, e.g. {@code "stale:"}. */
    public String idPrefix() {
        return idPrefix;
    }

    /** The name used in the plant description's {@code alarms} section, e.g. {@code "stale_sensor"}. */
    public String key() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The kind an alarm id belongs to, from its prefix. */
    public static java.util.Optional<AlarmKind> ofId(String alarmId) {
        for (AlarmKind kind : values()) {
            if (alarmId.startsWith(kind.idPrefix) && alarmId.length() > kind.idPrefix.length()) {
                return java.util.Optional.of(kind);
            }
        }
        return java.util.Optional.empty();
    }

    /** Whether its condition is a value against a limit, so that a limit and a deadband apply. */
    public boolean hasLimit() {
        return this == CLOSURE || this == GLOBAL_TEST || this == SUSPECT_SENSOR || this == FROZEN_SENSOR
                || this == ERRATIC_SENSOR || this == SILENT_UNIT;
    }

    /** Whether a deadband applies (the limit kinds, and the range check, whose limits are the sensor's). */
    public boolean hasDeadband() {
        return hasLimit() || this == OUT_OF_RANGE;
    }
}
