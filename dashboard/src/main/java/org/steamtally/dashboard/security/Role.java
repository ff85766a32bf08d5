package org.steamtally.dashboard.security;

/** What a dashboard user may do. */
public enum Role {
    /** Reads everything, changes nothing. */
    VIEWER,
    /** Also acknowledges and shelves alarms. */
    OPERATOR;

    public String key() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}
