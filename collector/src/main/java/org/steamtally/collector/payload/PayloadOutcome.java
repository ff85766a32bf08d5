package org.steamtally.collector.payload;

import java.util.List;
import java.util.Objects;

/** What {@link PayloadParser#parse} made of one payload: its readings, or why none were taken. */
public sealed interface PayloadOutcome {

    /**
     * The payload's readings, in the order given; at least one.
     *
     * @param readings the readings
     */
    record Accepted(List<Reading> readings) implements PayloadOutcome {
        public Accepted {
            readings = List.copyOf(readings);
            if (readings.isEmpty()) {
                throw new IllegalArgumentException("an accepted payload carries at least one reading");
            }
        }
    }

    /**
     * The payload as a whole was refused; an array with one bad element is refused entirely, so that
     * a message is never half taken.
     *
     * @param reason  the kind of fault
     * @param message one short sentence for a log line, naming the field and, in an array, the element
     * @param excerpt the offending input, or its beginning, as printable text of at most
     *                {@link PayloadParser#EXCERPT_CHARS} characters
     */
    record Rejected(RejectReason reason, String message, String excerpt) implements PayloadOutcome {
        public Rejected {
            Objects.requireNonNull(reason, "reason");
            Objects.requireNonNull(message, "message");
            Objects.requireNonNull(excerpt, "excerpt");
        }
    }
}
