package org.steamtally.collector;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;

import java.nio.charset.StandardCharsets;
import java.util.UUID;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.TimeUnit;
import org.eclipse.paho.client.mqttv3.MqttConnectOptions;
import org.eclipse.paho.client.mqttv3.persist.MemoryPersistence;
import org.eclipse.paho.mqttv5.client.IMqttToken;
import org.eclipse.paho.mqttv5.client.MqttCallback;
import org.eclipse.paho.mqttv5.client.MqttConnectionOptions;
import org.eclipse.paho.mqttv5.client.MqttDisconnectResponse;
import org.eclipse.paho.mqttv5.common.MqttException;
import org.eclipse.paho.mqttv5.common.MqttMessage;
import org.eclipse.paho.mqttv5.common.packet.MqttProperties;
import org.junit.jupiter.api.Test;

/**
 * Checks that the MQTT broker of the test run carries a reading from a publisher to a subscriber.
 * This tests the service and the client libraries, not the collector itself.
 */
class MqttBrokerSmokeTest {

  private static final int QOS_AT_LEAST_ONCE = 1;

  // A round trip on loopback takes milliseconds; the margin covers a busy two-core CI machine.
  private static final long DELIVERY_TIMEOUT_S = 10;

  // Bounds each connect, subscribe and publish handshake for the same reason.
  private static final long CLIENT_TIMEOUT_MS = 10_000;

  private static final byte[] READING =
      "{\"tag\":\"hp_turbine_inlet_pressure\",\"value\":1.6E7,\"unit\":\"Pa\"}"
          .getBytes(StandardCharsets.UTF_8);

  /** A message as the subscriber saw it. */
  private record Received(String topic, byte[] payload, int qos) {}

  @Test
  void readingPublishedAtQosOneReachesSubscriberThroughExternalBrokerOverMqtt5() throws Exception {
    TestServices.MqttBroker broker = TestServices.mqtt();
    if (!broker.external()) {
      TestServices.skipOrFail(
          "no external MQTT 5 broker: set " + TestServices.MQTT_URL_VARIABLE
              + "=tcp://host:port (the embedded broker speaks MQTT 3.1.1 only)");
    }
    String topic = uniqueTopic();
    BlockingQueue<Received> inbox = new ArrayBlockingQueue<>(4);

    org.eclipse.paho.mqttv5.client.MqttClient subscriber = mqtt5Client(broker, "sub");
    org.eclipse.paho.mqttv5.client.MqttClient publisher = mqtt5Client(broker, "pub");
    try {
      subscriber.setCallback(new InboxCallback(inbox));
      subscriber.connect(mqtt5Options());
      IMqttToken granted = subscriber.subscribe(topic, QOS_AT_LEAST_ONCE);
      assertEquals(QOS_AT_LEAST_ONCE, granted.getGrantedQos()[0], "QoS granted by the broker");

      publisher.connect(mqtt5Options());
      publisher.publish(topic, READING, QOS_AT_LEAST_ONCE, false);

      assertReceived(topic, inbox.poll(DELIVERY_TIMEOUT_S, TimeUnit.SECONDS));
    } finally {
      closeQuietly(publisher);
      closeQuietly(subscriber);
    }
  }

  @Test
  void readingPublishedAtQosOneReachesSubscriberThroughEmbeddedBrokerOverMqtt311() throws Exception {
    TestServices.MqttBroker broker = TestServices.mqtt();
    if (broker.external()) {
      // Not a missing service: the configured external broker is tested above instead.
      org.junit.jupiter.api.Assumptions.abort(
          "embedded broker not used: " + TestServices.MQTT_URL_VARIABLE + " names " + broker.serverUri());
    }
    String topic = uniqueTopic();
    BlockingQueue<Received> inbox = new ArrayBlockingQueue<>(4);

    org.eclipse.paho.client.mqttv3.MqttClient subscriber = mqtt3Client(broker, "sub");
    org.eclipse.paho.client.mqttv3.MqttClient publisher = mqtt3Client(broker, "pub");
    try {
      subscriber.connect(mqtt3Options());
      subscriber.subscribe(
          topic,
          QOS_AT_LEAST_ONCE,
          (arrivedTopic, message) ->
              inbox.offer(new Received(arrivedTopic, message.getPayload(), message.getQos())));

      publisher.connect(mqtt3Options());
      publisher.publish(topic, READING, QOS_AT_LEAST_ONCE, false);

      assertReceived(topic, inbox.poll(DELIVERY_TIMEOUT_S, TimeUnit.SECONDS));
    } finally {
      closeQuietly(publisher);
      closeQuietly(subscriber);
    }
  }

