package org.steamtally.collector.mqtt;

import java.util.Arrays;
import java.util.List;
import java.util.function.UnaryOperator;
import javax.net.SocketFactory;
import org.eclipse.paho.client.mqttv3.IMqttActionListener;
import org.eclipse.paho.client.mqttv3.IMqttDeliveryToken;
import org.eclipse.paho.client.mqttv3.IMqttToken;
import org.eclipse.paho.client.mqttv3.MqttAsyncClient;
import org.eclipse.paho.client.mqttv3.MqttCallbackExtended;
import org.eclipse.paho.client.mqttv3.MqttConnectOptions;
import org.eclipse.paho.client.mqttv3.MqttException;
import org.eclipse.paho.client.mqttv3.MqttMessage;
import org.eclipse.paho.client.mqttv3.persist.MemoryPersistence;
import org.steamtally.collector.config.CollectorSettings;

/**
 * {@link MessageSource} over MQTT 3.1.1 (Eclipse Paho {@code org.eclipse.paho.client.mqttv3}). A 3.1.1
 * session has no expiry: with a session expiry above zero the session is persistent (clean session
 * false) and the broker keeps it as long as it is configured to.
 */
final class Mqtt3Source extends ReconnectingSource {

    /** MQTT 3.1.1, 3.9.3: SUBACK return code 0x80 is a failure. */
    private static final int FAILURE = 0x80;

    private final MqttAsyncClient client;
    private final MqttConnectOptions options;
    private final IMqttActionListener sideRelease = new IMqttActionListener() {
        @Override
        public void onSuccess(IMqttToken asyncActionToken) {
            sideDone();
        }

        @Override
        public void onFailure(IMqttToken asyncActionToken, Throwable exception) {
            sideDone();
        }
    };

    Mqtt3Source(CollectorSettings settings, List<String> filters, ConnectionWatch watch, Backoff backoff,
                UnaryOperator<String> environment) throws MqttException {
        super(settings, filters, watch, backoff);
        client = new MqttAsyncClient(settings.brokerUrls().get(0), settings.clientId(), new MemoryPersistence());
        options = new MqttConnectOptions();
        options.setMqttVersion(MqttConnectOptions.MQTT_VERSION_3_1_1);
        options.setServerURIs(settings.brokerUrls().toArray(new String[0]));
        options.setAutomaticReconnect(false);
        options.setCleanSession(settings.sessionExpiry().isZero());
        options.setConnectionTimeout(HANDSHAKE_TIMEOUT_S);
        options.setKeepAliveInterval(30);
        options.setMaxInflight(SIDE_PUBLISH_WINDOW);
        settings.username().ifPresent(u -> options.setUserName(new String(u.resolve(environment))));
        settings.password().ifPresent(p -> options.setPassword(p.resolve(environment)));
        TlsSockets.socketFactory(settings, environment).<SocketFactory>map(tls -> tls)
                .or(() -> BufferedSockets.forBrokers(settings.brokerUrls())).ifPresent(options::setSocketFactory);
        client.setCallback(new Callback());
    }

    @Override
    protected void connectAndSubscribe() throws Exception {
        client.connect(options).waitForCompletion(HANDSHAKE_TIMEOUT_MS);
        List<String> subscribed = subscribedFilters();
        int[] qos = new int[subscribed.size()];
        Arrays.fill(qos, QOS_AT_LEAST_ONCE);
        IMqttToken token = client.subscribe(subscribed.toArray(new String[0]), qos);
        token.waitForCompletion(HANDSHAKE_TIMEOUT_MS);
        int[] granted = token.getGrantedQos();
        for (int i = 0; granted != null && i < granted.length; i++) {
            if (granted[i] == FAILURE) {
                throw new IllegalStateException("broker refused the subscription to "
                        + subscribed.get(Math.min(i, subscribed.size() - 1)));
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

    private final class Callback implements MqttCallbackExtended {
        @Override
        public void messageArrived(String topic, MqttMessage message) {
            arrived(topic, message.getPayload());
        }

        @Override
        public void connectionLost(Throwable cause) {
            lost(cause);
        }

        @Override
        public void deliveryComplete(IMqttDeliveryToken token) {
        }

        @Override
        public void connectComplete(boolean reconnect, String serverURI) {
        }
    }
}
