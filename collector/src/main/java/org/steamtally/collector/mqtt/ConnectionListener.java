package org.steamtally.collector.mqtt;

import java.time.Duration;
import java.util.Optional;

/**
 * Told about a {@link MessageSource}'s connection. Called on the source's own thread; an
 * implementation returns quickly and does not throw.
 */
public interface ConnectionListener {

    /** A listener that does nothing. */
    ConnectionListener NONE = new ConnectionListener() { };

    /**
     * The state changed.
     *
     * @param state the new state
     * @param cause why the connection went down or an attempt failed, when known
     */
    default void stateChanged(ConnectionState state, Optional<Throwable> cause) {
    }

    /**
     * The connection has been down longer than the configured threshold: worth an alarm, since no
     * reading arrives. Raised once per outage; {@link #stateChanged} with {@link ConnectionState#CONNECTED}
     * ends it.
     *
     * @param down how long it has been down so far
     */
    default void downTooLong(Duration down) {
    }
}
