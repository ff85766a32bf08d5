package org.steamtally.collector.mqtt;

import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.function.UnaryOperator;
import javax.net.SocketFactory;
import org.eclipse.paho.mqttv5.client.IMqttToken;
import org.eclipse.paho.mqttv5.client.MqttActionListener;
import org.eclipse.paho.mqttv5.client.MqttAsyncClient;
import org.eclipse.paho.mqttv5.client.MqttCallback;
import org.eclipse.paho.mqttv5.client.MqttConnectionOptions;
import org.eclipse.paho.mqttv5.client.MqttDisconnectResponse;
import org.eclipse.paho.mqttv5.client.persist.MemoryPersistence;
import org.eclipse.paho.mqttv5.common.MqttException;
import org.eclipse.paho.mqttv5.common.MqttMessage;
import org.eclipse.paho.mqttv5.common.MqttSubscription;
import org.eclipse.paho.mqttv5.common.packet.MqttProperties;
import org.steamtally.collector.config.CollectorSettings;

/** {@link MessageSource} over MQTT 5 (Eclipse Paho {@code org.eclipse.paho.mqttv5.client}). */
final class Mqtt5Source extends ReconnectingSource {

    /** MQTT 5.0, 3.9.3: SUBACK reason codes from 0x80 on are failures. */
    private static final int FIRST_FAILURE_CODE = 0x80;

    private final MqttAsyncClient client;
    private final MqttConnectionOptions options;
    private final MqttActionListener sideRelease = new MqttActionListener() {
        @Override
        public void onSuccess(IMqttToken asyncActionToken) {
            sideDone();
        }

        @Override
        public void onFailure(IMqttToken asyncActionToken, Throwable exception) {
            sideDone();
        }
    };

    Mqtt5Source(CollectorSettings settings, List<String> filters, ConnectionWatch watch, Backoff backoff,
                UnaryOperator<String> environment) throws MqttException {
        super(settings, filters, watch, backoff);
        client = new MqttAsyncClient(settings.brokerUrls().get(0), settings.clientId(), new MemoryPersistence());
        options = new MqttConnectionOptions();
        options.setServerURIs(settings.brokerUrls().toArray(new String[0]));
        options.setAutomaticReconnect(false);
        long expiry = settings.sessionExpiry().toSeconds();
        options.setCleanStart(expiry == 0);
        options.setSessionExpiryInterval(expiry);
        options.setConnectionTimeout(HANDSHAKE_TIMEOUT_S);
        options.setKeepAliveInterval(30);
        settings.username().ifPresent(u -> options.setUserName(new String(u.resolve(environment))));
        settings.password().ifPresent(p -> options.setPassword(
                new String(p.resolve(environment)).getBytes(StandardCharsets.UTF_8)));
        TlsSockets.socketFactory(settings, environment).<SocketFactory>map(tls -> tls)
                .or(() -> BufferedSockets.forBrokers(settings.brokerUrls())).ifPresent(options::setSocketFactory);
        client.setCallback(new Callback());
    }

    @Override
    protected void connectAndSubscribe() throws Exception {
        client.connect(options).waitForCompletion(HANDSHAKE_TIMEOUT_MS);
        List<String> subscribed = subscribedFilters();
        MqttSubscription[] subs = new MqttSubscription[subscribed.size()];
        for (int i = 0; i < subs.length; i++) {
            subs[i] = new MqttSubscription(subscribed.get(i), QOS_AT_LEAST_ONCE);
        }
        IMqttToken token = client.subscribe(subs);
        token.waitForCompletion(HANDSHAKE_TIMEOUT_MS);
        int[] codes = token.getReasonCodes();
        for (int i = 0; codes != null && i < codes.length; i++) {
            if (codes[i] >= FIRST_FAILURE_CODE) {
                throw new IllegalStateException("broker refused the subscription to "
                        + subscribed.get(Math.min(i, subscribed.size() - 1)) + " with reason code 0x"
                        + Integer.toHexString(codes[i]));
            }
        }
    }

    @Override
    protected void publishAsync(String topic, byte[] payload, int qos) throws MqttException {
        MqttMessage message = new MqttMessage(payload);
        message.setQos(qos);
        client.publish(topic, message, null, sideRelease);
    }

    @Override
    protected void disconnect() throws MqttException {
        if (client.isConnected()) {
            client.disconnect().waitForCompletion(HANDSHAKE_TIMEOUT_MS);
        }
    }

    @Override
    protected void closeClient() throws MqttException {
        client.close();
    }

    @Override
    protected String currentServerUri() {
        return client.getCurrentServerURI();
    }

    private final class Callback implements MqttCallback {
        @Override
        public void messageArrived(String topic, MqttMessage message) {
            arrived(topic, message.getPayload());
        }

        @Override
        public void disconnected(MqttDisconnectResponse response) {
            lost(response.getException() != null ? response.getException()
                    : new IllegalStateException("broker disconnected: reason code " + response.getReturnCode()
                    + (response.getReasonString() == null ? "" : " " + response.getReasonString())));
        }

        @Override
        public void mqttErrorOccurred(MqttException exception) {
            // Followed by disconnected() when it ends the connection.
        }

        @Override
        public void deliveryComplete(IMqttToken token) {
        }

        @Override
        public void connectComplete(boolean reconnect, String serverURI) {
        }

        @Override
        public void authPacketArrived(int reasonCode, MqttProperties properties) {
        }
    }
}
