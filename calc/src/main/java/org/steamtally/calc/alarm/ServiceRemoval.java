package org.steamtally.calc.alarm;

import java.time.Instant;
import java.util.Objects;

/**
 * Why, by whom and since when an alarm is out of service (ISA-18.2 state G), e.g. while its
 * instrument is repaired. Unlike a shelf it has no end: someone returns it to service.
 *
 * @param user   who removed it
 * @param reason why, e.g. a work-order number
 * @param since  when
 */
public record ServiceRemoval(String user, String reason, Instant since) {

    public ServiceRemoval {
        AlarmText.requireGiven(user, "user");
        AlarmText.requireGiven(reason, "reason");
        Objects.requireNonNull(since, "since");
    }
}
