package org.steamtally.collector.mqtt;

import io.micrometer.core.instrument.MeterRegistry;
import java.time.Clock;
import java.util.List;
import java.util.function.UnaryOperator;
import java.util.random.RandomGenerator;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;

/** Opens the {@link MessageSource} the settings ask for: MQTT 5 or 3.1.1. */
public final class MessageSources {

    private MessageSources() {
    }

    /**
     * Creates a source, not yet connected; {@link MessageSource#start} connects it.
     *
     * @param settings    brokers, protocol, client id, credentials, TLS, session, reconnect delays
     * @param filters     the topic filters to subscribe to (e.g. {@code TopicMap.subscriptionFilters()})
     * @param listener    told about the connection and about outages longer than the threshold
     * @param registry    where the connection meters go
     * @param clock       for the outage threshold
     * @param environment looks up the environment variables that hold secrets ({@code System::getenv})
     * @throws IllegalStateException when a secret or TLS store cannot be read (the message names the
     *                               place, never the secret), or the client cannot be created
     */
    public static MessageSource open(CollectorSettings settings, List<String> filters, ConnectionListener listener,
                                     MeterRegistry registry, Clock clock, UnaryOperator<String> environment) {
        ConnectionWatch watch = new ConnectionWatch(clock, settings.downAlarmAfter(), listener, registry);
        Backoff backoff = new Backoff(settings.reconnectMin(), settings.reconnectMax(),
                RandomGenerator.getDefault());
        try {
            return settings.protocol() == MqttProtocol.MQTT_5
                    ? new Mqtt5Source(settings, filters, watch, backoff, environment)
                    : new Mqtt3Source(settings, filters, watch, backoff, environment);
        } catch (org.eclipse.paho.mqttv5.common.MqttException | org.eclipse.paho.client.mqttv3.MqttException e) {
            throw new IllegalStateException("MQTT client for " + settings.brokerUrls() + " cannot be created: "
                    + e.getMessage(), e);
        }
    }
}
