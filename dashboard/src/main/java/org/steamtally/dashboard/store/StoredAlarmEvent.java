package org.steamtally.dashboard.store;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmState;

/**
 * One alarm event as the store keeps it (measurement {@code alarms}): a state transition of an alarm
 * in the ISA-18.2 sense, or an operator action on it (acknowledge, shelve, unshelve). The alarm
 * engine maps its own events to this record; the store never interprets the state names except
 * through {@code active}.
 *
 * @param timestamp instant of the event, stored to the millisecond
 * @param alarmId   the alarm's id within the unit (the id tag)
 * @param kind      what happened, e.g. {@code transition}, {@code acknowledge}, {@code shelve}
 * @param priority  the alarm's priority as the alarm engine names it
 * @param oldState  the state before the event
 * @param newState  the state after the event
 * @param active    whether the alarm condition is active after the event (counts towards the time
 *                  with alarms active in shift summaries)
 * @param value     the monitored value at the event, in the SI unit of its quantity, if any
 * @param limit     the limit it was compared with, same unit, if any
 * @param user      who acted, for operator actions
 * @param note      free text, e.g. the shelving reason
 */
public record StoredAlarmEvent(
        Instant timestamp,
        String site,
        String unit,
        String alarmId,
        String kind,
        String priority,
        String oldState,
        String newState,
        boolean active,
        OptionalDouble value,
        OptionalDouble limit,
        Optional<String> user,
        Optional<String> note) {

    public StoredAlarmEvent {
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(site, "site");
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(alarmId, "alarmId");
        if (alarmId.isEmpty()) {
            throw new IllegalArgumentException("alarm event at " + timestamp + ": the alarm id must not be empty");
        }
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(priority, "priority");
        Objects.requireNonNull(oldState, "oldState");
        Objects.requireNonNull(newState, "newState");
        Objects.requireNonNull(value, "value");
        Objects.requireNonNull(limit, "limit");
        Objects.requireNonNull(user, "user");
        Objects.requireNonNull(note, "note");
        requireFinite(value, "value", alarmId);
        requireFinite(limit, "limit", alarmId);
        timestamp = Instant.ofEpochMilli(timestamp.toEpochMilli());
    }

    /**
     * The one mapping from the alarm engine's event to the stored form: an operator action is stored
     * under its stimulus ({@code acknowledge}, {@code shelve}, ...), everything else as a
     * {@code transition}; the states and priority by their keys; {@code active} when the state after
     * is one of the active states (B or C of ISA-18.2), so that a shelved or suppressed alarm does not
     * count as active time.
     */
    public static StoredAlarmEvent of(String site, AlarmEvent e) {
        String kind = e.stimulus().isOperatorAction() ? e.stimulus().key() : "transition";
        boolean active = e.to() == AlarmState.ACTIVE_UNACKNOWLEDGED || e.to() == AlarmState.ACTIVE_ACKNOWLEDGED;
        return new StoredAlarmEvent(e.time(), site, e.unitId(), e.alarmId(), kind, e.priority().key(), e.from().key(),
                e.to().key(), active, e.value(), e.limit(), e.user(), e.note());
    }

    private static void requireFinite(OptionalDouble v, String name, String alarmId) {
        if (v.isPresent() && !Double.isFinite(v.getAsDouble())) {
            throw new IllegalArgumentException("alarm " + alarmId + ": " + name + " " + v.getAsDouble()
                    + " must be finite or empty");
        }
    }
}
