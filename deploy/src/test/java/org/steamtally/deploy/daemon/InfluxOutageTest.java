package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublishers;
import org.steamtally.dashboard.http.DashboardConfig;
import org.steamtally.dashboard.push.LiveResults;
import org.steamtally.dashboard.store.InfluxSettings;
import org.steamtally.dashboard.store.Measurement;
import org.steamtally.dashboard.store.Point;
import org.steamtally.dashboard.store.ResultPoints;
import org.steamtally.dashboard.store.StoredReconciliation;

/**
 * The daemon in process writing to the real InfluxDB through its journal (SpooledStore in front of
 * InfluxStore), while the simulator publishes the regenerative example unit once a second. InfluxDB
 * is stopped through {@value ExternalServices#INFLUX_CTL} for the length of the system property
 * {@value #OUTAGE_PROPERTY} (an ISO-8601 duration, default {@value #DEFAULT_OUTAGE}) and started again;
 * once the journal has drained, every point of every result the daemon produced (states, components,
 * cycle, closures, reconciliation) is in InfluxDB exactly once, and nothing else is.
 *
 * <p>Why two minutes in CI: long enough that the writer's retry wait, which doubles from 0.5 s, reaches
 * its 30 s ceiling (so the test covers the slowest path back) and that the journal holds about 14,000
 * points; short enough that this test, the slowest of the build, adds about two and a half minutes to
 * {@code .ci/run} on the shared two-core machine. Longer outages only make the journal longer; run
 * them by hand, e.g. {@code -D}{@value #OUTAGE_PROPERTY}{@code =PT10M}.
 */
class InfluxOutageTest {

    static final String OUTAGE_PROPERTY = "steamtally.test.influxOutage";
    static final String DEFAULT_OUTAGE = "PT2M";
    private static final Logger LOG = LoggerFactory.getLogger(InfluxOutageTest.class);
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Duration STEP = Duration.ofSeconds(1);
    private static final Duration DEADLINE = Duration.ofSeconds(60);
    /** The writer waits at most 30 s between attempts (docs/STORE.md); replaying takes a few seconds more. */
    private static final Duration DRAIN_DEADLINE = Duration.ofSeconds(180);
    private static final List<Measurement> RESULT_MEASUREMENTS = List.of(Measurement.STATES, Measurement.COMPONENTS,
            Measurement.CYCLE, Measurement.CLOSURE, Measurement.RECONCILIATION);

    @TempDir
    Path dir;

    private final HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();

