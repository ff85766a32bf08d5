package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicLong;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.ingest.TopicMap;
import org.steamtally.collector.mqtt.ConnectionListener;
import org.steamtally.collector.mqtt.ConnectionState;
import org.steamtally.collector.mqtt.MessageSource;
import org.steamtally.collector.mqtt.MessageSources;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublisher;
import org.steamtally.collector.mqtt.ReadingPublishers;
import org.steamtally.dashboard.http.DashboardConfig;
import org.steamtally.dashboard.store.Measurement;
import org.steamtally.dashboard.store.Point;

/**
 * The daemon in process, reading the regenerative example unit from the real Mosquitto over MQTT 5 at
 * QoS 1 with a persistent session, while the simulator publishes at QoS 1 with its own persistent
 * session and holds what it publishes while the broker is away. The broker is stopped mid-run and
 * started again through {@value ExternalServices#MQTT_CTL}; {@code .ci/service} runs it with
 * persistence (the database written when the broker exits on TERM), as a deployment's broker runs.
 *
 * <p>Two cases.
 * <ul>
 * <li><b>Between two bursts</b> (one step a second, about 36 readings in a few milliseconds): the
 *     broker stops once everything published so far has been received, and the publisher reconnects
 *     only after the daemon has subscribed again. Every reading is then received exactly once, as
 *     accepted into a snapshot (the daemon's counter and {@code /metrics} agree) or as superseded:
 *     no duplicate, nothing lost. This case holds even for a broker without persistence.</li>
 * <li><b>In the middle of a burst</b> (a step every 50 ms, about 720 readings a second): the broker
 *     stops while publications are in flight, unacknowledged, and the publisher reconnects as soon as
 *     it can. The broker's persisted session keeps the readings queued for the daemon; the publisher
 *     sends again what it had not had acknowledged, so a reading may arrive twice. A second subscriber
 *     of the test's own with a persistent session witnesses that every reading published got through
 *     the restart; the daemon must take in every reading and count each delivery once, as accepted,
 *     superseded or duplicate (a redelivery of the same sensor and instant): at least as many
 *     deliveries as readings, never more accepted than readings, nothing refused for another reason,
 *     one result per snapshot instant.</li>
 * </ul>
 * In both, the results in the store have no gap longer than the restart window (from the stop
 * command until the daemon and the publisher are both connected again) plus two snapshot periods,
 * and none longer than two periods away from it. About 50 s of real time each.
 */
class BrokerRestartTest {

    private static final Logger LOG = LoggerFactory.getLogger(BrokerRestartTest.class);
    private static final Duration STEP = Duration.ofSeconds(1);
    /** How long the broker stays down: several steps, so that the publisher holds a few bursts. */
    private static final Duration OUTAGE = Duration.ofSeconds(5);
    private static final Duration DEADLINE = Duration.ofSeconds(60);

    @TempDir
    Path dir;

