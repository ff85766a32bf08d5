package org.steamtally.dashboard.alarm;

import java.time.Duration;
import java.util.List;
import java.util.function.Consumer;
import org.steamtally.dashboard.push.LiveResults;

/**
 * The alarms the dashboard shows and the operator actions on them (ISA-18.2 states). The alarm
 * engine implements it; {@link InMemoryAlarmBoard} is a plain implementation for tests and demos.
 * Every action names the user who took it; the HTTP layer has already checked that the user is an
 * operator and writes the audit entry.
 */
public interface AlarmBoard {

    /** The alarms of one unit that are not in the normal state, most urgent first. */
    List<AlarmView> list(String unitId);

    /**
     * Acknowledges an alarm.
     *
     * @throws UnknownAlarmException     if there is no such alarm
     * @throws AlarmActionException      if the alarm's state does not allow it
     */
    AlarmView acknowledge(String alarmId, String user);

    /**
     * Shelves an alarm for {@code duration}, after which it returns by itself.
     *
     * @param duration how long, positive and at most the board's limit
     * @param reason   why, as the operator wrote it, not blank
     */
    AlarmView shelve(String alarmId, Duration duration, String reason, String user);

    /** Returns a shelved alarm to service before its time is up. */
    AlarmView unshelve(String alarmId, String user);

    /** Calls {@code listener} with every change of an alarm of {@code unitId}. */
    LiveResults.Subscription subscribe(String unitId, Consumer<AlarmView> listener);
}
