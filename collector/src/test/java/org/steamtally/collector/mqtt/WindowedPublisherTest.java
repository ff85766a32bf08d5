package org.steamtally.collector.mqtt;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.steamtally.collector.config.MqttProtocol;

/**
 * How a publication's outcome is counted. The sequence "failed, then succeeded" is what Paho reports
 * for a QoS 1 publication in flight when the connection is lost and that is sent again on the
 * reconnect of a persistent session (seen against Mosquitto in the broker-restart test of deploy).
 */
class WindowedPublisherTest {

    /** A publisher without a client: every publication's outcome is kept for the test to report. */
    private static final class FakePublisher extends WindowedPublisher {
        final List<Outcome> sent = new ArrayList<>();

        FakePublisher() {
            super(new PublisherOptions(List.of("tcp://127.0.0.1:1"), MqttProtocol.MQTT_5, "fake", 10, false, true));
        }

        @Override
        protected void send(String topic, byte[] payload, int qos) {
            sent.add(outcome());
        }

        @Override
        protected boolean isNotConnected(Exception e) {
            return false;
        }

        @Override
        protected void connectClient() {
        }

        @Override
        protected void disconnectAndCloseClient() {
        }

        @Override
        public boolean isConnected() {
            return true;
        }
    }

    @Test
    void aPublicationThatFailsOnALostConnectionAndSucceedsOnTheResendCountsOnceAsCompleted() throws Exception {
        FakePublisher p = new FakePublisher();
        p.publish("t", new byte[] {1}, 1);
        p.sent.get(0).failed();
        assertEquals(0, p.inFlight(), "the window slot is released at the failure");
        p.sent.get(0).succeeded();
        assertAll(
                () -> assertEquals(1, p.completed()),
                () -> assertEquals(0, p.failed()),
                () -> assertEquals(0, p.inFlight(), "released once, not twice"));
    }

    @Test
    void anOutcomeReportedTwiceIsCountedOnce() throws Exception {
        FakePublisher p = new FakePublisher();
        p.publish("t", new byte[] {1}, 1);
        p.publish("t", new byte[] {2}, 1);
        p.sent.get(0).succeeded();
        p.sent.get(0).succeeded();
        p.sent.get(0).failed();
        assertAll(
                () -> assertEquals(1, p.completed()),
                () -> assertEquals(0, p.failed()),
                () -> assertEquals(1, p.inFlight(), "the second publication still holds its slot"));
    }

    @Test
    void aPublicationThatOnlyFailsCountsAsFailed() throws Exception {
        FakePublisher p = new FakePublisher();
        p.publish("t", new byte[] {1}, 1);
        p.sent.get(0).failed();
        assertAll(
                () -> assertEquals(0, p.completed()),
                () -> assertEquals(1, p.failed()),
                () -> assertEquals(0, p.inFlight()));
    }
}