    @Test
    void afterAnInfluxOutageEveryResultPointIsStoredExactlyOnce() throws Exception {
        String influx = ExternalServices.require(ExternalServices.INFLUX_URL, "the store outage needs the real InfluxDB")
                .replaceAll("/+$", "");
        String ctl = ExternalServices.require(ExternalServices.INFLUX_CTL, "the store outage needs a way to stop InfluxDB");
        Duration outage = Duration.parse(System.getProperty(OUTAGE_PROPERTY, DEFAULT_OUTAGE));

        DaemonConfigFiles files = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText());
        UnitDescription unit = files.plant().units().get(0);
        String site = files.plant().siteId();
        String suffix = ProcessHandle.current().pid() + "_" + System.nanoTime() % 100_000;
        String database = "steamtally_outage_" + suffix;
        Optional<String> externalBroker = ExternalServices.env(ExternalServices.MQTT_URL);
        EmbeddedBroker broker = externalBroker.isPresent() ? null : EmbeddedBroker.start();
        String url = externalBroker.orElseGet(() -> broker.url());
        MqttProtocol protocol = externalBroker.isPresent() ? MqttProtocol.MQTT_5 : MqttProtocol.MQTT_3_1_1;
        CollectorSettings collector = CollectorSettings.builder(List.of(url), "steamtally-outage-daemon-" + suffix)
                .protocol(protocol).build();
        Map<String, String> env = Map.of(InfluxSettings.URL, influx, InfluxSettings.DATABASE, database,
                InfluxSettings.CREATE_DATABASE, "true");
        Daemon daemon = new Daemon(new Daemon.Config(files.plant(), files.alarms(), collector, dir.resolve("data"),
                DashboardConfig.defaults().withPort(0), List.of(), env, Clock.systemUTC()));
        List<UnitResult> produced = Collections.synchronizedList(new ArrayList<>());
        PlantSimulation sim = null;
        boolean influxDown = false;
        try {
            daemon.start();
            LiveResults.Subscription subscription = daemon.live().subscribe(unit.id(), produced::add);
            Simulator simulator = Simulator.builder(TruthModel.of(unit,
                    ExampleDesignPoints.forUnit(site, unit.id()).orElseThrow())).seed(9).build();
            sim = new PlantSimulation(unit, simulator, ReadingPublishers.connect(new PublisherOptions(List.of(url),
                    protocol, "steamtally-outage-sim-" + suffix, PublisherOptions.DEFAULT_WINDOW, true, false)),
                    Clock.systemUTC());
            sim.startPeriodic(STEP);
            ExternalServices.await("10 results stored before the outage", DEADLINE, () -> produced.size() >= 10);

            int before = produced.size();
            Instant down = Instant.now();
            influxDown = true;
            ExternalServices.control(ctl, "stop");
            // The outage lasts in real time: the writer's retries and the service are real.
            long peakSpooled = 0;
            while (Duration.between(down, Instant.now()).compareTo(outage) < 0) {
                peakSpooled = Math.max(peakSpooled, daemon.store().spooledPoints());
                Thread.sleep(1000);
            }
            peakSpooled = Math.max(peakSpooled, daemon.store().spooledPoints());
            int duringOutage = produced.size() - before;
            ExternalServices.control(ctl, "start");
            influxDown = false;
            Instant up = Instant.now();
            ExternalServices.await("the journal replayed", DRAIN_DEADLINE, () -> daemon.store().spooledPoints() == 0);
            Duration replay = Duration.between(up, Instant.now());

            int atUp = produced.size();
            ExternalServices.await("10 results after the outage", DEADLINE, () -> produced.size() >= atUp + 10);
            // Everything up to here was handed to the store before it was published live, so the drain
            // below covers it; later results are left out on both sides of the comparison.
            List<UnitResult> results;
            synchronized (produced) {
                results = List.copyOf(produced);
            }
            long cutoffMs = results.get(results.size() - 1).timestamp().toEpochMilli();
            Instant drainStart = Instant.now();
            assertTrue(daemon.store().awaitDrained(DRAIN_DEADLINE), "the journal drains within " + DRAIN_DEADLINE
                    + "; still " + daemon.store().spooledPoints() + " points in it");
            Duration drain = Duration.between(drainStart, Instant.now());
            subscription.close();

            // What the daemon produced, as points, and what InfluxDB holds.
            Map<Measurement, Set<String>> expected = new HashMap<>();
            for (UnitResult r : results) {
                List<Point> points = new ArrayList<>(ResultPoints.of(r));
                // The store writes a result's reconciliation with it.
                StoredReconciliation.of(r).ifPresent(rec -> points.addAll(ResultPoints.of(rec)));
                for (Point p : points) {
                    if (!p.isEmpty()) {
                        expected.computeIfAbsent(p.measurement(), m -> new HashSet<>()).add(key(p.id(), p.timestampMs()));
                    }
                }
            }
            int checked = 0;
            List<Runnable> failures = new ArrayList<>();
            for (Measurement m : RESULT_MEASUREMENTS) {
                List<String> stored = storedKeys(influx, database, m, site, unit.id(), cutoffMs);
                Set<String> distinct = new HashSet<>(stored);
                Set<String> want = expected.getOrDefault(m, Set.of());
                checked += stored.size();
                Set<String> missing = new TreeSet<>(want);
                missing.removeAll(distinct);
                Set<String> extra = new TreeSet<>(distinct);
                extra.removeAll(want);
                failures.add(() -> assertEquals(stored.size(), distinct.size(), m + ": a point stored twice"));
                failures.add(() -> assertEquals(Set.of(), limit(missing), m + ": " + missing.size() + " points missing"));
                failures.add(() -> assertEquals(Set.of(), limit(extra), m + ": " + extra.size() + " points never produced"));
            }
            List<String> cycle = storedKeys(influx, database, Measurement.CYCLE, site, unit.id(), cutoffMs);
            Set<Long> cycleTimestamps = new HashSet<>();
            cycle.forEach(k -> cycleTimestamps.add(Long.parseLong(k.substring(k.indexOf('@') + 1))));
            LOG.info("InfluxDB outage: {} s down ({} to {}), {} results produced ({} during the outage), journal peak"
                            + " {} points, replayed {} ms after the restart (final drain {} ms); {} points checked in InfluxDB, {} cycle"
                            + " points at {} distinct timestamps", outage.toSeconds(), down, up, results.size(),
                    duringOutage, peakSpooled, replay.toMillis(), drain.toMillis(), checked, cycle.size(), cycleTimestamps.size());
            long peak = peakSpooled;
            failures.add(() -> assertTrue(duringOutage > 0, "results went on during the outage"));
            failures.add(() -> assertTrue(peak > 0, "the journal held the points during the outage"));
            failures.add(() -> assertEquals(results.size(), cycle.size(), "one cycle point per result"));
            failures.add(() -> assertEquals(results.size(), cycleTimestamps.size(), "each at its own timestamp"));
            failures.add(() -> assertEquals(0.0, daemon.registry().find("steamtally.store.spool.dropped").counters()
                    .stream().mapToDouble(c -> c.count()).sum(), "nothing dropped from the journal"));
            assertAll(failures.stream().map(r -> (org.junit.jupiter.api.function.Executable) r::run));
        } finally {
            if (influxDown) {
                ExternalServices.control(ctl, "start");
            }
            if (sim != null) {
                sim.close();
            }
            daemon.close();
            if (broker != null) {
                broker.close();
            }
            try {
                query(influx, database, "DROP DATABASE \"" + database + "\"", true);
            } catch (Exception e) {
                LOG.warn("test database {} not dropped: {}", database, e.toString());
            }
        }
    }

    private static String key(String id, long timestampMs) {
        return id + "@" + timestampMs;
    }

    /** The first few of a large set, so that a failure message stays readable. */
    private static Set<String> limit(Set<String> s) {
        return s.stream().limit(5).collect(java.util.stream.Collectors.toCollection(TreeSet::new));
    }

    /** id@timestamp of every point of one measurement of the unit up to {@code untilMs}, one entry per stored point. */
    private List<String> storedKeys(String influx, String database, Measurement m, String site, String unit,
                                    long untilMs) throws Exception {
        JsonNode body = query(influx, database, "SELECT * FROM \"" + m.measurementName() + "\" WHERE \"site\" = '"
                + site + "' AND \"unit\" = '" + unit + "' AND time <= " + untilMs + "ms", false);
        List<String> keys = new ArrayList<>();
        for (JsonNode series : body.path("results").path(0).path("series")) {
            List<String> columns = new ArrayList<>();
            series.path("columns").forEach(c -> columns.add(c.asText()));
            int time = columns.indexOf("time");
            int id = m.hasIdTag() ? columns.indexOf(m.idTag()) : -1;
            for (JsonNode row : series.path("values")) {
                String idValue = id < 0 || row.path(id).isNull() ? "" : row.path(id).asText();
                keys.add(key(idValue, row.path(time).asLong()));
            }
        }
        return keys;
    }

    /** One InfluxQL statement over the 1.x HTTP API, times in ms. */
    private JsonNode query(String influx, String database, String q, boolean post) throws Exception {
        String params = "db=" + URLEncoder.encode(database, StandardCharsets.UTF_8) + "&epoch=ms&q="
                + URLEncoder.encode(q, StandardCharsets.UTF_8);
        HttpRequest.Builder b = HttpRequest.newBuilder(URI.create(influx + "/query?" + params))
                .timeout(Duration.ofSeconds(30));
        HttpResponse<String> r = http.send(post ? b.POST(HttpRequest.BodyPublishers.noBody()).build() : b.GET().build(),
                HttpResponse.BodyHandlers.ofString());
        assertEquals(200, r.statusCode(), q + ": " + r.body());
        JsonNode body = JSON.readTree(r.body());
        assertTrue(body.path("results").path(0).path("error").isMissingNode(), q + ": " + r.body());
        return body;
    }
}
