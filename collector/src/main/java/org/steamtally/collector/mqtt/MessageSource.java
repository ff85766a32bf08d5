package org.steamtally.collector.mqtt;

/**
 * Where the collector's messages come from: one broker connection, MQTT 5 or 3.1.1, that stays
 * subscribed to the plant's topics, reconnecting and resubscribing on its own after a loss. The rest of
 * the collector sees only this interface; {@link MessageSources#open} picks the implementation.
 */
public interface MessageSource extends AutoCloseable {

    /** Receives each message; called on the MQTT client's thread, must not block and must not throw. */
    @FunctionalInterface
    interface MessageHandler {
        void onMessage(String topic, byte[] payload);
    }

    /**
     * Starts connecting in the background and hands every message that arrives to {@code handler}.
     * Returns at once; failures are retried with backoff and reported through the listener.
     */
    void start(MessageHandler handler);

    /** The connection's state now. */
    ConnectionState state();

    /**
     * Publishes without waiting, e.g. to a dead-letter topic: false when not connected or when too many
     * such publications are still in flight, in which case nothing is sent.
     */
    boolean tryPublish(String topic, byte[] payload, int qos);

    /**
     * Disconnects, keeping the broker-side session (a persistent session goes on queueing QoS 1
     * readings until its expiry), and releases the client.
     */
    @Override
    void close();
}
