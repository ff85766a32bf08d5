package org.steamtally.calc.alarm;

import java.time.Duration;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;

import org.steamtally.calc.signal.SignalSettings;

/**
 * The alarm settings of a plant: one definition per kind, optional definitions for single alarms by
 * id, and the longest an operator may shelve an alarm. Read from the {@code alarms} section of the
 * plant description; {@link #DEFAULTS} where the section is absent. docs/ALARMS.md gives the reasons
 * for each default.
 *
 * @param kinds     one definition for every {@link AlarmKind}
 * @param overrides definitions for single alarms, by alarm id (e.g. {@code "closure:cycle"}); each
 *                  checked against the kind its id names
 * @param maxShelve the longest shelf an operator may set, &gt; 0
 * @param signal    how the signal check behind {@link AlarmKind#FROZEN_SENSOR} and
 *                  {@link AlarmKind#ERRATIC_SENSOR} is made: window, warm-up, declared noise and
 *                  resolution per sensor ({@link SignalSettings#DEFAULTS} unless given)
 */
public record AlarmSettings(Map<AlarmKind, AlarmDefinition> kinds, Map<String, AlarmDefinition> overrides,
                            Duration maxShelve, SignalSettings signal) {

    /**
     * Closure: raised at |z| ≥ 3, cleared below 2.5. For a normal residual whose uncertainty is
     * right, P(|z| ≥ 3) = 0.27 % per snapshot (two-sided normal tail, 2(1 − Φ(3))); the on-delay of
     * 10 s asks for ten snapshots in a row at 1 Hz, so a single noisy one, or the short mismatch of
     * a load step, raises nothing.
     */
    public static final AlarmDefinition CLOSURE_DEFAULT = new AlarmDefinition(true, AlarmPriority.MEDIUM,
            Duration.ofSeconds(10), Duration.ofSeconds(30), 3.0, 0.5);

    /** Global test: raised at the χ² quantile itself (factor 1.0), cleared below 0.9 of it. */
    public static final AlarmDefinition GLOBAL_TEST_DEFAULT = new AlarmDefinition(true, AlarmPriority.MEDIUM,
            Duration.ofSeconds(10), Duration.ofSeconds(30), 1.0, 0.1);

    /**
     * Suspect sensor: |test value| ≥ 1.96, the two-sided 95 % normal quantile (the individual test's
     * default level), cleared below 1.71; the off-delay of 60 s keeps a sensor whose test value
     * hovers near the quantile from leaving and re-entering the suspect list as separate alarms.
     */
    public static final AlarmDefinition SUSPECT_DEFAULT = new AlarmDefinition(true, AlarmPriority.HIGH,
            Duration.ofSeconds(10), Duration.ofSeconds(60), 1.96, 0.25);

    /** Stale sensor: the max age already allows for late messages; 5 s more rides out one late batch. */
    public static final AlarmDefinition STALE_DEFAULT = new AlarmDefinition(true, AlarmPriority.LOW,
            Duration.ofSeconds(5), Duration.ofSeconds(5), 0.0, 0.0);

    /** Out of range: deadband 2 % of the range's span, the value ISA-18.2 practice suggests for pressures. */
    public static final AlarmDefinition OUT_OF_RANGE_DEFAULT = new AlarmDefinition(true, AlarmPriority.MEDIUM,
            Duration.ofSeconds(5), Duration.ofSeconds(10), 0.0, 0.02);

    /** Calculation invalid: low, because the stale or out-of-range alarm of its sensor says the cause. */
    public static final AlarmDefinition CALCULATION_INVALID_DEFAULT = new AlarmDefinition(true, AlarmPriority.LOW,
            Duration.ofSeconds(10), Duration.ofSeconds(10), 0.0, 0.0);

    /**
     * Frozen sensor: unchanged for 60 s. At 1 Hz a live transmitter's reading changes every
     * snapshot; 60 s is six times the default max age, so a source that sends only on change, held
     * in the snapshot until its max age, goes stale long before it looks frozen. On-delay 0: the
     * limit is itself a time. Medium: a frozen reading looks plausible and the balances rarely see it.
     */
    public static final AlarmDefinition FROZEN_DEFAULT = new AlarmDefinition(true, AlarmPriority.MEDIUM,
            Duration.ZERO, Duration.ofSeconds(10), 60.0, 0.0);

    /**
     * Erratic sensor: the scatter ratio at the quantile of white noise for a false-alarm probability
     * of 1e-7 per snapshot and sensor (factor 1.0), cleared below 0.9 of it; on-delay 5 s, off-delay 30 s, half
     * the window over which a fault's differences linger. Low: the reading is noisy, not wrong on average.
     */
    public static final AlarmDefinition ERRATIC_DEFAULT = new AlarmDefinition(true, AlarmPriority.LOW,
            Duration.ofSeconds(5), Duration.ofSeconds(30), 1.0, 0.1);

    /**
     * Silent unit: every sensor without a good value (share 1.0), no deadband, so one good reading
     * ends it. The on-delay equals the stale alarms' own, so the unit's alarm is raised in the same
     * snapshot in which they would be, and they are suppressed before they are annunciated; a longer
     * one would let them raise first. Off-delay 10 s, the longest of the stale and calculation-invalid
     * off-delays, so that the alarms it suppressed have settled when it clears. Medium: every figure
     * of the unit is gone, but nothing in the plant is known to be wrong.
     */
    public static final AlarmDefinition SILENT_UNIT_DEFAULT = new AlarmDefinition(true, AlarmPriority.MEDIUM,
            Duration.ofSeconds(5), Duration.ofSeconds(10), 1.0, 0.0);

    /** The longest shelf by default: one shift, so that the next crew sees what was set aside. */
    public static final Duration MAX_SHELVE_DEFAULT = Duration.ofHours(8);

    /** The settings of a plant description without an {@code alarms} section. */
    public static final AlarmSettings DEFAULTS = new AlarmSettings(defaultKinds(), Map.of(), MAX_SHELVE_DEFAULT);

    /** Settings with the signal check's defaults. */
    public AlarmSettings(Map<AlarmKind, AlarmDefinition> kinds, Map<String, AlarmDefinition> overrides,
                         Duration maxShelve) {
        this(kinds, overrides, maxShelve, SignalSettings.DEFAULTS);
    }

    /** The same settings with another signal check. */
    public AlarmSettings withSignal(SignalSettings newSignal) {
        return new AlarmSettings(kinds, overrides, maxShelve, newSignal);
    }

    public AlarmSettings {
        Objects.requireNonNull(signal, "signal");
        EnumMap<AlarmKind, AlarmDefinition> all = new EnumMap<>(AlarmKind.class);
        all.putAll(kinds);
        for (AlarmKind kind : AlarmKind.values()) {
            AlarmDefinition d = all.get(kind);
            if (d == null) {
                throw new IllegalArgumentException("alarm settings lack a definition for " + kind.key());
            }
            d.checkFor(kind, kind.key());
        }
        kinds = java.util.Collections.unmodifiableMap(all);
        Map<String, AlarmDefinition> byId = new LinkedHashMap<>(overrides);
        byId.forEach((id, d) -> {
            AlarmKind kind = AlarmKind.ofId(id).orElseThrow(() -> new IllegalArgumentException("alarm id \"" + id
                    + "\" does not start with a kind's prefix (closure:, reconciliation:, suspect:, stale:, range:, invalid:, frozen:, erratic:, silent:)"));
            d.checkFor(kind, "alarm " + id);
        });
        overrides = java.util.Collections.unmodifiableMap(byId);
        Objects.requireNonNull(maxShelve, "maxShelve");
        if (maxShelve.isNegative() || maxShelve.isZero()) {
            throw new IllegalArgumentException("the longest shelf must be positive, was " + maxShelve);
        }
    }

    /** The defaults of every kind, in a map that may be changed. */
    public static EnumMap<AlarmKind, AlarmDefinition> defaultKinds() {
        EnumMap<AlarmKind, AlarmDefinition> kinds = new EnumMap<>(AlarmKind.class);
        kinds.put(AlarmKind.CLOSURE, CLOSURE_DEFAULT);
        kinds.put(AlarmKind.GLOBAL_TEST, GLOBAL_TEST_DEFAULT);
        kinds.put(AlarmKind.SUSPECT_SENSOR, SUSPECT_DEFAULT);
        kinds.put(AlarmKind.STALE_SENSOR, STALE_DEFAULT);
        kinds.put(AlarmKind.OUT_OF_RANGE, OUT_OF_RANGE_DEFAULT);
        kinds.put(AlarmKind.CALCULATION_INVALID, CALCULATION_INVALID_DEFAULT);
        kinds.put(AlarmKind.FROZEN_SENSOR, FROZEN_DEFAULT);
        kinds.put(AlarmKind.ERRATIC_SENSOR, ERRATIC_DEFAULT);
        kinds.put(AlarmKind.SILENT_UNIT, SILENT_UNIT_DEFAULT);
        return kinds;
    }

    /** The definition of every alarm of a kind that has no override. */
    public AlarmDefinition definition(AlarmKind kind) {
        return kinds.get(kind);
    }

    /** The definition of one alarm: its override, else its kind's. */
    public AlarmDefinition definitionOf(AlarmKind kind, String alarmId) {
        AlarmDefinition override = overrides.get(alarmId);
        return override != null ? override : kinds.get(kind);
    }
}
