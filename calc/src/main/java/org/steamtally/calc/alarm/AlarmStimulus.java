package org.steamtally.calc.alarm;

import java.util.Locale;

/** What caused a transition of an alarm's state. */
public enum AlarmStimulus {
    /** The debounced condition became active. */
    CONDITION_ACTIVE,
    /** The debounced condition cleared. */
    CONDITION_CLEARED,
    /** An operator acknowledged the alarm. */
    ACKNOWLEDGE,
    /** An operator shelved the alarm (or shelved it again for a new period). */
    SHELVE,
    /** An operator unshelved the alarm before its shelf expired. */
    UNSHELVE,
    /** The shelf's time ran out. */
    SHELF_EXPIRED,
    /** An operator removed the alarm from service. */
    REMOVE_FROM_SERVICE,
    /** An operator returned the alarm to service. */
    RETURN_TO_SERVICE,
    /** Plant-state logic began suppressing the alarm's kind. */
    SUPPRESS,
    /** Plant-state logic stopped suppressing the alarm's kind. */
    END_SUPPRESSION;

    /** The name in events and the store, e.g. {@code "shelf_expired"}. */
    public String key() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Whether an operator caused it, so that the event names the user. */
    public boolean isOperatorAction() {
        return this == ACKNOWLEDGE || this == SHELVE || this == UNSHELVE || this == REMOVE_FROM_SERVICE
                || this == RETURN_TO_SERVICE;
    }
}