    @Test
    void aBrokerRestartMidRunLosesNoQosOneReadingAndLeavesNoGapBeyondTheRestart() throws Exception {
        String url = ExternalServices.require(ExternalServices.MQTT_URL, "the broker restart needs the real Mosquitto");
        String ctl = ExternalServices.require(ExternalServices.MQTT_CTL, "the broker restart needs a way to restart it");

        DaemonConfigFiles files = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText());
        UnitDescription unit = files.plant().units().get(0);
        String site = files.plant().siteId();
        String suffix = Long.toString(ProcessHandle.current().pid()) + "-" + System.nanoTime() % 100_000;
        CollectorSettings collector = CollectorSettings.builder(List.of(url), "steamtally-restart-daemon-" + suffix)
                .protocol(MqttProtocol.MQTT_5).build();
        Daemon daemon = new Daemon(new Daemon.Config(files.plant(), files.alarms(), collector, dir.resolve("data"),
                DashboardConfig.defaults().withPort(0), List.of(), Map.of(), Clock.systemUTC()));
        PlantSimulation sim = null;
        boolean brokerDown = false;
        try {
            daemon.start();
            MeterRegistry registry = daemon.registry();
            ExternalServices.await("the daemon connects", DEADLINE, () -> gauge(registry, "steamtally.mqtt.connected") == 1);
            ReadingPublisher publisher = ReadingPublishers.connect(new PublisherOptions(List.of(url), MqttProtocol.MQTT_5,
                    "steamtally-restart-sim-" + suffix, PublisherOptions.DEFAULT_WINDOW, false, true));
            Simulator simulator = Simulator.builder(TruthModel.of(unit,
                    ExampleDesignPoints.forUnit(site, unit.id()).orElseThrow())).seed(8).build();
            sim = new PlantSimulation(unit, simulator, publisher, Clock.systemUTC());
            Instant start = Instant.now();
            sim.startPeriodic(STEP);
            UnitMonitor monitor = daemon.monitors().get(0);
            ExternalServices.await("15 results before the restart", DEADLINE, () -> monitor.processed() >= 15);

            // Between two bursts: everything published so far acknowledged and received.
            PlantSimulation s = sim;
            ExternalServices.await("a quiet moment between two bursts", DEADLINE,
                    () -> publisher.inFlight() == 0 && received(registry) == s.published());
            long publishedBefore = sim.published();
            Instant down = Instant.now();
            brokerDown = true;
            ExternalServices.control(ctl, "stop");
            ExternalServices.await("the publisher notices the loss", DEADLINE, () -> !publisher.isConnected());
            ExternalServices.await("the daemon notices the loss", DEADLINE,
                    () -> gauge(registry, "steamtally.mqtt.connected") == 0);
            // The simulator goes on publishing into its hold; the wait is for the outage to last.
            ExternalServices.await("an outage of " + OUTAGE, OUTAGE.plusSeconds(5),
                    () -> Duration.between(down, Instant.now()).compareTo(OUTAGE) >= 0);
            long heldDuringOutage = sim.published() - publishedBefore;
            ExternalServices.control(ctl, "start");
            brokerDown = false;
            ExternalServices.await("the daemon reconnects and subscribes again", DEADLINE,
                    () -> gauge(registry, "steamtally.mqtt.connected") == 1);
            reconnect(publisher);
            Instant up = Instant.now();
            Duration window = Duration.between(down, up);

            long processedAtUp = monitor.processed();
            ExternalServices.await("15 results after the restart", DEADLINE, () -> monitor.processed() >= processedAtUp + 15);
            sim.close();
            long published = sim.published();
            ExternalServices.await("every reading received", DEADLINE,
                    () -> publisher.completed() == published && received(registry) >= published);
            Instant end = Instant.now();
            assertTrue(daemon.store().awaitDrained(DEADLINE), "the store takes every result");

            List<Point> results = daemon.store().points(Measurement.CYCLE, site, unit.id(), start, end.plusSeconds(5));
            List<Long> ts = new ArrayList<>(results.stream().map(Point::timestampMs).sorted().toList());
            Gaps gaps = Gaps.of(ts, down, up);
            double accepted = count(registry, "steamtally.readings.accepted", null);
            double acceptedOnMetrics = fromMetricsPage(daemon.httpPort(), "steamtally_readings_accepted_total");
            double superseded = count(registry, "steamtally.readings.rejected", "superseded");
            double duplicate = count(registry, "steamtally.readings.rejected", "duplicate");
            double otherRejected = count(registry, "steamtally.readings.rejected", null) - superseded - duplicate;
            LOG.info("broker restart: window {} ms (outage {} ms), {} readings published ({} while the broker was"
                            + " down), {} accepted, {} superseded, {} duplicate, {} refused otherwise; {} results,"
                            + " largest gap {} ms ({} ms away from the restart)", window.toMillis(), OUTAGE.toMillis(),
                    published, heldDuringOutage, accepted, superseded, duplicate, otherRejected, ts.size(), gaps.largestMs(),
                    gaps.largestAwayFromRestartMs());
            long windowMs = window.toMillis();
            assertAll(
                    () -> assertTrue(heldDuringOutage > 0, "readings were published while the broker was down"),
                    () -> assertEquals(0, publisher.failed(), "publications failed"),
                    () -> assertEquals(published, accepted + superseded, 0.0,
                            "every reading received once: accepted or superseded, none lost"),
                    () -> assertEquals(accepted, acceptedOnMetrics, 0.0, "/metrics says the same"),
                    () -> assertEquals(0.0, duplicate, "no reading delivered twice"),
                    () -> assertEquals(0.0, otherRejected, "no reading refused for another reason"),
                    () -> gaps.assertWithin(windowMs),
                    () -> assertTrue(count(registry, "steamtally.mqtt.connects", null) >= 2, "the daemon reconnected"));
        } finally {
            if (brokerDown) {
                ExternalServices.control(ctl, "start");
            }
            if (sim != null) {
                sim.close();
            }
            daemon.close();
            ExternalServices.endSessions(url, collector.clientId(), "steamtally-restart-sim-" + suffix);
        }
    }

    /** The simulator's step in the burst case: 36 readings every 50 ms, a continuous stream. */
    private static final Duration BURST_STEP = Duration.ofMillis(50);
    /**
     * Publications the burst publisher holds at most: the outage's readings (about 720 a second for
     * the outage and the broker's stop and start) and those in flight, with room to spare.
     */
    private static final int BURST_WINDOW = 20_000;

    @Test
    void aBrokerStoppedInTheMiddleOfAPublishingBurstLosesNoReadingAndCountsEveryRedeliveryOnce() throws Exception {
        String url = ExternalServices.require(ExternalServices.MQTT_URL, "the broker restart needs the real Mosquitto");
        String ctl = ExternalServices.require(ExternalServices.MQTT_CTL, "the broker restart needs a way to restart it");

        DaemonConfigFiles files = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText());
        UnitDescription unit = files.plant().units().get(0);
        String site = files.plant().siteId();
        String suffix = Long.toString(ProcessHandle.current().pid()) + "-" + System.nanoTime() % 100_000;
        CollectorSettings collector = CollectorSettings.builder(List.of(url), "steamtally-burst-daemon-" + suffix)
                .protocol(MqttProtocol.MQTT_5).build();
        // The broker keeps the daemon's session, and what is queued for it, for the session expiry.
        assertTrue(collector.sessionExpiry().compareTo(DEADLINE.multipliedBy(5)) > 0, "session expiry "
                + collector.sessionExpiry() + " outlasts the test");
        Daemon daemon = new Daemon(new Daemon.Config(files.plant(), files.alarms(), collector, dir.resolve("data"),
                DashboardConfig.defaults().withPort(0), List.of(), Map.of(), Clock.systemUTC()));
        Map<String, Integer> witnessed = new ConcurrentHashMap<>();
        MessageSource witness = null;
        PlantSimulation sim = null;
        boolean brokerDown = false;
        try {
            daemon.start();
            MeterRegistry registry = daemon.registry();
            ExternalServices.await("the daemon connects", DEADLINE, () -> gauge(registry, "steamtally.mqtt.connected") == 1);
            CollectorSettings witnessSettings = CollectorSettings.builder(List.of(url), "steamtally-burst-witness-" + suffix)
                    .protocol(MqttProtocol.MQTT_5).build();
            witness = MessageSources.open(witnessSettings,
                    TopicMap.of(files.plant(), collector.topicTemplate()).subscriptionFilters(), ConnectionListener.NONE,
                    new SimpleMeterRegistry(), Clock.systemUTC(), System::getenv);
            witness.start((topic, payload) -> witnessed.merge(key(topic, payload), 1, Integer::sum));
            MessageSource w = witness;
            ExternalServices.await("the witness connects", DEADLINE, () -> w.state() == ConnectionState.CONNECTED);

            RecordingPublisher publisher = new RecordingPublisher(ReadingPublishers.connect(new PublisherOptions(
                    List.of(url), MqttProtocol.MQTT_5, "steamtally-burst-sim-" + suffix, BURST_WINDOW, false, true)));
            Simulator simulator = Simulator.builder(TruthModel.of(unit,
                    ExampleDesignPoints.forUnit(site, unit.id()).orElseThrow())).seed(9).build();
            sim = new PlantSimulation(unit, simulator, publisher, new StrictlyIncreasingClock());
            Instant start = Instant.now();
            sim.startPeriodic(BURST_STEP);
            UnitMonitor monitor = daemon.monitors().get(0);
            ExternalServices.await("10 results before the restart", DEADLINE, () -> monitor.processed() >= 10);

            // Mid-burst: publications sent and not yet acknowledged when the broker is told to stop.
            ExternalServices.await("publications in flight", DEADLINE, () -> publisher.inFlight() > 0);
            int inFlightAtStop = publisher.inFlight();
            long publishedAtStop = publisher.recorded();
            Instant down = Instant.now();
            brokerDown = true;
            ExternalServices.control(ctl, "stop");
            long publishedWhenStopped = publisher.recorded();
            ExternalServices.await("the publisher notices the loss", DEADLINE, () -> !publisher.isConnected());
            ExternalServices.await("the daemon notices the loss", DEADLINE,
                    () -> gauge(registry, "steamtally.mqtt.connected") == 0);
            ExternalServices.await("an outage of " + OUTAGE, OUTAGE.plusSeconds(5),
                    () -> Duration.between(down, Instant.now()).compareTo(OUTAGE) >= 0);
            ExternalServices.control(ctl, "start");
            brokerDown = false;
            // No waiting for the daemon: the restored session holds what arrives before it is back.
            reconnect(publisher);
            ExternalServices.await("the daemon reconnects", DEADLINE, () -> gauge(registry, "steamtally.mqtt.connected") == 1);
            // The window ends when both are back. The daemon's reconnect delay doubles per refused
            // attempt (with jitter), so after a 5 s outage it may come back seconds after the publisher;
            // what it receives from the held session before then is stamped in the past, and results
            // resume with the first snapshot after it returns.
            Instant up = Instant.now();
            Duration window = Duration.between(down, up);

            long processedAtUp = monitor.processed();
            ExternalServices.await("10 results after the restart", DEADLINE, () -> monitor.processed() >= processedAtUp + 10);
            sim.close();
            long published = sim.published();
            Map<String, Integer> sent = publisher.sent();
            try {
                ExternalServices.await("every publication acknowledged", DEADLINE,
                        () -> publisher.completed() + publisher.failed() == published);
                ExternalServices.await("every reading witnessed", DEADLINE,
                        () -> sent.keySet().stream().allMatch(witnessed::containsKey));
                ExternalServices.await("every reading received by the daemon", DEADLINE,
                        () -> received(registry) >= published);
            } catch (AssertionError e) {
                throw new AssertionError(e.getMessage() + ": " + published + " published, " + publisher.completed()
                        + " acknowledged, " + publisher.failed() + " failed, " + publisher.inFlight() + " in flight; "
                        + sent.keySet().stream().filter(k -> !witnessed.containsKey(k)).count() + " not witnessed; "
                        + received(registry) + " received by the daemon", e);
            }
            Instant end = Instant.now();
            assertTrue(daemon.store().awaitDrained(DEADLINE), "the store takes every result");

            List<Point> results = daemon.store().points(Measurement.CYCLE, site, unit.id(), start, end.plusSeconds(5));
            List<Long> ts = new ArrayList<>(results.stream().map(Point::timestampMs).sorted().toList());
            Gaps gaps = Gaps.of(ts, down, up);
            long distinctResults = ts.stream().distinct().count();
            long lostAtWitness = sent.keySet().stream().filter(k -> !witnessed.containsKey(k)).count();
            long repeatsAtWitness = sent.keySet().stream().mapToLong(k -> witnessed.getOrDefault(k, 1) - 1L).sum();
            double accepted = count(registry, "steamtally.readings.accepted", null);
            double superseded = count(registry, "steamtally.readings.rejected", "superseded");
            double duplicate = count(registry, "steamtally.readings.rejected", "duplicate");
            double otherRejected = count(registry, "steamtally.readings.rejected", null) - superseded - duplicate;
            double deliveries = accepted + superseded + duplicate;
            LOG.info("broker stopped mid-burst: window {} ms (outage {} ms), {} publications in flight at the stop,"
                            + " {} readings published ({} from the stop command until the broker was gone), {} distinct;"
                            + " witness: {} lost, {} delivered again; daemon: {} deliveries, {} accepted, {} superseded,"
                            + " {} duplicate, {} refused otherwise, {} more deliveries than readings; {} results,"
                            + " largest gap {} ms ({} ms away from the restart)", window.toMillis(), OUTAGE.toMillis(),
                    inFlightAtStop, published, publishedWhenStopped - publishedAtStop, sent.size(), lostAtWitness,
                    repeatsAtWitness, deliveries, accepted, superseded, duplicate, otherRejected, deliveries - published,
                    ts.size(), gaps.largestMs(), gaps.largestAwayFromRestartMs());
            long windowMs = window.toMillis();
            assertAll(
                    () -> assertTrue(inFlightAtStop > 0, "the broker stopped with publications in flight"),
                    () -> assertEquals(0, publisher.failed(), "publications failed"),
                    () -> assertEquals(published, sent.values().stream().mapToLong(Integer::longValue).sum(),
                            "the recorder saw every publication"),
                    () -> assertEquals(published, sent.keySet().stream().map(BrokerRestartTest::sensorAndInstant).distinct()
                            .count(), "every reading published is a distinct sensor and instant"),
                    () -> assertEquals(0, lostAtWitness, "readings that never got through the restart"),
                    () -> assertTrue(deliveries >= published, "the daemon took in " + deliveries + " deliveries of "
                            + published + " readings"),
                    () -> assertTrue(accepted <= published, "accepted " + accepted + " of " + published
                            + " readings: a redelivery was accepted again"),
                    () -> assertEquals(0.0, otherRejected, "no reading refused for another reason"),
                    () -> assertEquals(ts.size(), distinctResults, "one result per snapshot instant"),
                    () -> gaps.assertWithin(windowMs),
                    () -> assertTrue(count(registry, "steamtally.mqtt.connects", null) >= 2, "the daemon reconnected"));
        } finally {
            if (brokerDown) {
                ExternalServices.control(ctl, "start");
            }
            if (sim != null) {
                sim.close();
            }
            if (witness != null) {
                witness.close();
            }
            daemon.close();
            ExternalServices.endSessions(url, collector.clientId(), "steamtally-burst-witness-" + suffix,
                    "steamtally-burst-sim-" + suffix);
        }
    }

    /** A reading's identity: its topic and payload, which carries the instant and the value. */
    private static String key(String topic, byte[] payload) {
        return topic + " " + new String(payload, StandardCharsets.UTF_8);
    }

    private static final Pattern TS = Pattern.compile("\"ts\":(\\d+)");

    /** The topic and the instant of a reading's {@link #key}, which a redelivery shares with the original. */
    private static String sensorAndInstant(String key) {
        Matcher m = TS.matcher(key);
        assertTrue(m.find(), "no instant in " + key);
        return key.substring(0, key.indexOf(' ')) + " " + m.group(1);
    }

    /**
     * The system clock, but never the same millisecond twice: when the simulator's timer runs late it
     * catches up with steps back to back, which must still be distinct instants of each sensor (the
     * collector refuses a second value for an instant it holds as a conflict).
     */
    private static final class StrictlyIncreasingClock extends Clock {
        private final AtomicLong last = new AtomicLong();

        @Override
        public ZoneId getZone() {
            return ZoneOffset.UTC;
        }

        @Override
        public Clock withZone(ZoneId zone) {
            throw new UnsupportedOperationException("UTC only");
        }

        @Override
        public long millis() {
            long now = System.currentTimeMillis();
            return last.updateAndGet(prev -> Math.max(prev + 1, now));
        }

        @Override
        public Instant instant() {
            return Instant.ofEpochMilli(millis());
        }
    }

    /** Passes every publication on and records it, so that the test knows each reading published. */
    private static final class RecordingPublisher implements ReadingPublisher {
        private final ReadingPublisher delegate;
        private final Map<String, Integer> sent = new ConcurrentHashMap<>();
        private final AtomicLong recorded = new AtomicLong();

        RecordingPublisher(ReadingPublisher delegate) {
            this.delegate = delegate;
        }

        @Override
        public void publish(String topic, byte[] payload, int qos) throws InterruptedException {
            delegate.publish(topic, payload, qos);
            sent.merge(key(topic, payload), 1, Integer::sum);
            recorded.incrementAndGet();
        }

        Map<String, Integer> sent() {
            return sent;
        }

        long recorded() {
            return recorded.get();
        }

        @Override
        public int inFlight() {
            return delegate.inFlight();
        }

        @Override
        public long completed() {
            return delegate.completed();
        }

        @Override
        public long failed() {
            return delegate.failed();
        }

        @Override
        public boolean awaitIdle(Duration timeout) throws InterruptedException {
            return delegate.awaitIdle(timeout);
        }

        @Override
        public boolean isConnected() {
            return delegate.isConnected();
        }

        @Override
        public void reconnect() {
            delegate.reconnect();
        }

        @Override
        public void close() {
            delegate.close();
        }
    }

    /** The publisher reconnects by hand (automatic reconnect is off); a refused attempt is tried again. */
    private static void reconnect(ReadingPublisher publisher) throws InterruptedException {
        long deadline = System.nanoTime() + DEADLINE.toNanos();
        while (true) {
            try {
                publisher.reconnect();
                return;
            } catch (IllegalStateException e) {
                if (System.nanoTime() > deadline) {
                    throw e;
                }
                Thread.sleep(200);
            }
        }
    }

    /** Readings the collector took in, whatever became of them. */
    private static double received(MeterRegistry registry) {
        return count(registry, "steamtally.readings.accepted", null) + count(registry, "steamtally.readings.rejected", null);
    }

    private static double count(MeterRegistry registry, String name, String reason) {
        return registry.find(name).counters().stream()
                .filter(c -> reason == null || reason.equals(c.getId().getTag("reason")))
                .mapToDouble(Counter::count).sum();
    }

    /** The sum of one counter's series on the dashboard's {@code /metrics} page (Prometheus text format). */
    private static double fromMetricsPage(int port, String name) throws Exception {
        HttpResponse<String> r = HttpClient.newHttpClient().send(HttpRequest.newBuilder(
                URI.create("http://127.0.0.1:" + port + "/metrics")).timeout(Duration.ofSeconds(10)).GET().build(),
                HttpResponse.BodyHandlers.ofString());
        assertEquals(200, r.statusCode(), "/metrics");
        double sum = 0;
        for (String line : r.body().split("\n")) {
            if (line.startsWith(name + "{") || line.startsWith(name + " ")) {
                sum += Double.parseDouble(line.substring(line.lastIndexOf(' ') + 1));
            }
        }
        return sum;
    }

    private static double gauge(MeterRegistry registry, String name) {
        var g = registry.find(name).gauge();
        return g == null ? Double.NaN : g.value();
    }

    /** The largest gaps between successive result timestamps: overall, and between results both away from the restart. */
    private record Gaps(long largestMs, long largestAwayFromRestartMs) {
        static Gaps of(List<Long> sortedTimestampsMs, Instant down, Instant up) {
            long largest = 0;
            long away = 0;
            for (int i = 1; i < sortedTimestampsMs.size(); i++) {
                long before = sortedTimestampsMs.get(i - 1);
                long after = sortedTimestampsMs.get(i);
                long gap = after - before;
                largest = Math.max(largest, gap);
                if (!(after >= down.toEpochMilli() && before <= up.toEpochMilli())) {
                    away = Math.max(away, gap);
                }
            }
            return new Gaps(largest, away);
        }

        /**
         * No gap longer than the restart window plus two periods across the restart; away from it a
         * result a second, with one period of slack, since a slow snapshot on a loaded machine may
         * coalesce with the next.
         */
        void assertWithin(long restartWindowMs) {
            assertAll(
                    () -> assertTrue(largestMs <= restartWindowMs + 2 * STEP.toMillis(), "largest gap " + largestMs
                            + " ms, restart window " + restartWindowMs + " ms"),
                    () -> assertTrue(largestAwayFromRestartMs <= 2 * STEP.toMillis(), "largest gap away from the restart "
                            + largestAwayFromRestartMs + " ms"));
        }
    }
}
