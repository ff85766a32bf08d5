package org.steamtally.collector.mqtt;

import java.time.Duration;

/**
 * Publishes readings for the simulator and the load drivers, with the publications in flight bounded
 * by a window that each completion (PUBACK for QoS 1, the write for QoS 0) releases, so that it can
 * publish any number of messages without exhausting the client's message ids.
 * {@link ReadingPublishers#connect} picks MQTT 5 or 3.1.1.
 */
public interface ReadingPublisher extends AutoCloseable {

    /**
     * Publishes one message, waiting while the window is full.
     *
     * @throws InterruptedException  when interrupted while waiting
     * @throws IllegalStateException when the window stays full for {@link #STALL_TIMEOUT} or the client
     *                               refuses the message (the reason is in the message)
     */
    void publish(String topic, byte[] payload, int qos) throws InterruptedException;

    /** Publications handed to the client and not yet completed. */
    int inFlight();

    /** Publications completed successfully so far. */
    long completed();

    /** Publications that failed after they were handed to the client. */
    long failed();

    /** Waits until nothing is in flight; false when {@code timeout} passed first. */
    boolean awaitIdle(Duration timeout) throws InterruptedException;

    /** True while connected to the broker. */
    boolean isConnected();

    /** Connects again after a loss (automatic reconnect is off, so a test can order events). */
    void reconnect();

    /** Disconnects and releases the client. */
    @Override
    void close();

    /** How long {@link #publish} waits for room before it gives up. */
    Duration STALL_TIMEOUT = Duration.ofSeconds(60);
}
