package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.function.Predicate;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Fault;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublishers;

/**
 * The daemon as a child JVM ({@code run}), killed with SIGKILL while a suspect alarm is active, then
 * started again on the same data directory: the store opens, results continue, and the alarm is
 * active again with the time it first became active, i.e. restored rather than raised anew.
 */
class DaemonKillTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String SENSOR = "FT-421";

    @TempDir
    Path dir;

    private final HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1)
            .connectTimeout(Duration.ofSeconds(5)).build();

    @Test
    void afterSigkillTheDaemonRestartsWithItsActiveAlarmRestored() throws Exception {
        Optional<String> external = Optional.ofNullable(System.getenv(DemoTest.MQTT_URL_VARIABLE))
                .filter(s -> !s.isBlank()).map(String::trim);
        EmbeddedBroker broker = external.isPresent() ? null : EmbeddedBroker.start();
        String url = external.orElseGet(() -> broker.url());
        Path config = dir.resolve("plant.yaml");
        Files.writeString(config, Demo.exampleText() + "\ncollector:\n  brokers: [" + url + "]\n"
                + "  protocol: \"3.1.1\"\n  client_id: steamtally-kill-test-" + ProcessHandle.current().pid() + "\n",
                StandardCharsets.UTF_8);
        Path data = dir.resolve("data");
        UnitDescription unit = DaemonConfigFiles.load(config).plant().units().get(0);
        Simulator simulator = Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(3)
                .fault(new Fault.Bias(SENSOR, Instant.EPOCH, Duration.ofDays(365 * 100), 10 * 0.625)).build();
        PlantSimulation sim = new PlantSimulation(unit, simulator, ReadingPublishers.connect(new PublisherOptions(
                List.of(url), MqttProtocol.MQTT_3_1_1, "steamtally-kill-test-sim", 1000, true, false)),
                Clock.systemUTC());
        Process first = null;
        Process second = null;
        try {
            sim.startPeriodic(Duration.ofSeconds(1));
            int port = freePort();
            first = launch(config, data, port, "first");
            JsonNode before = awaitSuspect(port, Duration.ofSeconds(60));
            String since = before.path("since").asText();
            // The state is saved right after the change becomes visible; wait for the file to have it.
            Path stateFile = new AlarmStateFile(data, unit.id()).path();
            long deadline = System.nanoTime() + Duration.ofSeconds(10).toNanos();
            while (!(Files.exists(stateFile) && Files.readString(stateFile).contains("ACTIVE_UNACKNOWLEDGED"))) {
                assertTrue(System.nanoTime() < deadline, "alarm state file " + stateFile + " never had the alarm");
                Thread.sleep(100);
            }
            first.destroyForcibly();
            first.waitFor();

            int port2 = freePort();
            second = launch(config, data, port2, "second");
            String lastTs = awaitJson(port2, "/api/v1/units/unit3/live", Duration.ofSeconds(60),
                    j -> j.path("ts").isTextual()).path("ts").asText();
            // The alarm is back at once, with its first activation time: restored, not raised anew.
            JsonNode after = awaitSuspect(port2, Duration.ofSeconds(5));
            assertEquals(since, after.path("since").asText());
            // Results continue after the restart.
            awaitJson(port2, "/api/v1/units/unit3/live", Duration.ofSeconds(15),
                    j -> !j.path("ts").asText().equals(lastTs));

            // SIGTERM: the shutdown hook stops intake, finishes, flushes and exits on its own.
            second.destroy();
            assertTrue(second.waitFor(40, java.util.concurrent.TimeUnit.SECONDS), "the daemon stops on SIGTERM");
            assertTrue(Files.readString(stateFile).contains("ACTIVE_UNACKNOWLEDGED"), "alarm state kept on stop");
        } finally {
            sim.close();
            for (Process p : new Process[] {first, second}) {
                if (p != null && p.isAlive()) {
                    p.destroy();
                    p.waitFor();
                }
            }
            if (broker != null) {
                broker.close();
            }
        }
    }

    private Process launch(Path config, Path data, int port, String name) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder(java, "-Xmx256m", "-cp", System.getProperty("java.class.path"),
                "org.steamtally.deploy.Launcher", "run", "--config", config.toString(), "--data-dir", data.toString(),
                "--http-port", Integer.toString(port));
        pb.environment().remove(OperatorAccounts.USERS_FILE);
        pb.environment().remove("STEAMTALLY_INFLUX_URL");
        pb.redirectErrorStream(true).redirectOutput(dir.resolve(name + ".log").toFile());
        return pb.start();
    }

    private JsonNode awaitSuspect(int port, Duration within) throws Exception {
        JsonNode list = awaitJson(port, "/api/v1/units/unit3/alarms", within, j -> suspect(j).isPresent());
        return suspect(list).orElseThrow();
    }

    private static Optional<JsonNode> suspect(JsonNode alarms) {
        for (JsonNode a : alarms.path("alarms")) {
            if (a.path("id").asText().startsWith("suspect:") && a.path("sensor").asText().equals(SENSOR)
                    && a.path("state").asText().equals("unacknowledged")) {
                return Optional.of(a);
            }
        }
        return Optional.empty();
    }

    private JsonNode awaitJson(int port, String path, Duration within, Predicate<JsonNode> condition)
            throws Exception {
        long deadline = System.nanoTime() + within.toNanos();
        JsonNode last = null;
        while (System.nanoTime() < deadline) {
            try {
                HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + path))
                        .timeout(Duration.ofSeconds(10)).GET().build(), HttpResponse.BodyHandlers.ofString());
                if (r.statusCode() == 200) {
                    last = JSON.readTree(r.body());
                    if (condition.test(last)) {
                        return last;
                    }
                }
            } catch (IOException e) {
                // not listening yet, or the request timed out
            }
            Thread.sleep(250);
        }
        throw new AssertionError(path + " on port " + port + " did not meet the condition within " + within
                + "; last: " + last + "; logs in " + dir);
    }

    private static int freePort() throws IOException {
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            return s.getLocalPort();
        }
    }
}
