package org.steamtally.collector.mqtt;

import java.util.concurrent.TimeUnit;

/**
 * Bounds the publications in flight: {@link #acquire} before handing one to the client, {@link #release}
 * from its completion callback. Kept at or below the client's in-flight limit so that Paho never
 * refuses a publication with "too many publishes in progress" (32202), which in Paho 1.2.5 loses the
 * message id it had already taken: after about 65,000 such losses every id is gone and each publish
 * fails with 32001. The limit may be lowered after connecting, when an MQTT 5 broker announces a
 * smaller receive maximum.
 */
final class PublishWindow {

    private int limit;
    private int inFlight;

    PublishWindow(int limit) {
        if (limit < 1 || limit > 65_535) {
            throw new IllegalArgumentException("publish window must lie within 1 to 65535, was " + limit);
        }
        this.limit = limit;
    }

    /** Waits for room, at most {@code timeoutMillis}; false on timeout. */
    synchronized boolean acquire(long timeoutMillis) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(timeoutMillis);
        while (inFlight >= limit) {
            long left = deadline - System.nanoTime();
            if (left <= 0) {
                return false;
            }
            wait(Math.max(1, TimeUnit.NANOSECONDS.toMillis(left)));
        }
        inFlight++;
        return true;
    }

    synchronized void release() {
        if (inFlight > 0) {
            inFlight--;
        }
        notifyAll();
    }

    synchronized void lowerLimit(int newLimit) {
        if (newLimit >= 1 && newLimit < limit) {
            limit = newLimit;
        }
    }

    synchronized int inFlight() {
        return inFlight;
    }

    synchronized int limit() {
        return limit;
    }

    /** Waits until nothing is in flight, at most {@code timeoutMillis}; false on timeout. */
    synchronized boolean awaitEmpty(long timeoutMillis) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(timeoutMillis);
        while (inFlight > 0) {
            long left = deadline - System.nanoTime();
            if (left <= 0) {
                return false;
            }
            wait(Math.max(1, TimeUnit.NANOSECONDS.toMillis(left)));
        }
        return true;
    }
}
