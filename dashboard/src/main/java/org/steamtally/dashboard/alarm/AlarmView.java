package org.steamtally.dashboard.alarm;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * One alarm as the dashboard shows it.
 *
 * @param id           unique on the board
 * @param unitId       the unit it belongs to
 * @param priority     its priority
 * @param state        its ISA-18.2 state
 * @param message      what is wrong, for the operator
 * @param since        when it last became active
 * @param sensorId     for a suspect-sensor alarm, the sensor
 * @param biasSi       for a suspect-sensor alarm, the estimated bias in the sensor's SI unit
 * @param biasUnit     the SI unit of {@code biasSi}
 * @param balances     for a suspect-sensor alarm, the balances the sensor takes part in
 * @param shelvedUntil when shelved, when it returns
 * @param shelveReason when shelved, the operator's reason
 */
public record AlarmView(String id, String unitId, Priority priority, State state, String message, Instant since,
                        Optional<String> sensorId, OptionalDouble biasSi, Optional<String> biasUnit,
                        List<String> balances, Optional<Instant> shelvedUntil, Optional<String> shelveReason) {

    public AlarmView {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(unitId, "unitId");
        Objects.requireNonNull(priority, "priority");
        Objects.requireNonNull(state, "state");
        Objects.requireNonNull(message, "message");
        Objects.requireNonNull(since, "since");
        balances = List.copyOf(balances);
        if (biasSi.isPresent() && !Double.isFinite(biasSi.getAsDouble())) {
            throw new IllegalArgumentException("alarm " + id + ": bias must be finite, was " + biasSi.getAsDouble());
        }
        if ((state == State.SHELVED) != shelvedUntil.isPresent()) {
            throw new IllegalArgumentException("alarm " + id + ": a return time is given exactly when shelved");
        }
    }

    /** A copy in another state. */
    public AlarmView with(State newState, Optional<Instant> until, Optional<String> reason) {
        return new AlarmView(id, unitId, priority, newState, message, since, sensorId, biasSi, biasUnit, balances,
                until, reason);
    }

    /** Alarm priority, most urgent first. */
    public enum Priority {
        HIGH, MEDIUM, LOW;

        public String key() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }

    /** Alarm states after ISA-18.2 (ANSI/ISA-18.2-2016, clause 11, the alarm state transition diagram). */
    public enum State {
        /** Active and not yet acknowledged. */
        UNACKNOWLEDGED,
        /** Active and acknowledged. */
        ACKNOWLEDGED,
        /** Returned to normal before it was acknowledged. */
        RETURNED_UNACKNOWLEDGED,
        /** Shelved by an operator for a limited time. */
        SHELVED,
        /** Suppressed by design (e.g. the unit is off line). */
        SUPPRESSED_BY_DESIGN,
        /** Taken out of service by maintenance. */
        OUT_OF_SERVICE;

        public String key() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }
}
