package org.steamtally.calc.plant;

import java.util.Objects;
import java.util.Optional;
import java.util.Set;

/**
 * One thing wrong with a plant description, found by {@link PlantValidator}.
 *
 * @param path     where, in the plant description's own key names, e.g.
 *                 {@code units[0].components[3].drain_outlet}; a loader maps it to a file position
 * @param kind     what sort of problem, so a loader can hold back follow-on problems
 * @param message  the reason, for a plant engineer, e.g.
 *                 {@code state "hp_heater_drain" named by component "hp_heater" (port drain_outlet) is not declared}
 * @param subjects ids of the sensors, states and components the problem is about
 * @param related  a second place the problem concerns (the first declaration of a duplicate), when any
 */
public record PlantProblem(String path, Kind kind, String message, Set<String> subjects, Optional<String> related) {

    /** What sort of problem. */
    public enum Kind {
        /** An id declared twice. */
        DUPLICATE,
        /** A name that refers to nothing declared, or to something of the wrong sort. */
        REFERENCE,
        /** A flowing state that does not leave exactly one component and enter exactly one. */
        CONNECTION,
        /** A state fix or check that lacks the measurement it needs. */
        MEASUREMENT,
        /** Flows that the measured flows and the balances cannot determine. */
        DETERMINABILITY
    }

    public PlantProblem {
        Objects.requireNonNull(path, "path");
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(message, "message");
        subjects = Set.copyOf(subjects);
        Objects.requireNonNull(related, "related");
    }

    @Override
    public String toString() {
        return path + ": " + message;
    }
}
