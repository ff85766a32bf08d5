package org.steamtally.collector.mqtt;

import org.eclipse.paho.client.mqttv3.IMqttActionListener;
import org.eclipse.paho.client.mqttv3.IMqttToken;
import org.eclipse.paho.client.mqttv3.MqttAsyncClient;
import org.eclipse.paho.client.mqttv3.MqttConnectOptions;
import org.eclipse.paho.client.mqttv3.MqttException;
import org.eclipse.paho.client.mqttv3.MqttMessage;
import org.eclipse.paho.client.mqttv3.persist.MemoryPersistence;

/** {@link ReadingPublisher} over MQTT 3.1.1. */
final class Mqtt3Publisher extends WindowedPublisher {

    private final MqttAsyncClient client;
    private final MqttConnectOptions connectOptions;
    private final IMqttActionListener release = new IMqttActionListener() {
        @Override
        public void onSuccess(IMqttToken token) {
            ((Outcome) token.getUserContext()).succeeded();
        }

        @Override
        public void onFailure(IMqttToken token, Throwable exception) {
            ((Outcome) token.getUserContext()).failed();
        }
    };

    Mqtt3Publisher(PublisherOptions options) {
        super(options);
        try {
            client = new MqttAsyncClient(options.brokerUrls().get(0), options.clientId(), new MemoryPersistence());
            connectOptions = new MqttConnectOptions();
            connectOptions.setMqttVersion(MqttConnectOptions.MQTT_VERSION_3_1_1);
            connectOptions.setServerURIs(options.brokerUrls().toArray(new String[0]));
            BufferedSockets.forBrokers(options.brokerUrls()).ifPresent(connectOptions::setSocketFactory);
            connectOptions.setCleanSession(options.cleanStart());
            connectOptions.setAutomaticReconnect(false);
            connectOptions.setConnectionTimeout(ReconnectingSource.HANDSHAKE_TIMEOUT_S);
            // The client's own limit sits at the window, so the window is what stops a publisher first.
            connectOptions.setMaxInflight(options.window());
            connectClient();
        } catch (MqttException e) {
            throw new IllegalStateException("publisher cannot connect to " + options.brokerUrls() + ": " + e, e);
        }
    }

    @Override
    protected void connectClient() throws MqttException {
        client.connect(connectOptions).waitForCompletion(ReconnectingSource.HANDSHAKE_TIMEOUT_MS);
    }

    @Override
    protected void send(String topic, byte[] payload, int qos) throws MqttException {
        MqttMessage message = new MqttMessage(payload);
        message.setQos(qos);
        client.publish(topic, message, outcome(), release);
    }

    @Override
    protected boolean isNotConnected(Exception e) {
        return e instanceof MqttException m && (m.getReasonCode() == MqttException.REASON_CODE_CLIENT_NOT_CONNECTED
                || m.getReasonCode() == MqttException.REASON_CODE_CONNECTION_LOST);
    }

    @Override
    public boolean isConnected() {
        return client.isConnected();
    }

    @Override
    protected void disconnectAndCloseClient() throws MqttException {
        if (client.isConnected()) {
            client.disconnect().waitForCompletion(ReconnectingSource.HANDSHAKE_TIMEOUT_MS);
        }
        client.close();
    }
}
