package org.steamtally.dashboard.store;

import java.time.Instant;

/**
 * Events of the store that the alarm side and the logs act on. Called from the store's own threads;
 * implementations return quickly and do not throw.
 */
public interface StoreListener {

    /** A listener that ignores everything. */
    StoreListener NONE = new StoreListener() {
    };

    /**
     * The spool was full and dropped its oldest points.
     *
     * @param points       points dropped now
     * @param totalDropped points dropped since the store was opened
     */
    default void spoolDropped(long points, long totalDropped, Instant at) {
    }

    /** Writes fail; points go to the spool until the store answers again. */
    default void storeUnavailable(String reason, Instant at) {
    }

    /** The store answers again and the spool has been replayed into it. */
    default void storeRecovered(Instant at) {
    }

    /** The store refused points for good (they are counted and not retried). */
    default void pointsRejected(long points, String reason, Instant at) {
    }
}
