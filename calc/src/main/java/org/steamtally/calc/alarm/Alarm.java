package org.steamtally.calc.alarm;

import java.time.Instant;
import java.util.Optional;
import java.util.OptionalDouble;

import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.Sensor;

/**
 * One alarm's mutable state inside the engine: the deadband and debounce filters, the ISA-18.2
 * state, and the last inputs, kept as primitives and references so that an evaluation allocates
 * nothing unless the state changes. Confined to the engine's thread.
 */
final class Alarm {

    final String id;
    final AlarmKind kind;
    /** The closure, state, component or sensor id the alarm is about. */
    final String subject;
    /** The sensor, for the sensor kinds when the unit has it; else null. */
    final Sensor sensor;
    /** For {@link AlarmKind#CALCULATION_INVALID}: a state (true) or a component (false). */
    final boolean aboutState;
    AlarmDefinition definition;
    long onDelayMs;
    long offDelayMs;

    AlarmState state = AlarmState.NORMAL;
    Instant stateSince;
    /** After the deadband, before the delays. */
    boolean pending;
    long pendingSinceMs;
    /** After the delays: the alarm condition. */
    boolean condition;
    Shelf shelf;
    ServiceRemoval removal;
    /** The epoch of the last evaluation that listed this alarm's subject. */
    int seen;

    // Last inputs, for events and texts.
    double value;
    boolean hasValue;
    double limit;
    boolean hasLimit;
    double residualW;
    double sigmaW;
    SuspectInput suspect;
    boolean listed;
    String reason;
    Snapshot.SensorStatus status;
    /** For {@link AlarmKind#SILENT_UNIT}: the sensors without a good value, of how many. */
    int silentSensors;
    int sensorCount;
    /** The text of a restored record, until a new input arrives. */
    String restoredText;

    Alarm(String id, AlarmKind kind, String subject, Sensor sensor, boolean aboutState, AlarmDefinition definition,
          Instant createdAt) {
        this.id = id;
        this.kind = kind;
        this.subject = subject;
        this.sensor = sensor;
        this.aboutState = aboutState;
        this.stateSince = createdAt;
        this.pendingSinceMs = createdAt.toEpochMilli();
        define(definition);
    }

    void define(AlarmDefinition d) {
        definition = d;
        onDelayMs = d.onDelay().toMillis();
        offDelayMs = d.offDelay().toMillis();
    }

    /**
     * Feeds the condition after the deadband. Returns true when the debounced condition changes,
     * i.e. when the new value has held for the on-delay (or, clear, for the off-delay).
     */
    boolean observe(long nowMs, boolean on) {
        restoredText = null;
        if (on != pending) {
            pending = on;
            pendingSinceMs = nowMs;
        }
        if (pending != condition && nowMs - pendingSinceMs >= (pending ? onDelayMs : offDelayMs)) {
            condition = pending;
            return true;
        }
        return false;
    }

    /** The input cannot be evaluated: keep the condition as it is and drop any change under way. */
    void hold(long nowMs) {
        if (pending != condition) {
            pending = condition;
            pendingSinceMs = nowMs;
        }
    }

    /** Whether the value is at or beyond a high limit, with the deadband once it is. */
    boolean above(double v, double lim, double deadband) {
        return pending ? v > lim - deadband : v >= lim;
    }

    void value(double v, double lim) {
        value = v;
        hasValue = Double.isFinite(v);
        limit = lim;
        hasLimit = Double.isFinite(lim);
    }

    void noValue() {
        hasValue = false;
        hasLimit = false;
    }

    OptionalDouble valueOrEmpty() {
        return hasValue ? OptionalDouble.of(value) : OptionalDouble.empty();
    }

    OptionalDouble limitOrEmpty() {
        return hasLimit ? OptionalDouble.of(limit) : OptionalDouble.empty();
    }

    AlarmRecord record(Optional<String> suppression) {
        return new AlarmRecord(id, kind, definition.priority(), state, stateSince, condition, pending,
                Instant.ofEpochMilli(pendingSinceMs), valueOrEmpty(), limitOrEmpty(), AlarmText.of(this),
                Optional.ofNullable(suspect), Optional.ofNullable(shelf), Optional.ofNullable(removal),
                state.followsCondition() ? Optional.empty() : suppression);
    }
}
