package org.steamtally.calc.alarm;

import java.util.Locale;

/**
 * The alarm states of ISA-18.2 (ANSI/ISA-18.2-2016, the alarm state transition diagram, states A to
 * G; IEC 62682 uses the same states). Latching alarms are not used here.
 */
public enum AlarmState {
    /** A: the condition is clear and nothing awaits acknowledgement. */
    NORMAL,
    /** B: the condition is active and the operator has not acknowledged it. */
    ACTIVE_UNACKNOWLEDGED,
    /** C: the condition is active and acknowledged. */
    ACTIVE_ACKNOWLEDGED,
    /** D: the condition has cleared but the operator has not yet acknowledged the alarm. */
    RETURNED_UNACKNOWLEDGED,
    /** E: an operator has set the alarm aside for a limited time, naming who and why. */
    SHELVED,
    /** F: suppressed by design: plant-state logic hides it, e.g. balance alarms while the unit is off. */
    SUPPRESSED_BY_DESIGN,
    /** G: removed from service, e.g. for the repair of its instrument, naming who and why. */
    OUT_OF_SERVICE;

    /** The name in events and the store, e.g. {@code "active_unacknowledged"}. */
    public String key() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Whether the alarm is shown to the operator as needing attention (B, C or D). */
    public boolean isAnnunciated() {
        return this == ACTIVE_UNACKNOWLEDGED || this == ACTIVE_ACKNOWLEDGED || this == RETURNED_UNACKNOWLEDGED;
    }

    /** Whether the state follows the condition (A to D), rather than being held by an operator or by design. */
    public boolean followsCondition() {
        return this == NORMAL || isAnnunciated();
    }
}
