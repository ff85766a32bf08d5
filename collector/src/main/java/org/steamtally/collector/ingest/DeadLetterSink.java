package org.steamtally.collector.ingest;

/**
 * Where refused payloads go for later inspection, e.g. an MQTT topic. Called on the ingest worker;
 * an implementation must not block (drop and count instead) and must not throw.
 */
@FunctionalInterface
public interface DeadLetterSink {

    /** A sink that keeps nothing. */
    DeadLetterSink NONE = (topic, payload, reason, message) -> { };

    /**
     * @param topic   the topic the payload arrived on
     * @param payload the payload as it arrived; empty when it was too large to keep
     * @param reason  the first reason it was refused
     * @param message one sentence on why
     */
    void refused(String topic, byte[] payload, RejectionReason reason, String message);
}
