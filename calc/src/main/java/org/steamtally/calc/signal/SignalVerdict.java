package org.steamtally.calc.signal;

import java.util.Locale;

/** The outcome of one test of a sensor's own signal. */
public enum SignalVerdict {
    /** Too few readings, or nothing learned yet: the test says nothing (its statistic is 0). */
    NOT_DECIDED,
    /** The statistic is below its limit. */
    PASS,
    /** The statistic is at or above its limit. */
    FAIL;

    /** The name in the result record, e.g. {@code "not_decided"}. */
    public String key() {
        return name().toLowerCase(Locale.ROOT);
    }
}
