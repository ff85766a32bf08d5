package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import io.micrometer.core.instrument.Counter;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Predicate;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.MethodOrderer;
import org.junit.jupiter.api.Order;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.TestMethodOrder;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublisher;
import org.steamtally.collector.mqtt.ReadingPublishers;

/**
 * The demo end to end over HTTP, in real time: embedded broker (or the external one named by
 * {@value #MQTT_URL_VARIABLE}), simulator, collector, calculation, embedded store and dashboard on a
 * free port with a temporary data directory. Waits poll with deadlines; nothing sleeps to let
 * simulated time pass.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
@TestMethodOrder(MethodOrderer.OrderAnnotation.class)
class DemoTest {

    static final String MQTT_URL_VARIABLE = "STEAMTALLY_TEST_MQTT_URL";
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String UNIT = "unit3";

    @TempDir
    static Path dataDir;

    private Demo demo;
    private final HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1)
            .connectTimeout(Duration.ofSeconds(5)).build();

    @BeforeAll
    void startDemo() throws Exception {
        Optional<String> external = Optional.ofNullable(System.getenv(MQTT_URL_VARIABLE)).filter(s -> !s.isBlank())
                .map(String::trim);
        demo = Demo.start(0, dataDir, external, Map.of(), Clock.systemUTC());
    }

    @AfterAll
    void stopDemo() {
        if (demo != null) {
            demo.close();
        }
    }

    private HttpResponse<String> get(String path) throws Exception {
        return http.send(HttpRequest.newBuilder(URI.create(demo.address() + path)).timeout(Duration.ofSeconds(10)).GET().build(),
                HttpResponse.BodyHandlers.ofString());
    }

    private JsonNode awaitJson(String path, Duration within, Predicate<JsonNode> condition) throws Exception {
        long deadline = System.nanoTime() + within.toNanos();
        JsonNode last = null;
        while (System.nanoTime() < deadline) {
            HttpResponse<String> r = get(path);
            if (r.statusCode() == 200) {
                last = JSON.readTree(r.body());
                if (condition.test(last)) {
                    return last;
                }
            }
            Thread.sleep(250);
        }
        throw new AssertionError(path + " did not meet the condition within " + within + "; last: " + last);
    }

    @Test
    @Order(1)
    void theLiveApiShowsAPlausibleEfficiencyWithinThirtySeconds() throws Exception {
        JsonNode live = awaitJson("/api/v1/units/" + UNIT + "/live", Duration.ofSeconds(30),
                j -> j.path("cycle").path("thermal_efficiency").isNumber());
        double eta = live.path("cycle").path("thermal_efficiency").asDouble();
        // A reheat-regenerative unit of this size runs at about 0.38 to 0.45 (common practice); the
        // design point gives 0.413 (docs/SIMULATOR.md).
        assertTrue(eta > 0.3 && eta < 0.5, "thermal efficiency " + eta);
    }

    @Test
    @Order(2)
    void healthAndMetricsAnswer() throws Exception {
        awaitJson("/health", Duration.ofSeconds(30), j -> j.path("ready").path("ready").asBoolean());
        HttpResponse<String> metrics = get("/metrics");
        assertEquals(200, metrics.statusCode());
        assertTrue(metrics.body().contains("steamtally_snapshot_latency_seconds"), "snapshot latency timer");
        assertTrue(metrics.body().contains("steamtally_calc_time_seconds"), "calculation timer");
        assertTrue(metrics.body().contains("steamtally_readings_accepted"), "the collector's meters, same registry");
        assertTrue(metrics.body().contains("steamtally_store_queue_depth"), "the store's meters, same registry");
    }

    @Test
    @Order(3)
    void malformedAndHostileMessagesAreAllCountedAsRejectedAndTheResultsCarryOn() throws Exception {
        awaitJson("/api/v1/units/" + UNIT + "/live", Duration.ofSeconds(30),
                j -> j.path("cycle").path("thermal_efficiency").isNumber());
        double before = rejected();
        List<String> hostile = List.of(
                "not json {",
                "",
                "\"12.5\"",
                "{\"value\": NaN}",
                "{\"value\": 1.0e7, \"ts\": 5}",
                "{\"value\": 1.0e7, \"unit\": \"Cel\"}",
                "{\"value\": 1.0e7, \"unit\": \"furlong\"}",
                "{\"reading\": 3}",
                "[1, 2]",
                "{\"value\": \"<script>alert(1)</script>\"}");
        int n = 1000;
        try (ReadingPublisher p = ReadingPublishers.connect(new PublisherOptions(List.of(demo.brokerUrl()),
                MqttProtocol.MQTT_3_1_1, "steamtally-test-hostile", 100, true, false))) {
            for (int i = 0; i < n; i++) {
                p.publish("fernholm/unit3/PT-101", hostile.get(i % hostile.size()).getBytes(StandardCharsets.UTF_8), 1);
            }
            assertTrue(p.awaitIdle(Duration.ofSeconds(30)), "publisher idle");
        }
        long deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
        while (rejected() - before < n && System.nanoTime() < deadline) {
            Thread.sleep(100);
        }
        assertEquals(n, rejected() - before, 0.0, "every hostile message counted as rejected once");
        long processed = demo.daemon().monitors().get(0).processed();
        JsonNode live = awaitJson("/api/v1/units/" + UNIT + "/live", Duration.ofSeconds(15),
                j -> demo.daemon().monitors().get(0).processed() > processed + 3);
        double eta = live.path("cycle").path("thermal_efficiency").asDouble();
        assertTrue(eta > 0.3 && eta < 0.5, "thermal efficiency after the hostile messages " + eta);
    }

    private double rejected() {
        return demo.daemon().registry().find("steamtally.readings.rejected").counters().stream()
                .mapToDouble(Counter::count).sum();
    }

    @Test
    @Order(4)
    void aBiasInjectedFromTheDashboardMakesTheSuspectAlarmNameTheSensor() throws Exception {
        awaitJson("/api/v1/units/" + UNIT + "/live", Duration.ofSeconds(30),
                j -> j.path("cycle").path("thermal_efficiency").isNumber());
        HttpResponse<String> login = http.send(HttpRequest.newBuilder(URI.create(demo.address() + "/api/v1/session"))
                .header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString("{\"user\":\"" + Demo.OPERATOR + "\",\"password\":\""
                        + demo.operatorPassword() + "\"}")).build(), HttpResponse.BodyHandlers.ofString());
        assertEquals(200, login.statusCode(), login.body());
        String cookie = login.headers().firstValue("Set-Cookie").orElseThrow().split(";", 2)[0];
        String csrf = JSON.readTree(login.body()).path("csrf_token").asText();

        String body = "{\"sensor\":\"FT-421\",\"kind\":\"bias\",\"size_sigma\":10,\"duration_s\":600}";
        HttpResponse<String> refused = http.send(HttpRequest.newBuilder(URI.create(demo.address()
                        + "/api/v1/demo/faults")).header("Content-Type", "application/json").header("Cookie", cookie)
                .POST(HttpRequest.BodyPublishers.ofString(body)).build(), HttpResponse.BodyHandlers.ofString());
        assertEquals(403, refused.statusCode(), "without the CSRF token: " + refused.body());

        HttpResponse<String> injected = http.send(HttpRequest.newBuilder(URI.create(demo.address()
                        + "/api/v1/demo/faults")).header("Content-Type", "application/json").header("Cookie", cookie)
                .header("X-CSRF-Token", csrf).POST(HttpRequest.BodyPublishers.ofString(body)).build(),
                HttpResponse.BodyHandlers.ofString());
        assertEquals(201, injected.statusCode(), injected.body());

        // On-delay 10 s at 1 snapshot a second, plus the alignment: well within a minute.
        JsonNode alarms = awaitJson("/api/v1/units/" + UNIT + "/alarms", Duration.ofSeconds(60),
                j -> {
                    for (JsonNode a : j.path("alarms")) {
                        if (a.path("id").asText().startsWith("suspect:")
                                && (a.path("sensor").asText().equals("FT-421")
                                || a.path("message").asText().contains("FT-421"))) {
                            return true;
                        }
                    }
                    return false;
                });
        assertTrue(alarms.path("alarms").size() >= 1);
    }
}
