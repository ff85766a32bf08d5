package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import java.util.function.BooleanSupplier;
import org.eclipse.paho.mqttv5.client.MqttClient;
import org.eclipse.paho.mqttv5.client.MqttConnectionOptions;
import org.eclipse.paho.mqttv5.client.persist.MemoryPersistence;
import org.eclipse.paho.mqttv5.common.MqttException;
import org.junit.jupiter.api.Assumptions;

/**
 * The real Mosquitto and InfluxDB that {@code .ci/run} starts for the whole-system tests, found
 * through its environment: where each service is ({@code STEAMTALLY_TEST_MQTT_URL},
 * {@code STEAMTALLY_TEST_INFLUX_URL}), a one-argument script that starts, stops or restarts it
 * ({@code STEAMTALLY_TEST_MQTT_CTL}, {@code STEAMTALLY_TEST_INFLUX_CTL}), and whether a missing one
 * fails the test instead of skipping it ({@code STEAMTALLY_REQUIRE_SERVICES=1}).
 */
final class ExternalServices {

    static final String MQTT_URL = "STEAMTALLY_TEST_MQTT_URL";
    static final String MQTT_CTL = "STEAMTALLY_TEST_MQTT_CTL";
    static final String INFLUX_URL = "STEAMTALLY_TEST_INFLUX_URL";
    static final String INFLUX_CTL = "STEAMTALLY_TEST_INFLUX_CTL";
    static final String REQUIRE = "STEAMTALLY_REQUIRE_SERVICES";

    /** Long enough for .ci/service, which itself waits up to 60 s for a start and 20 s for a stop. */
    private static final Duration CONTROL_TIMEOUT = Duration.ofSeconds(120);

    private ExternalServices() {
    }

    /** The variable's trimmed value, empty when unset or blank. */
    static Optional<String> env(String name) {
        return Optional.ofNullable(System.getenv(name)).map(String::trim).filter(s -> !s.isEmpty());
    }

    /** The variable's value, or a skip of the calling test (a failure under {@value #REQUIRE}=1). */
    static String require(String name, String why) {
        Optional<String> v = env(name);
        if (v.isEmpty()) {
            skipOrFail(why + ": set " + name + " (bash .ci/run does)");
        }
        return v.get();
    }

    /** Skips the calling test, or fails it when {@value #REQUIRE} is 1, so CI never passes on tests that did not run. */
    static void skipOrFail(String reason) {
        if ("1".equals(System.getenv(REQUIRE))) {
            fail(reason + " (" + REQUIRE + "=1 forbids skipping)");
        }
        Assumptions.abort(reason);
    }

    /** Runs {@code ctl action} (start, stop, restart) and fails the test when it does not succeed. */
    static void control(String ctl, String action) throws IOException, InterruptedException {
        Process process = new ProcessBuilder(ctl, action).redirectErrorStream(true).start();
        String out = new String(process.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(process.waitFor(CONTROL_TIMEOUT.toSeconds(), TimeUnit.SECONDS), ctl + " " + action
                + " did not finish within " + CONTROL_TIMEOUT);
        assertEquals(0, process.exitValue(), ctl + " " + action + " failed: " + out);
    }

    /** Polls {@code condition} every 50 ms until it holds; an {@link AssertionError} naming {@code what} after {@code within}. */
    static void await(String what, Duration within, BooleanSupplier condition) throws InterruptedException {
        long deadline = System.nanoTime() + within.toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("not within " + within.toSeconds() + " s: " + what);
            }
            Thread.sleep(50);
        }
    }

    /**
     * Ends the broker's persistent sessions of these client ids (a connect with clean start and no
     * session expiry), so that a broker which keeps sessions over restarts does not go on queuing
     * readings for clients of finished tests. Best effort: a failure is only reported.
     */
    static void endSessions(String url, String... clientIds) {
        for (String id : clientIds) {
            try {
                MqttClient client = new MqttClient(url, id, new MemoryPersistence());
                MqttConnectionOptions options = new MqttConnectionOptions();
                options.setCleanStart(true);
                options.setSessionExpiryInterval(0L);
                client.connect(options);
                client.disconnect();
                client.close();
            } catch (MqttException e) {
                System.err.println("could not end the MQTT session of " + id + ": " + e);
            }
        }
    }
}
