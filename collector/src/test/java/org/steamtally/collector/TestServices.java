package org.steamtally.collector;

import static org.junit.jupiter.api.Assertions.fail;

import io.moquette.broker.Server;
import io.moquette.broker.config.IConfig;
import io.moquette.broker.config.MemoryConfig;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.net.URI;
import java.util.Properties;
import org.junit.jupiter.api.Assumptions;

/**
 * The MQTT broker that the collector's tests talk to.
 *
 * <p>{@value #MQTT_URL_VARIABLE} names an external broker ({@code tcp://host:port}), as the CI
 * script does for its Mosquitto. Without it, one embedded Moquette broker is started on a free
 * loopback port for the whole test JVM; it speaks MQTT 3.1.1 only. An external URL that does not
 * answer fails the test rather than skipping it, since someone asked for that broker.
 */
final class TestServices {

  /** Environment variable with the URL of an external MQTT broker, e.g. {@code tcp://127.0.0.1:1883}. */
  static final String MQTT_URL_VARIABLE = "STEAMTALLY_TEST_MQTT_URL";

  /** Environment variable that, set to {@code 1}, turns every missing service into a test failure. */
  static final String REQUIRE_SERVICES_VARIABLE = "STEAMTALLY_REQUIRE_SERVICES";

  // Long enough for a broker that CI started a moment ago on a loaded two-core machine.
  private static final int CONNECT_PROBE_TIMEOUT_MS = 5_000;

  /**
   * Where a broker is, and whether it is the external one (Mosquitto in CI, MQTT 5) or the embedded
   * one (Moquette, MQTT 3.1.1 only).
   */
  record MqttBroker(String serverUri, boolean external) {}

  private static MqttBroker embedded;

  private TestServices() {}

  /**
   * The broker for this test run: the external one when {@value #MQTT_URL_VARIABLE} is set,
   * otherwise the embedded one, started on first use.
   */
  static synchronized MqttBroker mqtt() {
    String url = System.getenv(MQTT_URL_VARIABLE);
    if (url != null && !url.isBlank()) {
      requireReachable(url.trim());
      return new MqttBroker(url.trim(), true);
    }
    if (embedded == null) {
      embedded = startEmbeddedBroker();
    }
    return embedded;
  }

  /** True when {@value #REQUIRE_SERVICES_VARIABLE} asks for failures instead of skips. */
  static boolean servicesRequired() {
    return "1".equals(System.getenv(REQUIRE_SERVICES_VARIABLE));
  }

  /**
   * Skips the calling test with {@code reason}, or fails it when {@value #REQUIRE_SERVICES_VARIABLE}
   * is {@code 1}, so that CI never passes on tests that did not run.
   */
  static void skipOrFail(String reason) {
    if (servicesRequired()) {
      fail(reason + " (" + REQUIRE_SERVICES_VARIABLE + "=1 forbids skipping)");
    }
    Assumptions.abort(reason);
  }

  private static void requireReachable(String url) {
    URI uri = URI.create(url);
    int port = uri.getPort() < 0 ? 1883 : uri.getPort();
    try (Socket socket = new Socket()) {
      socket.connect(new InetSocketAddress(uri.getHost(), port), CONNECT_PROBE_TIMEOUT_MS);
    } catch (IOException e) {
      fail("MQTT broker " + url + " from " + MQTT_URL_VARIABLE + " does not accept connections: " + e);
    }
  }

  private static MqttBroker startEmbeddedBroker() {
    // Moquette reports the configured port, not the bound one, so port 0 cannot be used; a port the
    // kernel just handed out is free with near certainty, and parallel builds do not collide on it.
    int port = freeLoopbackPort();
    Properties properties = new Properties();
    properties.setProperty(IConfig.HOST_PROPERTY_NAME, "127.0.0.1");
    properties.setProperty(IConfig.PORT_PROPERTY_NAME, Integer.toString(port));
    properties.setProperty(IConfig.PERSISTENCE_ENABLED_PROPERTY_NAME, "false");
    // Tests must not report usage to anyone.
    properties.setProperty(IConfig.ENABLE_TELEMETRY_NAME, "false");
    Server server = new Server();
    try {
      server.startServer(new MemoryConfig(properties));
    } catch (IOException e) {
      throw new UncheckedIOException("embedded MQTT broker did not start", e);
    }
    Runtime.getRuntime().addShutdownHook(new Thread(server::stopServer, "embedded-mqtt-stop"));
    return new MqttBroker("tcp://127.0.0.1:" + port, false);
  }

  private static int freeLoopbackPort() {
    try (ServerSocket socket = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
      return socket.getLocalPort();
    } catch (IOException e) {
      throw new UncheckedIOException("no free loopback port for the embedded MQTT broker", e);
    }
  }
}
