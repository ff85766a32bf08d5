package org.steamtally.calc.alarm;

import java.time.Instant;
import java.util.Objects;

/**
 * Why, by whom and until when an alarm is shelved. ISA-18.2 requires shelving to be time-limited and
 * recorded with who and why.
 *
 * @param user      who shelved it
 * @param reason    why, in the operator's words
 * @param shelvedAt when
 * @param until     when the shelf expires and the alarm returns, after {@code shelvedAt}
 */
public record Shelf(String user, String reason, Instant shelvedAt, Instant until) {

    public Shelf {
        AlarmText.requireGiven(user, "user");
        AlarmText.requireGiven(reason, "reason");
        Objects.requireNonNull(shelvedAt, "shelvedAt");
        Objects.requireNonNull(until, "until");
        if (!until.isAfter(shelvedAt)) {
            throw new IllegalArgumentException("a shelf must end after it starts: shelved at " + shelvedAt
                    + ", until " + until);
        }
    }
}
