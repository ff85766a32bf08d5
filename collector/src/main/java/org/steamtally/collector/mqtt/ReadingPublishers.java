package org.steamtally.collector.mqtt;

import org.steamtally.collector.config.MqttProtocol;

/** Connects a {@link ReadingPublisher}. */
public final class ReadingPublishers {

    private ReadingPublishers() {
    }

    /**
     * Connects a publisher, blocking until connected.
     *
     * @throws IllegalStateException when it cannot connect
     */
    public static ReadingPublisher connect(PublisherOptions options) {
        return options.protocol() == MqttProtocol.MQTT_5 ? new Mqtt5Publisher(options) : new Mqtt3Publisher(options);
    }
}
