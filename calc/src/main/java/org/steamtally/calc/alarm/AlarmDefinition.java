package org.steamtally.calc.alarm;

import java.time.Duration;
import java.util.Objects;

/**
 * How one alarm, or every alarm of a kind, is raised and cleared.
 *
 * <p>The condition is filtered twice. The deadband (hysteresis): a value-against-limit alarm becomes
 * active when the value reaches {@code limit} and clears only when it falls below
 * {@code limit - deadband}, so noise near the limit does not toggle it. The debounce: the filtered
 * condition must hold without interruption for {@code onDelay} before the alarm becomes active, and
 * be clear for {@code offDelay} before it clears.
 *
 * <p>What {@code limit} and {@code deadband} mean depends on the kind:
 * <ul>
 * <li>closure: |z| (normalised residual), deadband in z;</li>
 * <li>global test: a factor on the reconciliation's χ² quantile (1.0 alarms at the quantile), the
 *     deadband in the same factor;</li>
 * <li>suspect sensor: |test value| of the individual test, deadband in the same;</li>
 * <li>out of range: no limit (0; the sensor's plausible range is the limit), deadband as a fraction
 *     of the range's span, below 0.5;</li>
 * <li>frozen sensor: seconds unchanged, deadband in seconds;</li>
 * <li>erratic sensor: a factor on the scatter ratio's quantile (1.0 alarms at it), deadband in the
 *     same factor;</li>
 * <li>silent unit: the share of the unit's sensors without a good value, above 0 and at most 1
 *     (1.0: all of them), deadband in the same share;</li>
 * <li>stale sensor and calculation invalid: yes/no conditions, limit and deadband 0.</li>
 * </ul>
 *
 * @param enabled  whether the alarm exists at all; a disabled alarm is never evaluated
 * @param priority its priority
 * @param onDelay  how long the condition must hold before the alarm is raised, ≥ 0
 * @param offDelay how long the condition must be clear before the alarm clears, ≥ 0
 * @param limit    see above, ≥ 0
 * @param deadband see above, ≥ 0 and below the limit where there is one
 */
public record AlarmDefinition(boolean enabled, AlarmPriority priority, Duration onDelay, Duration offDelay,
                              double limit, double deadband) {

    public AlarmDefinition {
        Objects.requireNonNull(priority, "priority");
        Objects.requireNonNull(onDelay, "onDelay");
        Objects.requireNonNull(offDelay, "offDelay");
        if (onDelay.isNegative() || offDelay.isNegative()) {
            throw new IllegalArgumentException("on-delay " + onDelay + " and off-delay " + offDelay
                    + " must not be negative");
        }
        if (!(limit >= 0.0) || !Double.isFinite(limit) || !(deadband >= 0.0) || !Double.isFinite(deadband)) {
            throw new IllegalArgumentException("limit " + limit + " and deadband " + deadband
                    + " must be finite and not negative");
        }
        if (limit > 0.0 && !(deadband < limit)) {
            throw new IllegalArgumentException("deadband " + deadband + " must be below the limit " + limit
                    + ", else the alarm could never clear");
        }
    }

    /** The same definition with another limit. */
    public AlarmDefinition withLimit(double newLimit) {
        return new AlarmDefinition(enabled, priority, onDelay, offDelay, newLimit, deadband);
    }

    /** The same definition with another deadband. */
    public AlarmDefinition withDeadband(double newDeadband) {
        return new AlarmDefinition(enabled, priority, onDelay, offDelay, limit, newDeadband);
    }

    /** The same definition with another priority. */
    public AlarmDefinition withPriority(AlarmPriority newPriority) {
        return new AlarmDefinition(enabled, newPriority, onDelay, offDelay, limit, deadband);
    }

    /** The same definition with other delays. */
    public AlarmDefinition withDelays(Duration newOnDelay, Duration newOffDelay) {
        return new AlarmDefinition(enabled, priority, newOnDelay, newOffDelay, limit, deadband);
    }

    /** The same definition, enabled or not. */
    public AlarmDefinition withEnabled(boolean newEnabled) {
        return new AlarmDefinition(newEnabled, priority, onDelay, offDelay, limit, deadband);
    }

    /** Checks that the limit and deadband make sense for the kind. */
    void checkFor(AlarmKind kind, String where) {
        if (kind.hasLimit() && !(limit > 0.0)) {
            throw new IllegalArgumentException(where + ": a " + kind.key() + " alarm needs a positive limit, was " + limit);
        }
        if (!kind.hasLimit() && limit != 0.0) {
            throw new IllegalArgumentException(where + ": a " + kind.key()
                    + " alarm has no limit of its own (the sensor's range or a yes/no condition), was " + limit);
        }
        if (!kind.hasDeadband() && deadband != 0.0) {
            throw new IllegalArgumentException(where + ": a " + kind.key()
                    + " alarm is a yes/no condition without a deadband, was " + deadband);
        }
        if (kind == AlarmKind.OUT_OF_RANGE && !(deadband < 0.5)) {
            throw new IllegalArgumentException(where + ": the out-of-range deadband is a fraction of the range's span"
                    + " and must be below 0.5, was " + deadband);
        }
        if (kind == AlarmKind.SILENT_UNIT && limit > 1.0) {
            throw new IllegalArgumentException(where + ": the silent-unit limit is a share of the unit's sensors"
                    + " and must be at most 1 (all of them), was " + limit);
        }
    }
}
