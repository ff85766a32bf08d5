package org.steamtally.calc.alarm;

import java.time.Instant;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;
import java.util.Set;

/**
 * The whole state of one unit's alarm engine, as plain values the store can serialise, for
 * {@link AlarmEngine#restore} after a restart.
 *
 * @param unitId  the unit
 * @param takenAt when it was taken
 * @param alarms  every alarm the engine knew, ids unique
 */
public record AlarmEngineState(String unitId, Instant takenAt, List<AlarmRecord> alarms) {

    public AlarmEngineState {
        Objects.requireNonNull(unitId, "unitId");
        Objects.requireNonNull(takenAt, "takenAt");
        alarms = List.copyOf(alarms);
        Set<String> ids = new HashSet<>();
        for (AlarmRecord a : alarms) {
            if (!ids.add(a.id())) {
                throw new IllegalArgumentException("alarm " + a.id() + " appears twice in the state of unit " + unitId);
            }
        }
    }
}
