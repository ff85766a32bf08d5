package org.steamtally.calc.alarm;

/**
 * An operator action that cannot be applied: an unknown alarm, an action the alarm's state does not
 * allow (acknowledging a normal alarm, unshelving one that is not shelved), or a missing user or
 * reason. The message names the alarm, its state and what was expected; nothing is changed.
 */
public final class AlarmActionException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    public AlarmActionException(String message) {
        super(message);
    }
}
