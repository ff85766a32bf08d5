package org.steamtally.collector.payload;

import java.util.Locale;
import java.util.Optional;

/** The quality a device or gateway attaches to a reading; a reading without one is {@link #GOOD}. */
public enum Quality {
    /** The instrument reports the value as valid. */
    GOOD("good"),
    /** The instrument reports the value as invalid; it must not enter a balance. */
    BAD("bad"),
    /** The value may be usable but the instrument is not sure (e.g. out of calibration, in manual). */
    UNCERTAIN("uncertain");

    private final String label;

    Quality(String label) {
        this.label = label;
    }

    /** The word used in payloads. */
    public String label() {
        return label;
    }

    /** The quality named by a payload word, ignoring case; empty for any other word. */
    public static Optional<Quality> fromLabel(String word) {
        String lower = word.toLowerCase(Locale.ROOT);
        for (Quality q : values()) {
            if (q.label.equals(lower)) {
                return Optional.of(q);
            }
        }
        return Optional.empty();
    }
}
