package org.steamtally.collector.align;

/** What {@link SnapshotAligner#offer} did with a reading. */
public enum Offer {
    /** Kept: it is the newest value of its sensor for at least one snapshot not yet emitted. */
    ACCEPTED,
    /** The same sensor, instant and value as a reading already held: a redelivery, dropped. */
    DUPLICATE,
    /** The same sensor and instant as a reading already held but another value; the first one is kept. */
    CONFLICT,
    /** Older than a reading already held for every snapshot it could still enter: it changes nothing. */
    SUPERSEDED,
    /** Time-stamped further ahead of the aligner's clock than the allowed lateness: refused. */
    AHEAD,
    /** NaN or infinite: refused. */
    NOT_FINITE,
    /** Outside the sensor's plausible range: refused, so that the sensor turns stale rather than wrong. */
    IMPLAUSIBLE;

    /** True when the reading was kept. */
    public boolean kept() {
        return this == ACCEPTED;
    }
}
