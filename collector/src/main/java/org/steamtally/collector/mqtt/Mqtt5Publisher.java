package org.steamtally.collector.mqtt;

import org.eclipse.paho.mqttv5.client.IMqttToken;
import org.eclipse.paho.mqttv5.client.MqttActionListener;
import org.eclipse.paho.mqttv5.client.MqttAsyncClient;
import org.eclipse.paho.mqttv5.client.MqttClientException;
import org.eclipse.paho.mqttv5.client.MqttConnectionOptions;
import org.eclipse.paho.mqttv5.client.persist.MemoryPersistence;
import org.eclipse.paho.mqttv5.common.MqttException;
import org.eclipse.paho.mqttv5.common.MqttMessage;

/** {@link ReadingPublisher} over MQTT 5. */
final class Mqtt5Publisher extends WindowedPublisher {

    private final MqttAsyncClient client;
    private final MqttConnectionOptions connectOptions;
    private final MqttActionListener release = new MqttActionListener() {
        @Override
        public void onSuccess(IMqttToken token) {
            ((Outcome) token.getUserContext()).succeeded();
        }

        @Override
        public void onFailure(IMqttToken token, Throwable exception) {
            ((Outcome) token.getUserContext()).failed();
        }
    };

    Mqtt5Publisher(PublisherOptions options) {
        super(options);
        try {
            client = new MqttAsyncClient(options.brokerUrls().get(0), options.clientId(), new MemoryPersistence());
            connectOptions = new MqttConnectionOptions();
            connectOptions.setServerURIs(options.brokerUrls().toArray(new String[0]));
            BufferedSockets.forBrokers(options.brokerUrls()).ifPresent(connectOptions::setSocketFactory);
            connectOptions.setCleanStart(options.cleanStart());
            connectOptions.setSessionExpiryInterval(options.cleanStart() ? 0L : 3600L);
            connectOptions.setAutomaticReconnect(false);
            connectOptions.setConnectionTimeout(ReconnectingSource.HANDSHAKE_TIMEOUT_S);
            connectClient();
        } catch (MqttException e) {
            throw new IllegalStateException("publisher cannot connect to " + options.brokerUrls() + ": " + e, e);
        }
    }

    @Override
    protected void connectClient() throws MqttException {
        IMqttToken token = client.connect(connectOptions);
        token.waitForCompletion(ReconnectingSource.HANDSHAKE_TIMEOUT_MS);
        // MQTT 5.0, 3.2.2.3.3: the broker says how many QoS 1 and 2 publications it takes at once.
        Integer receiveMaximum = token.getResponseProperties() == null ? null
                : token.getResponseProperties().getReceiveMaximum();
        if (receiveMaximum != null) {
            window.lowerLimit(receiveMaximum);
        }
    }

    @Override
    protected void send(String topic, byte[] payload, int qos) throws MqttException {
        MqttMessage message = new MqttMessage(payload);
        message.setQos(qos);
        client.publish(topic, message, outcome(), release);
    }

    @Override
    protected boolean isNotConnected(Exception e) {
        return e instanceof MqttException m && (m.getReasonCode() == MqttClientException.REASON_CODE_CLIENT_NOT_CONNECTED
                || m.getReasonCode() == MqttClientException.REASON_CODE_CONNECTION_LOST);
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
