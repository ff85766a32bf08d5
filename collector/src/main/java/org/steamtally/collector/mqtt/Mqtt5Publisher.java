package org.steamtally.collector.mqtt;

import java.time.Duration;
import java.util.concurrent.atomic.AtomicLong;
import org.eclipse.paho.mqttv5.client.DisconnectedBufferOptions;
import org.eclipse.paho.mqttv5.client.IMqttToken;
import org.eclipse.paho.mqttv5.client.MqttActionListener;
import org.eclipse.paho.mqttv5.client.MqttAsyncClient;
import org.eclipse.paho.mqttv5.client.MqttConnectionOptions;
import org.eclipse.paho.mqttv5.client.persist.MemoryPersistence;
import org.eclipse.paho.mqttv5.common.MqttException;
import org.eclipse.paho.mqttv5.common.MqttMessage;

/** {@link ReadingPublisher} over MQTT 5. */
final class Mqtt5Publisher implements ReadingPublisher {

    private final MqttAsyncClient client;
    private final MqttConnectionOptions connectOptions;
    private final PublishWindow window;
    private final AtomicLong completed = new AtomicLong();
    private final AtomicLong failed = new AtomicLong();
    private final MqttActionListener release = new MqttActionListener() {
        @Override
        public void onSuccess(IMqttToken token) {
            completed.incrementAndGet();
            window.release();
        }

        @Override
        public void onFailure(IMqttToken token, Throwable exception) {
            failed.incrementAndGet();
            window.release();
        }
    };

    Mqtt5Publisher(PublisherOptions options) {
        window = new PublishWindow(options.window());
        try {
            client = new MqttAsyncClient(options.brokerUrls().get(0), options.clientId(), new MemoryPersistence());
            connectOptions = new MqttConnectionOptions();
            connectOptions.setServerURIs(options.brokerUrls().toArray(new String[0]));
            connectOptions.setCleanStart(options.cleanStart());
            connectOptions.setSessionExpiryInterval(options.cleanStart() ? 0L : 3600L);
            connectOptions.setAutomaticReconnect(false);
            connectOptions.setConnectionTimeout(ReconnectingSource.HANDSHAKE_TIMEOUT_S);
            if (options.bufferOffline()) {
                DisconnectedBufferOptions buffer = new DisconnectedBufferOptions();
                buffer.setBufferEnabled(true);
                buffer.setBufferSize(options.window());
                buffer.setDeleteOldestMessages(false);
                buffer.setPersistBuffer(false);
                client.setBufferOpts(buffer);
            }
            connect();
        } catch (MqttException e) {
            throw new IllegalStateException("publisher cannot connect to " + options.brokerUrls() + ": " + e, e);
        }
    }

    private void connect() throws MqttException {
        IMqttToken token = client.connect(connectOptions);
        token.waitForCompletion(ReconnectingSource.HANDSHAKE_TIMEOUT_S * 1000L);
        // MQTT 5.0, 3.2.2.3.3: the broker says how many QoS 1 and 2 publications it takes at once.
        Integer receiveMaximum = token.getResponseProperties() == null ? null
                : token.getResponseProperties().getReceiveMaximum();
        if (receiveMaximum != null) {
            window.lowerLimit(receiveMaximum);
        }
    }

    @Override
    public void publish(String topic, byte[] payload, int qos) throws InterruptedException {
        if (!window.acquire(STALL_TIMEOUT.toMillis())) {
            throw new IllegalStateException("no publication completed within " + STALL_TIMEOUT.toSeconds()
                    + " s: " + window.inFlight() + " in flight");
        }
        MqttMessage message = new MqttMessage(payload);
        message.setQos(qos);
        try {
            client.publish(topic, message, null, release);
        } catch (MqttException | RuntimeException e) {
            window.release();
            throw new IllegalStateException("publish to " + topic + " refused: " + e, e);
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

    @Override
    public boolean isConnected() {
        return client.isConnected();
    }

    @Override
    public void reconnect() {
        try {
            connect();
        } catch (MqttException e) {
            throw new IllegalStateException("publisher cannot reconnect: " + e, e);
        }
    }

    @Override
    public void close() {
        try {
            if (client.isConnected()) {
                client.disconnect().waitForCompletion(ReconnectingSource.HANDSHAKE_TIMEOUT_S * 1000L);
            }
            client.close();
        } catch (MqttException | RuntimeException e) {
            // Nothing more to release.
        }
    }
}