  private static void assertReceived(String topic, Received received) {
    assertNotNull(received, "no message within " + DELIVERY_TIMEOUT_S + " s");
    assertEquals(topic, received.topic());
    assertArrayEquals(READING, received.payload());
    assertEquals(QOS_AT_LEAST_ONCE, received.qos(), "QoS of the delivered message");
  }

  // A topic of its own keeps retained or late messages from other runs on a shared broker out.
  private static String uniqueTopic() {
    return "steamtally/test/" + UUID.randomUUID() + "/reading";
  }

  private static String clientId(String role) {
    return "steamtally-smoke-" + role + "-" + UUID.randomUUID();
  }

  private static org.eclipse.paho.mqttv5.client.MqttClient mqtt5Client(
      TestServices.MqttBroker broker, String role) throws MqttException {
    org.eclipse.paho.mqttv5.client.MqttClient client =
        new org.eclipse.paho.mqttv5.client.MqttClient(
            broker.serverUri(),
            clientId(role),
            new org.eclipse.paho.mqttv5.client.persist.MemoryPersistence());
    client.setTimeToWait(CLIENT_TIMEOUT_MS);
    return client;
  }

  private static MqttConnectionOptions mqtt5Options() {
    MqttConnectionOptions options = new MqttConnectionOptions();
    options.setCleanStart(true);
    options.setAutomaticReconnect(false);
    options.setConnectionTimeout((int) TimeUnit.MILLISECONDS.toSeconds(CLIENT_TIMEOUT_MS));
    return options;
  }

  private static org.eclipse.paho.client.mqttv3.MqttClient mqtt3Client(
      TestServices.MqttBroker broker, String role)
      throws org.eclipse.paho.client.mqttv3.MqttException {
    org.eclipse.paho.client.mqttv3.MqttClient client =
        new org.eclipse.paho.client.mqttv3.MqttClient(
            broker.serverUri(), clientId(role), new MemoryPersistence());
    client.setTimeToWait(CLIENT_TIMEOUT_MS);
    return client;
  }

  private static MqttConnectOptions mqtt3Options() {
    MqttConnectOptions options = new MqttConnectOptions();
    options.setMqttVersion(MqttConnectOptions.MQTT_VERSION_3_1_1);
    options.setCleanSession(true);
    options.setAutomaticReconnect(false);
    options.setConnectionTimeout((int) TimeUnit.MILLISECONDS.toSeconds(CLIENT_TIMEOUT_MS));
    return options;
  }

  // Cleanup must not hide the assertion that failed the test.
  private static void closeQuietly(org.eclipse.paho.mqttv5.client.MqttClient client) {
    try {
      if (client.isConnected()) {
        client.disconnect();
      }
      client.close();
    } catch (MqttException e) {
      // The broker may already be gone; the client holds nothing else.
    }
  }

  private static void closeQuietly(org.eclipse.paho.client.mqttv3.MqttClient client) {
    try {
      if (client.isConnected()) {
        client.disconnect();
      }
      client.close();
    } catch (org.eclipse.paho.client.mqttv3.MqttException e) {
      // The broker may already be gone; the client holds nothing else.
    }
  }

  /** Puts every message that arrives into the test's inbox. */
  private static final class InboxCallback implements MqttCallback {
    private final BlockingQueue<Received> inbox;

    InboxCallback(BlockingQueue<Received> inbox) {
      this.inbox = inbox;
    }

    @Override
    public void messageArrived(String topic, MqttMessage message) {
      inbox.offer(new Received(topic, message.getPayload(), message.getQos()));
    }

    @Override
    public void disconnected(MqttDisconnectResponse response) {}

    @Override
    public void mqttErrorOccurred(MqttException exception) {}

    @Override
    public void deliveryComplete(IMqttToken token) {}

    @Override
    public void connectComplete(boolean reconnect, String serverUri) {}

    @Override
    public void authPacketArrived(int reasonCode, MqttProperties properties) {}
  }
}
