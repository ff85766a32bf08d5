package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublisher;
import org.steamtally.collector.mqtt.ReadingPublishers;
import org.steamtally.dashboard.http.DashboardConfig;
import org.steamtally.dashboard.store.Measurement;
import org.steamtally.dashboard.store.Point;

/**
 * The daemon in process, reading the regenerative example unit from the real Mosquitto over MQTT 5 at
 * QoS 1 with a persistent session, while the simulator publishes one step a second at QoS 1 with its
 * own persistent session and holds what it publishes while the broker is away. The broker is stopped
 * mid-run and started again through {@value ExternalServices#MQTT_CTL}.
 *
 * <p>What is asserted, and why so. The test broker runs without persistence
 * ({@code deploy/mosquitto/steamtally-mosquitto.conf}): a restart empties it, so it forgets the
 * daemon's session and subscriptions, and a message it had acknowledged to the publisher but not yet
 * forwarded is gone with it. Neither is the daemon's to prevent. The test therefore
 * <ul>
 * <li>stops the broker between two of the simulator's bursts (one burst of about 50 readings a
 *     second, a few milliseconds long), once everything published so far has been received; a
 *     broker that must keep acknowledged messages over a restart needs {@code persistence true}
 *     (docs/OPERATIONS.md);</li>
 * <li>lets the publisher reconnect only after the daemon has reconnected and subscribed again,
 *     since a broker that restarted empty drops whatever arrives for a subscription it has not yet
 *     been given (with persistence the restored session would hold it);</li>
 * <li>asserts that every reading published, including those taken while the broker was down, is
 *     received and counted exactly once, as accepted into a snapshot (the daemon's counter and
 *     {@code /metrics} agree) or as superseded (it came after its snapshot was emitted): nothing
 *     lost, nothing refused for any other reason; and that the results in the store have no gap
 *     longer than the restart window plus two snapshot periods.</li>
 * </ul>
 * About 50 s of real time.
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
            long maxGap = 0;
            long maxGapOutside = 0;
            for (int i = 1; i < ts.size(); i++) {
                long gap = ts.get(i) - ts.get(i - 1);
                maxGap = Math.max(maxGap, gap);
                boolean overlapsWindow = ts.get(i) >= down.toEpochMilli() && ts.get(i - 1) <= up.toEpochMilli();
                if (!overlapsWindow) {
                    maxGapOutside = Math.max(maxGapOutside, gap);
                }
            }
            double accepted = count(registry, "steamtally.readings.accepted", null);
            double acceptedOnMetrics = fromMetricsPage(daemon.httpPort(), "steamtally_readings_accepted_total");
            double superseded = count(registry, "steamtally.readings.rejected", "superseded");
            double duplicate = count(registry, "steamtally.readings.rejected", "duplicate");
            double otherRejected = count(registry, "steamtally.readings.rejected", null) - superseded - duplicate;
            LOG.info("broker restart: window {} ms (outage {} ms), {} readings published ({} while the broker was"
                            + " down), {} accepted, {} superseded, {} duplicate, {} refused otherwise; {} results,"
                            + " largest gap {} ms ({} ms away from the restart)", window.toMillis(), OUTAGE.toMillis(),
                    published, heldDuringOutage, accepted, superseded, duplicate, otherRejected, ts.size(), maxGap,
                    maxGapOutside);
            long windowMs = window.toMillis();
            long maxGapFinal = maxGap;
            long maxGapOutsideFinal = maxGapOutside;
            assertAll(
                    () -> assertTrue(heldDuringOutage > 0, "readings were published while the broker was down"),
                    () -> assertEquals(0, publisher.failed(), "publications failed"),
                    () -> assertEquals(published, accepted + superseded, 0.0,
                            "every reading received once: accepted or superseded, none lost"),
                    () -> assertEquals(accepted, acceptedOnMetrics, 0.0, "/metrics says the same"),
                    () -> assertEquals(0.0, duplicate, "no reading delivered twice"),
                    () -> assertEquals(0.0, otherRejected, "no reading refused for another reason"),
                    () -> assertTrue(maxGapFinal <= windowMs + 2 * STEP.toMillis(), "largest gap " + maxGapFinal
                            + " ms, restart window " + windowMs + " ms"),
                    // Away from the restart a result a second; a slow snapshot on a loaded machine may
                    // coalesce with the next, hence one period of slack.
                    () -> assertTrue(maxGapOutsideFinal <= 2 * STEP.toMillis(), "largest gap away from the restart "
                            + maxGapOutsideFinal + " ms"),
                    () -> assertTrue(count(registry, "steamtally.mqtt.connects", null) >= 2, "the daemon reconnected"));
        } finally {
            if (brokerDown) {
                ExternalServices.control(ctl, "start");
            }
            if (sim != null) {
                sim.close();
            }
            daemon.close();
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
}
