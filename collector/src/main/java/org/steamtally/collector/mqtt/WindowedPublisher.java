package org.steamtally.collector.mqtt;

import java.time.Duration;
import java.util.ArrayDeque;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;

/**
 * What the MQTT 5 and 3.1.1 publishers share: the {@link PublishWindow}, the counts and the offline
 * buffer. A publication made while disconnected is held here (its window slot with it, so the buffer is
 * bounded by the window) and sent by {@link #reconnect}; Paho's own offline buffer works only together
 * with its automatic reconnect, which would take the order of events out of the caller's hands.
 */
abstract class WindowedPublisher implements ReadingPublisher {

    private record Held(String topic, byte[] payload, int qos) {
    }

    protected final PublishWindow window;
    private final boolean bufferOffline;
    private final ArrayDeque<Held> held = new ArrayDeque<>();
    private final AtomicLong completed = new AtomicLong();
    private final AtomicLong failed = new AtomicLong();

    WindowedPublisher(PublisherOptions options) {
        this.window = new PublishWindow(options.window());
        this.bufferOffline = options.bufferOffline();
    }

    /** Hands one publication to the client; the completion must call {@link #done}. */
    protected abstract void send(String topic, byte[] payload, int qos) throws Exception;

    /** True when {@code e} says the client is not connected. */
    protected abstract boolean isNotConnected(Exception e);

    protected abstract void connectClient() throws Exception;

    /** Disconnects if connected (waiting at most the handshake timeout) and releases the client for good. */
    protected abstract void disconnectAndCloseClient() throws Exception;

    /** The completion callback: releases the window slot. */
    protected final void done(boolean success) {
        (success ? completed : failed).incrementAndGet();
        window.release();
    }

    /** A new {@link Outcome} for one publication, to pass to the client as the token's user context. */
    protected final Outcome outcome() {
        return new Outcome();
    }

    /**
     * What became of one publication, reported once. With a persistent session Paho fails the token
     * of a QoS 1 publication in flight when the connection is lost, then sends the publication again
     * after the reconnect and reports the same token's success: counted once, as completed, and its
     * window slot released once (at the failure, so that the window cannot stall on a lost connection).
     */
    protected final class Outcome {
        private static final int PENDING = 0;
        private static final int SUCCEEDED = 1;
        private static final int FAILED = 2;
        private final AtomicInteger state = new AtomicInteger(PENDING);

        public void succeeded() {
            if (state.compareAndSet(PENDING, SUCCEEDED)) {
                done(true);
            } else if (state.compareAndSet(FAILED, SUCCEEDED)) {
                failed.decrementAndGet();
                completed.incrementAndGet();
            }
        }

        public void failed() {
            if (state.compareAndSet(PENDING, FAILED)) {
                done(false);
            }
        }
    }

    @Override
    public void publish(String topic, byte[] payload, int qos) throws InterruptedException {
        if (!window.acquire(STALL_TIMEOUT.toMillis())) {
            throw new IllegalStateException("no publication completed within " + STALL_TIMEOUT.toSeconds()
                    + " s: " + window.inFlight() + " in flight");
        }
        synchronized (held) {
            if (bufferOffline && (!isConnected() || !held.isEmpty())) {
                held.add(new Held(topic, payload, qos));
                return;
            }
        }
        try {
            send(topic, payload, qos);
        } catch (Exception e) {
            if (bufferOffline && isNotConnected(e)) {
                synchronized (held) {
                    held.add(new Held(topic, payload, qos));
                }
                return;
            }
            window.release();
            throw new IllegalStateException("publish to " + topic + " refused: " + e, e);
        }
    }

    @Override
    public void reconnect() {
        try {
            connectClient();
        } catch (Exception e) {
            throw new IllegalStateException("publisher cannot reconnect: " + e, e);
        }
        synchronized (held) {
            while (!held.isEmpty()) {
                Held h = held.peek();
                try {
                    send(h.topic(), h.payload(), h.qos());
                    held.poll();
                } catch (Exception e) {
                    throw new IllegalStateException("held publication to " + h.topic() + " refused: " + e, e);
                }
            }
        }
    }

    @Override
    public void close() {
        try {
            disconnectAndCloseClient();
        } catch (Exception e) {
            // Nothing more to release.
        }
    }

    @Override
    public int inFlight() {
        return window.inFlight();
    }

    @Override
    public long completed() {
        return completed.get();
    }

    @Override
    public long failed() {
        return failed.get();
    }

    @Override
    public boolean awaitIdle(Duration timeout) throws InterruptedException {
        return window.awaitEmpty(timeout.toMillis());
    }
}
