package org.steamtally.dashboard.store;

import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.util.Objects;

/**
 * One shift: a half-open interval {@code start ≤ t < end} of real time. Its length is whatever the
 * wall clock gives, so the night shift across a daylight-saving change lasts 7 or 9 hours.
 *
 * @param date  the local date on which the shift starts
 * @param name  the shift's name in the calendar, e.g. {@code night}
 */
public record Shift(LocalDate date, String name, Instant start, Instant end) {

    public Shift {
        Objects.requireNonNull(date, "date");
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(start, "start");
        Objects.requireNonNull(end, "end");
        if (!end.isAfter(start)) {
            throw new IllegalArgumentException("shift " + name + " of " + date + " ends at " + end
                    + ", not after its start " + start);
        }
    }

    /** The shift's length in real (elapsed) time. */
    public Duration length() {
        return Duration.between(start, end);
    }

    /** Whether {@code t} lies in the shift. */
    public boolean contains(Instant t) {
        return !t.isBefore(start) && t.isBefore(end);
    }
}
