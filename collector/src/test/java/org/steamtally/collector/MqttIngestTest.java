package org.steamtally.collector;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import java.util.UUID;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.TimeUnit;
import java.util.function.BooleanSupplier;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.ingest.DeadLetterSink;
import org.steamtally.collector.ingest.IngestPipeline;
import org.steamtally.collector.ingest.TopicMap;
import org.steamtally.collector.mqtt.ConnectionListener;
import org.steamtally.collector.mqtt.ConnectionState;
import org.steamtally.collector.mqtt.MessageSource;
import org.steamtally.collector.mqtt.MessageSources;
import org.steamtally.collector.mqtt.MqttCollector;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublisher;
import org.steamtally.collector.mqtt.ReadingPublishers;

/**
 * The collector end to end through a real broker: the embedded one (MQTT 3.1.1) in ordinary runs, the
 * external Mosquitto (MQTT 5) when {@value TestServices#MQTT_URL_VARIABLE} is set.
 */
class MqttIngestTest {

    private static final int QOS_1 = 1;
    // Loopback delivers in milliseconds; the margin is for a loaded two-core machine and a broker restart.
    private static final Duration DEADLINE = Duration.ofSeconds(60);
    /** Variable naming a script that takes start|stop|restart|status for the external broker. */
    private static final String MQTT_CTL_VARIABLE = "STEAMTALLY_TEST_MQTT_CTL";

    private final TestServices.MqttBroker broker = TestServices.mqtt();
    private final MqttProtocol protocol = broker.external() ? MqttProtocol.MQTT_5 : MqttProtocol.MQTT_3_1_1;
    private final String run = UUID.randomUUID().toString().substring(0, 8);
    private final String site = "fernholm-" + run;
    private final SimpleMeterRegistry registry = new SimpleMeterRegistry();
    private final List<AutoCloseable> open = new ArrayList<>();
    /** Sequence numbers of the readings the collector's client received. */
    private final Set<Integer> seen = ConcurrentHashMap.newKeySet();

    /** One unit, one flow sensor whose value is the reading's sequence number (range 0 to 10⁹). */
    private final PlantDescription plant = new PlantDescription(site, "Fernholm", 101_325.0, List.of(
            new UnitDescription("unit1", "Unit 1", List.of(new Sensor("FT-101", Quantity.MASS_FLOW, "kg/s", 1.0,
                    UncertaintyBasis.STANDARD, 0.0, 1e9, Duration.ofSeconds(5), Optional.empty())),
                    List.of(), List.of(), DeadState.STANDARD)));
    private final String topic = "steamtally/test/" + site + "/unit1/FT-101";

    @AfterEach
    void closeAll() throws Exception {
        for (int i = open.size() - 1; i >= 0; i--) {
            open.get(i).close();
        }
    }

    private CollectorSettings settings(String clientId) {
        return CollectorSettings.builder(List.of(broker.serverUri()), clientId).protocol(protocol)
                .topicTemplate("steamtally/test/{site}/{unit}/{sensor}").allowedLateness(Duration.ZERO)
                .snapshotPeriod(Duration.ofMillis(100)).reconnect(Duration.ofMillis(50), Duration.ofMillis(200))
                .build();
    }

    private IngestPipeline pipeline(CollectorSettings s) {
        IngestPipeline p = new IngestPipeline(plant, TopicMap.of(plant, s.topicTemplate()), s, registry,
                Clock.systemUTC(), DeadLetterSink.NONE);
        p.start();
        open.add(p);
        return p;
    }

    private MessageSource source(CollectorSettings s, IngestPipeline p) {
        MessageSource source = MessageSources.open(s, TopicMap.of(plant, s.topicTemplate()).subscriptionFilters(),
                ConnectionListener.NONE, registry, Clock.systemUTC(), System::getenv);
        open.add(source);
        source.start((t, payload) -> {
            seen.add(sequenceOf(payload));
            p.submit(t, payload);
        });
        awaitTrue("the collector connects", () -> source.state() == ConnectionState.CONNECTED);
        return source;
    }

    private ReadingPublisher publisher(boolean bufferOffline) {
        ReadingPublisher pub = ReadingPublishers.connect(new PublisherOptions(List.of(broker.serverUri()), protocol,
                "steamtally-test-pub-" + run, 1000, false, bufferOffline));
        open.add(pub);
        return pub;
    }

    private void publishRange(ReadingPublisher pub, int from, int to) throws InterruptedException {
        long base = System.currentTimeMillis() - 60_000;
        for (int i = from; i < to; i++) {
            // Timestamps one millisecond apart, in the past, so that every reading is a newer one.
            pub.publish(topic, ("{\"value\": " + i + ", \"ts\": " + (base + i) + "}").getBytes(StandardCharsets.UTF_8),
                    QOS_1);
        }
    }

