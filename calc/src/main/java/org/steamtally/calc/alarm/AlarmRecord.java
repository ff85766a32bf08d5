package org.steamtally.calc.alarm;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * Everything the engine knows about one alarm at one moment: what the dashboard shows and what the
 * store keeps so that the engine can be restored after a restart ({@link AlarmEngine#restore}).
 *
 * @param id               the alarm id, e.g. {@code "stale:TT-101"}
 * @param kind             what it watches; agrees with the id's prefix
 * @param priority         its priority under the settings in force when the record was taken
 * @param state            its ISA-18.2 state
 * @param stateSince       when it entered that state
 * @param conditionActive  the debounced condition: whether the alarm condition is present
 * @param pendingCondition the condition after the deadband but before the delays; differs from
 *                         {@code conditionActive} while an on- or off-delay is running
 * @param pendingSince     when {@code pendingCondition} last changed
 * @param value            the last value seen (see {@link AlarmEvent#value()}); empty when none
 * @param limit            the limit it was compared with; empty when none
 * @param text             one sentence on what the alarm is about, as of the last value
 * @param suspect          for a suspect-sensor alarm, the reconciliation's last word on the sensor
 *                         (kept for the text after a restore); empty for other kinds and before
 *                         the sensor was first named
 * @param shelf            the shelf, present exactly when the state is {@link AlarmState#SHELVED}
 * @param removal          the removal, present exactly when the state is {@link AlarmState#OUT_OF_SERVICE}
 * @param suppression      why its kind is suppressed by design, when it is; always present in
 *                         {@link AlarmState#SUPPRESSED_BY_DESIGN}
 */
public record AlarmRecord(
        String id,
        AlarmKind kind,
        AlarmPriority priority,
        AlarmState state,
        Instant stateSince,
        boolean conditionActive,
        boolean pendingCondition,
        Instant pendingSince,
        OptionalDouble value,
        OptionalDouble limit,
        String text,
        Optional<SuspectInput> suspect,
        Optional<Shelf> shelf,
        Optional<ServiceRemoval> removal,
        Optional<String> suppression) {

    public AlarmRecord {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(priority, "priority");
        Objects.requireNonNull(state, "state");
        Objects.requireNonNull(stateSince, "stateSince");
        Objects.requireNonNull(pendingSince, "pendingSince");
        Objects.requireNonNull(value, "value");
        Objects.requireNonNull(limit, "limit");
        Objects.requireNonNull(text, "text");
        Objects.requireNonNull(suspect, "suspect");
        Objects.requireNonNull(shelf, "shelf");
        Objects.requireNonNull(removal, "removal");
        Objects.requireNonNull(suppression, "suppression");
        if (AlarmKind.ofId(id).orElse(null) != kind) {
            throw new IllegalArgumentException("alarm id \"" + id + "\" does not belong to kind " + kind.key()
                    + " (its ids start with \"" + kind.idPrefix() + "\")");
        }
        if (suspect.isPresent() && (kind != AlarmKind.SUSPECT_SENSOR || !id.endsWith(":" + suspect.get().sensorId()))) {
            throw new IllegalArgumentException("alarm " + id + " carries the suspect input of sensor "
                    + suspect.get().sensorId() + ": only a suspect alarm carries one, of its own sensor");
        }
        if ((state == AlarmState.SHELVED) != shelf.isPresent()) {
            throw new IllegalArgumentException("alarm " + id + " in state " + state.key()
                    + ": a shelf is recorded exactly when it is shelved");
        }
        if ((state == AlarmState.OUT_OF_SERVICE) != removal.isPresent()) {
            throw new IllegalArgumentException("alarm " + id + " in state " + state.key()
                    + ": a removal is recorded exactly when it is out of service");
        }
        if (state == AlarmState.SUPPRESSED_BY_DESIGN && suppression.isEmpty()
                || state.followsCondition() && suppression.isPresent()) {
            throw new IllegalArgumentException("alarm " + id + " in state " + state.key()
                    + ": a suppression is recorded when suppressed by design and never in states A to D");
        }
        boolean wantsActive = state == AlarmState.ACTIVE_UNACKNOWLEDGED || state == AlarmState.ACTIVE_ACKNOWLEDGED;
        if (state.followsCondition() && wantsActive != conditionActive) {
            throw new IllegalArgumentException("alarm " + id + " in state " + state.key() + " must have its condition "
                    + (wantsActive ? "active" : "clear"));
        }
        if (value.isPresent() && !Double.isFinite(value.getAsDouble())
                || limit.isPresent() && !Double.isFinite(limit.getAsDouble())) {
            throw new IllegalArgumentException("alarm " + id + ": value and limit must be finite when given");
        }
    }
}
