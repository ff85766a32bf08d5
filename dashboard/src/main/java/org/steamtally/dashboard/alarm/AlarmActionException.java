package org.steamtally.dashboard.alarm;

/** An action that the alarm's present state does not allow, e.g. acknowledging an acknowledged alarm. */
public final class AlarmActionException extends RuntimeException {

    public AlarmActionException(String message) {
        super(message);
    }
}