    private static int sequenceOf(byte[] payload) {
        String s = new String(payload, StandardCharsets.UTF_8);
        int start = s.indexOf(':') + 1;
        return Integer.parseInt(s.substring(start, s.indexOf(',')).strip());
    }

    private void awaitAllSeen(int n) {
        awaitTrue("all " + n + " readings received", () -> {
            for (int i = 0; i < n; i++) {
                if (!seen.contains(i)) {
                    return false;
                }
            }
            return true;
        });
    }

    private double accepted() {
        Counter c = registry.find("steamtally.readings.accepted").counter();
        return c == null ? 0 : c.count();
    }

    private static void awaitTrue(String what, BooleanSupplier condition) {
        long deadline = System.nanoTime() + DEADLINE.toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("not within " + DEADLINE.toSeconds() + " s: " + what);
            }
            try {
                Thread.sleep(20);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new AssertionError("interrupted while waiting for: " + what);
            }
        }
    }

    @Test
    void readingsPublishedAtQosOneReachTheUnitsSnapshots() throws Exception {
        CollectorSettings s = settings("steamtally-test-" + run).toBuilder()
                .deadLetterTopic("steamtally/test/" + site + "-dead").build();
        MqttCollector collector = MqttCollector.start(plant, s, registry, Clock.systemUTC(), ConnectionListener.NONE,
                System::getenv);
        open.add(collector);
        awaitTrue("the collector connects", () -> collector.connectionState() == ConnectionState.CONNECTED);
        ReadingPublisher pub = publisher(false);
        publishRange(pub, 0, 500);
        pub.publish(topic, "{\"value\": \"five\"}".getBytes(StandardCharsets.UTF_8), QOS_1);
        awaitTrue("every reading accepted", () -> accepted() == 500);
        // Snapshots taken before the last reading was aligned carry an older value; wait for the newest.
        awaitTrue("a snapshot carries the newest reading, 499", () -> {
            try {
                Optional<Snapshot> s1 = collector.slot("unit1").take(Duration.ofMillis(500));
                return s1.isPresent() && s1.get().valuesSi()[0] == 499.0;
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return false;
            }
        });
        awaitTrue("the refused reading went to the dead-letter topic",
                () -> registry.find("steamtally.deadletters.sent").counter().count() == 1.0);
    }

    @Test
    void persistentSessionPicksUpReadingsPublishedWhileTheCollectorWasAway() throws Exception {
        CollectorSettings s = settings("steamtally-test-session-" + run);
        IngestPipeline p = pipeline(s);
        MessageSource first = source(s, p);
        first.close();
        ReadingPublisher pub = publisher(false);
        publishRange(pub, 0, 200);
        assertTrue(pub.awaitIdle(DEADLINE), "the broker acknowledged every reading");
        assertTrue(seen.isEmpty(), "nothing can have arrived while away");
        source(s, p);
        awaitAllSeen(200);
        awaitTrue("every reading accepted", () -> accepted() == 200);
    }

    @Test
    void windowedPublisherSendsMoreThanTheMessageIdSpaceAtQosOneAndZero() throws Exception {
        // Paho 1.2.5 without a window runs out of its 65,535 message ids near 65,000 publications.
        int n = 70_001;
        ReadingPublisher pub = ReadingPublishers.connect(PublisherOptions.of(broker.serverUri(), protocol,
                "steamtally-test-ids-" + run));
        open.add(pub);
        byte[] payload = "{\"value\": 1}".getBytes(StandardCharsets.UTF_8);
        for (int qos : new int[] {1, 0}) {
            long before = pub.completed();
            for (int i = 0; i < n; i++) {
                pub.publish(topic + "/ids", payload, qos);
            }
            assertTrue(pub.awaitIdle(DEADLINE), "every publication completed");
            assertEquals(n, pub.completed() - before, "completed at QoS " + qos);
        }
        assertEquals(0, pub.failed());
    }

    @Test
    void qosOneReadingsSurviveABrokerRestartWithNothingLost() throws Exception {
        if (!broker.external()) {
            TestServices.skipOrFail("restarting a broker needs the external one: set "
                    + TestServices.MQTT_URL_VARIABLE + " and " + MQTT_CTL_VARIABLE);
        }
        String ctl = System.getenv(MQTT_CTL_VARIABLE);
        if (ctl == null || ctl.isBlank()) {
            TestServices.skipOrFail("no way to restart the external broker: set " + MQTT_CTL_VARIABLE
                    + " to a script taking start|stop");
        }
        CollectorSettings s = settings("steamtally-test-restart-" + run);
        IngestPipeline p = pipeline(s);
        MessageSource source = source(s, p);
        ReadingPublisher pub = publisher(true);
        publishRange(pub, 0, 300);
        awaitAllSeen(300);
        assertTrue(pub.awaitIdle(DEADLINE));

        control(ctl, "stop");
        Throwable duringOutage = null;
        try {
            awaitTrue("the collector notices the loss", () -> source.state() != ConnectionState.CONNECTED);
            awaitTrue("the publisher notices the loss", () -> !pub.isConnected());
            // Published while the broker is down: held by the publisher, not lost.
            publishRange(pub, 300, 600);
        } catch (AssertionError | RuntimeException e) {
            duringOutage = e;
        }
        control(ctl, "start");
        if (duringOutage instanceof AssertionError a) {
            throw a;
        }
        if (duringOutage instanceof RuntimeException r) {
            throw r;
        }
        awaitTrue("the collector reconnects and resubscribes", () -> source.state() == ConnectionState.CONNECTED);
        pub.reconnect();
        publishRange(pub, 600, 900);
        awaitAllSeen(900);
        awaitTrue("every reading accepted once", () -> accepted() == 900);
        assertTrue(registry.find("steamtally.mqtt.connects").counter().count() >= 2, "reconnected at least once");
    }

    @Test
    void daemonsInOneSharedSubscriptionGroupSplitTheReadingsBetweenThem() throws Exception {
        if (!broker.external()) {
            TestServices.skipOrFail("shared subscriptions need MQTT 5: set " + TestServices.MQTT_URL_VARIABLE
                    + " to an MQTT 5 broker");
        }
        Set<Integer> second = ConcurrentHashMap.newKeySet();
        CollectorSettings a = settings("steamtally-test-share-a-" + run).toBuilder().sharedGroup("g" + run).build();
        CollectorSettings b = CollectorSettings.builder(List.of(broker.serverUri()), "steamtally-test-share-b-" + run)
                .protocol(protocol).topicTemplate("steamtally/test/{site}/{unit}/{sensor}").sharedGroup("g" + run)
                .build();
        source(a, pipeline(a));
        MessageSource other = MessageSources.open(b, TopicMap.of(plant, b.topicTemplate()).subscriptionFilters(),
                ConnectionListener.NONE, new SimpleMeterRegistry(), Clock.systemUTC(), System::getenv);
        open.add(other);
        other.start((t, payload) -> second.add(sequenceOf(payload)));
        awaitTrue("the second daemon connects", () -> other.state() == ConnectionState.CONNECTED);
        ReadingPublisher pub = publisher(false);
        publishRange(pub, 0, 400);
        awaitTrue("all 400 readings reached one daemon or the other", () -> seen.size() + second.size() >= 400);
        Set<Integer> both = new java.util.HashSet<>(seen);
        both.retainAll(second);
        assertAll(
                () -> assertTrue(!seen.isEmpty() && !second.isEmpty(), "each daemon got a share: " + seen.size()
                        + " and " + second.size()),
                () -> assertEquals(Set.of(), both, "no reading went to both"),
                () -> assertEquals(400, seen.size() + second.size()));
    }

    @Test
    void brokerThatRefusesIsPassedOverForTheNextUrl() throws Exception {
        int closedPort;
        try (java.net.ServerSocket socket = new java.net.ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            closedPort = socket.getLocalPort();
        }
        CollectorSettings s = CollectorSettings.builder(
                        List.of("tcp://127.0.0.1:" + closedPort, broker.serverUri()), "steamtally-test-failover-" + run)
                .protocol(protocol).topicTemplate("steamtally/test/{site}/{unit}/{sensor}").build();
        source(s, pipeline(s));
        ReadingPublisher pub = publisher(false);
        publishRange(pub, 0, 10);
        awaitAllSeen(10);
    }

    @Test
    void mqtt311SessionAgainstTheExternalBrokerPicksUpReadingsPublishedWhileAway() throws Exception {
        if (!broker.external()) {
            // The embedded broker speaks only 3.1.1, so the tests above already run this protocol there.
            org.junit.jupiter.api.Assumptions.abort("3.1.1 is what the embedded broker runs everywhere above");
        }
        CollectorSettings s = settings("steamtally-test-311-" + run).toBuilder().protocol(MqttProtocol.MQTT_3_1_1)
                .build();
        IngestPipeline p = pipeline(s);
        source(s, p).close();
        ReadingPublisher pub = publisher(false);
        publishRange(pub, 0, 100);
        assertTrue(pub.awaitIdle(DEADLINE));
        source(s, p);
        awaitAllSeen(100);
    }

    private static void control(String ctl, String action) throws IOException, InterruptedException {
        Process process = new ProcessBuilder(ctl, action).redirectErrorStream(true).start();
        String out = new String(process.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(process.waitFor(DEADLINE.toSeconds(), TimeUnit.SECONDS), ctl + " " + action + " did not finish");
        assertEquals(0, process.exitValue(), ctl + " " + action + " failed: " + out);
    }
}
