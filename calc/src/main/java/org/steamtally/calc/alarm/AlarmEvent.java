package org.steamtally.calc.alarm;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * One transition of one alarm's state: the alarm journal's entry. Every change of state produces
 * exactly one event; nothing else does.
 *
 * @param time     when it happened
 * @param unitId   the unit the alarm belongs to
 * @param alarmId  the alarm, e.g. {@code "closure:cycle"}
 * @param kind     what the alarm watches
 * @param priority the alarm's priority at the time
 * @param from     the state before
 * @param to       the state after
 * @param stimulus what caused it
 * @param value    the watched value at the time, in SI or as a normalised figure (z, χ², test value);
 *                 empty for the yes/no kinds and when no value was known
 * @param limit    the limit the value is compared against, in the same unit; empty where none applies
 * @param user     who acted, for an operator action; empty otherwise
 * @param note     the operator's reason or remark (required for shelve and remove from service), or
 *                 the suppression's reason; empty otherwise
 * @param text     one sentence for the operator saying what the alarm is about, e.g. the sensor, its
 *                 estimated bias and uncertainty, or why a state is invalid
 */
public record AlarmEvent(
        Instant time,
        String unitId,
        String alarmId,
        AlarmKind kind,
        AlarmPriority priority,
        AlarmState from,
        AlarmState to,
        AlarmStimulus stimulus,
        OptionalDouble value,
        OptionalDouble limit,
        Optional<String> user,
        Optional<String> note,
        String text) {

    public AlarmEvent {
        Objects.requireNonNull(time, "time");
        Objects.requireNonNull(unitId, "unitId");
        Objects.requireNonNull(alarmId, "alarmId");
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(priority, "priority");
        Objects.requireNonNull(from, "from");
        Objects.requireNonNull(to, "to");
        Objects.requireNonNull(stimulus, "stimulus");
        Objects.requireNonNull(value, "value");
        Objects.requireNonNull(limit, "limit");
        Objects.requireNonNull(user, "user");
        Objects.requireNonNull(note, "note");
        Objects.requireNonNull(text, "text");
        if (value.isPresent() && !Double.isFinite(value.getAsDouble())
                || limit.isPresent() && !Double.isFinite(limit.getAsDouble())) {
            throw new IllegalArgumentException("alarm " + alarmId + ": value " + value + " and limit " + limit
                    + " must be finite when given");
        }
        if (stimulus.isOperatorAction() != user.isPresent()) {
            throw new IllegalArgumentException("alarm " + alarmId + ": a user is named exactly for an operator action, not for "
                    + stimulus.key());
        }
    }
}
