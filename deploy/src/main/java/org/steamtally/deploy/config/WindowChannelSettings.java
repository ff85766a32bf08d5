package org.steamtally.deploy.config;

import java.time.Duration;
import java.util.EnumMap;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import org.steamtally.calc.alarm.AlarmDefinition;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.reconcile.WindowRule;

/**
 * The window channel of the daemon: the reconciliation of the mean of the last {@code length} of
 * snapshots beside the per-snapshot one, with its own alarms. Read from {@code alarms.window} of the
 * plant description (docs/ALARMS.md); {@link #DEFAULTS} when absent.
 *
 * <p>The window alarms are of the three kinds a window mean can say something about: closure, global
 * test and suspect sensor. Stale, out-of-range and invalid-calculation alarms belong to the single
 * snapshot and are switched off in {@link #alarms()}, so that the window channel never repeats them.
 *
 * @param enabled whether the channel runs at all
 * @param length  how much plant time the mean covers, {@link #MIN_LENGTH} to {@link #MAX_LENGTH}; the
 *                daemon turns it into a count of snapshots with the collector's snapshot period
 * @param alarms  the window alarms' settings: one definition per kind, the three window kinds as
 *                configured, every other kind disabled; no overrides
 * @param minGoodShare the share of the window's periods that must be held, and have good values of
 *                every balance sensor, for the mean to be reconciled ({@link WindowRule}), in (0, 1];
 *                below it the verdict is withheld
 */
public record WindowChannelSettings(boolean enabled, Duration length, AlarmSettings alarms, double minGoodShare) {

    /** The kinds the window channel raises. */
    public static final Set<AlarmKind> KINDS = Set.of(AlarmKind.CLOSURE, AlarmKind.GLOBAL_TEST, AlarmKind.SUSPECT_SENSOR);

    /** 50 s: the length docs/DETECTION.md calibrated (a 3σ bias on a well-checked sensor raised within 60 s). */
    public static final Duration LENGTH_DEFAULT = Duration.ofSeconds(50);
    /** Below two snapshots at 1 Hz the window is the per-snapshot channel again. */
    public static final Duration MIN_LENGTH = Duration.ofSeconds(2);
    /**
     * Ten minutes: the window keeps one compiled reconciliation per count of samples it meets while
     * it fills, and a longer mean assumes a steady plant for longer than load changes allow.
     */
    public static final Duration MAX_LENGTH = Duration.ofMinutes(10);

    /**
     * Closure on window means: |z| ≥ 4.5, P = 2(1 − Φ(4.5)) = 6.8e-6 per snapshot; successive means
     * share all but one reading, so the on-delay no longer filters noise and the limit must
     * (docs/DETECTION.md, limits for window means).
     */
    public static final AlarmDefinition CLOSURE_DEFAULT = AlarmSettings.CLOSURE_DEFAULT.withLimit(4.5);
    /** Global test on window means: 3.0 × the χ² quantile (for 5 degrees of freedom P = 3.4e-6). */
    public static final AlarmDefinition GLOBAL_TEST_DEFAULT = AlarmSettings.GLOBAL_TEST_DEFAULT.withLimit(3.0);
    /** Suspect sensor on window means: |test value| ≥ 4.0, P = 2(1 − Φ(4)) = 6.3e-5 per sensor. */
    public static final AlarmDefinition SUSPECT_DEFAULT = AlarmSettings.SUSPECT_DEFAULT.withLimit(4.0);

    /** The channel on, 50 s, with the calibrated limits. */
    public static final WindowChannelSettings DEFAULTS = new WindowChannelSettings(true, LENGTH_DEFAULT,
            alarmSettings(Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT));

    public WindowChannelSettings {
        Objects.requireNonNull(length, "length");
        Objects.requireNonNull(alarms, "alarms");
        if (!(minGoodShare > 0.0 && minGoodShare <= 1.0)) {
            throw new IllegalArgumentException("the window's min_good_share must be above 0 and at most 1, was "
                    + minGoodShare);
        }
        if (length.compareTo(MIN_LENGTH) < 0 || length.compareTo(MAX_LENGTH) > 0) {
            throw new IllegalArgumentException("the window's length must be between " + MIN_LENGTH.toSeconds()
                    + " s and " + MAX_LENGTH.toMinutes() + " min, was " + length);
        }
        for (AlarmKind kind : AlarmKind.values()) {
            if (!KINDS.contains(kind) && alarms.definition(kind).enabled()) {
                throw new IllegalArgumentException("the window channel raises no " + kind.key()
                        + " alarms (the per-snapshot channel does); its definition must be disabled");
            }
        }
        if (!alarms.overrides().isEmpty()) {
            throw new IllegalArgumentException("the window channel takes no per-alarm overrides, got "
                    + alarms.overrides().keySet());
        }
    }

    /** The settings with the default {@link WindowRule#MIN_GOOD_SHARE_DEFAULT}. */
    public WindowChannelSettings(boolean enabled, Duration length, AlarmSettings alarms) {
        this(enabled, length, alarms, WindowRule.MIN_GOOD_SHARE_DEFAULT);
    }

    /** These settings with the channel switched on or off. */
    public WindowChannelSettings withEnabled(boolean on) {
        return new WindowChannelSettings(on, length, alarms, minGoodShare);
    }

    /** These settings with another minimum good share. */
    public WindowChannelSettings withMinGoodShare(double share) {
        return new WindowChannelSettings(enabled, length, alarms, share);
    }

    /** When a window of snapshots {@code period} apart is representative enough to be reconciled. */
    public WindowRule rule(Duration period) {
        return new WindowRule(minGoodShare, period);
    }

    /** The window kinds' defaults. */
    public static AlarmDefinition defaultOf(AlarmKind kind) {
        return switch (kind) {
            case CLOSURE -> CLOSURE_DEFAULT;
            case GLOBAL_TEST -> GLOBAL_TEST_DEFAULT;
            case SUSPECT_SENSOR -> SUSPECT_DEFAULT;
            default -> throw new IllegalArgumentException("the window channel has no " + kind.key() + " alarms");
        };
    }

    /**
     * Alarm settings for the window engine: the given window kinds over their defaults, every other
     * kind disabled.
     */
    public static AlarmSettings alarmSettings(Map<AlarmKind, AlarmDefinition> windowKinds, Duration maxShelve) {
        EnumMap<AlarmKind, AlarmDefinition> kinds = AlarmSettings.defaultKinds();
        for (AlarmKind kind : AlarmKind.values()) {
            kinds.put(kind, KINDS.contains(kind) ? windowKinds.getOrDefault(kind, defaultOf(kind))
                    : kinds.get(kind).withEnabled(false));
        }
        return new AlarmSettings(kinds, Map.of(), maxShelve);
    }

    /** The window's length in snapshots of {@code period}, rounded to the nearest, at least 1. */
    public int snapshots(Duration period) {
        if (period.isZero() || period.isNegative()) {
            throw new IllegalArgumentException("snapshot period must be positive, was " + period);
        }
        return (int) Math.max(1, Math.round((double) length.toMillis() / period.toMillis()));
    }
}
