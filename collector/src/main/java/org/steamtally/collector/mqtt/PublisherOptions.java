package org.steamtally.collector.mqtt;

import java.util.List;
import java.util.Objects;
import org.steamtally.collector.config.MqttProtocol;

/**
 * How a {@link ReadingPublisher} (simulator, load driver) connects.
 *
 * @param brokerUrls   broker URLs, tried in order
 * @param protocol     MQTT 5 or 3.1.1
 * @param clientId     the client id
 * @param window       publications in flight at most, 1 to 65535 (the MQTT packet-id space)
 * @param cleanStart   false to keep the session, so that unacknowledged QoS 1 publications are sent
 *                     again after a reconnect
 * @param bufferOffline publications made while disconnected are held (within the window) and sent on
 *                      reconnect, instead of failing
 */
public record PublisherOptions(List<String> brokerUrls, MqttProtocol protocol, String clientId, int window,
                               boolean cleanStart, boolean bufferOffline) {

    /** A window well inside every broker's and client's limits, yet wide enough for loopback rates. */
    public static final int DEFAULT_WINDOW = 1000;

    public PublisherOptions {
        brokerUrls = List.copyOf(brokerUrls);
        if (brokerUrls.isEmpty()) {
            throw new IllegalArgumentException("at least one broker URL is needed");
        }
        Objects.requireNonNull(protocol, "protocol");
        Objects.requireNonNull(clientId, "clientId");
        if (window < 1 || window > 65_535) {
            throw new IllegalArgumentException("publish window must lie within 1 to 65535, was " + window);
        }
    }

    /** A clean, unbuffered publisher with {@link #DEFAULT_WINDOW}. */
    public static PublisherOptions of(String brokerUrl, MqttProtocol protocol, String clientId) {
        return new PublisherOptions(List.of(brokerUrl), protocol, clientId, DEFAULT_WINDOW, true, false);
    }
}
