package org.steamtally.collector.mqtt;

import java.time.Duration;
import java.util.concurrent.atomic.AtomicLong;
import org.eclipse.paho.client.mqttv3.DisconnectedBufferOptions;
import org.eclipse.paho.client.mqttv3.IMqttActionListener;
import org.eclipse.paho.client.mqttv3.IMqttToken;
import org.eclipse.paho.client.mqttv3.MqttAsyncClient;
import org.eclipse.paho.client.mqttv3.MqttConnectOptions;
import org.eclipse.paho.client.mqttv3.MqttException;
import org.eclipse.paho.client.mqttv3.MqttMessage;
import org.eclipse.paho.client.mqttv3.persist.MemoryPersistence;

/** {@link ReadingPublisher} over MQTT 3.1.1. */
final class Mqtt3Publisher implements ReadingPublisher {

    private final MqttAsyncClient client;
    private final MqttConnectOptions connectOptions;
    private final PublishWindow window;
    private final AtomicLong completed = new AtomicLong();
    private final AtomicLong failed = new AtomicLong();
    private final IMqttActionListener release = new IMqttActionListener() {
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

    Mqtt3Publisher(PublisherOptions options) {
        window = new PublishWindow(options.window());
        try {
            client = new MqttAsyncClient(options.brokerUrls().get(0), options.clientId(), new MemoryPersistence());
            connectOptions = new MqttConnectOptions();
            connectOptions.setMqttVersion(MqttConnectOptions.MQTT_VERSION_3_1_1);
            connectOptions.setServerURIs(options.brokerUrls().toArray(new String[0]));
            connectOptions.setCleanSession(options.cleanStart());
            connectOptions.setAutomaticReconnect(false);
            connectOptions.setConnectionTimeout(ReconnectingSource.HANDSHAKE_TIMEOUT_S);
            // The client's own limit sits at the window, so the window is what stops a publisher first.
            connectOptions.setMaxInflight(options.window());
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
        client.connect(connectOptions).waitForCompletion(ReconnectingSource.HANDSHAKE_TIMEOUT_S * 1000L);
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
