package org.steamtally.dashboard.alarm;

/** An alarm id that is not on the board. */
public final class UnknownAlarmException extends RuntimeException {

    public UnknownAlarmException(String alarmId) {
        super("no alarm with id '" + alarmId + "'; GET /api/v1/units/{unit}/alarms lists the current ones");
    }
}
