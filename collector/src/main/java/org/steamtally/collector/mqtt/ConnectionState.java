package org.steamtally.collector.mqtt;

/** Where a connection to the broker stands. */
public enum ConnectionState {
    /** Not started, or waiting for the next attempt after a failure or a loss. */
    DISCONNECTED,
    /** An attempt to connect and subscribe is under way. */
    CONNECTING,
    /** Connected and subscribed: readings flow. */
    CONNECTED,
    /** Closed for good. */
    CLOSED
}
