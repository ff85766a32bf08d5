package org.steamtally.dashboard.store;

/**
 * The store answered and refused the points for good (e.g. a field stored earlier with another
 * type); sending them again would fail again, so they are counted and not spooled.
 */
public class PointsRejectedException extends Exception {

    public PointsRejectedException(String message, Throwable cause) {
        super(message, cause);
    }
}
