package org.steamtally.dashboard.security;

import java.time.Instant;
import java.util.Objects;

/**
 * One operator action, for the audit trail.
 *
 * @param time   when
 * @param user   who
 * @param action what, e.g. {@code "alarm.shelve"}, {@code "login"}, {@code "login.failed"}
 * @param target on what, e.g. the alarm id
 * @param detail anything else worth keeping, e.g. the shelving reason and duration
 */
public record AuditEntry(Instant time, String user, String action, String target, String detail) {

    public AuditEntry {
        Objects.requireNonNull(time, "time");
        Objects.requireNonNull(user, "user");
        Objects.requireNonNull(action, "action");
        Objects.requireNonNull(target, "target");
        Objects.requireNonNull(detail, "detail");
    }
}
