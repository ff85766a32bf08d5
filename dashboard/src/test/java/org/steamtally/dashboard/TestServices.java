package org.steamtally.dashboard;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.time.Duration;
import org.junit.jupiter.api.Assumptions;
import org.testcontainers.DockerClientFactory;
import org.testcontainers.containers.GenericContainer;
import org.testcontainers.containers.wait.strategy.Wait;
import org.testcontainers.utility.DockerImageName;

/**
 * The InfluxDB 1.x server that the dashboard's tests talk to.
 *
 * <p>{@value #INFLUX_URL_VARIABLE} names a running server ({@code http://host:port}), as the CI
 * script does. Without it, a throw-away {@code influxdb:1.8} container is started when Docker is
 * available; there is no in-process InfluxDB. Otherwise the test is skipped, or fails when
 * {@value #REQUIRE_SERVICES_VARIABLE} is {@code 1}. A configured URL that does not answer fails the
 * test rather than skipping it, since someone asked for that server.
 */
public final class TestServices {

  /** Environment variable with the URL of an InfluxDB 1.x server, e.g. {@code http://127.0.0.1:8086}. */
  public static final String INFLUX_URL_VARIABLE = "STEAMTALLY_TEST_INFLUX_URL";

  /** Environment variable that, set to {@code 1}, turns every missing service into a test failure. */
  public static final String REQUIRE_SERVICES_VARIABLE = "STEAMTALLY_REQUIRE_SERVICES";

  private static final String CONTAINER_IMAGE = "influxdb:1.8";
  private static final int INFLUX_HTTP_PORT = 8086;

  // InfluxDB answers /ping with 204 No Content when it is up (InfluxDB 1.x HTTP API).
  private static final int PING_OK = 204;

  // Long enough for a server that CI started a moment ago on a loaded two-core machine.
  private static final Duration PING_TIMEOUT = Duration.ofSeconds(5);

  private static String containerUrl;

  private TestServices() {}

  /**
   * The base URL of the InfluxDB server for this test run, without a trailing slash. Skips or fails
   * the calling test when there is none.
   */
  public static synchronized String influxUrl() {
    String url = System.getenv(INFLUX_URL_VARIABLE);
    if (url != null && !url.isBlank()) {
      String trimmed = url.trim().replaceAll("/+$", "");
      requirePing(trimmed);
      return trimmed;
    }
    if (containerUrl == null) {
      if (!DockerClientFactory.instance().isDockerAvailable()) {
        skipOrFail(
            "no InfluxDB: set " + INFLUX_URL_VARIABLE + "=http://host:8086, or make Docker available"
                + " for a throw-away " + CONTAINER_IMAGE + " container");
      }
      containerUrl = startContainer();
    }
    return containerUrl;
  }

  /**
   * Skips the calling test with {@code reason}, or fails it when {@value #REQUIRE_SERVICES_VARIABLE}
   * is {@code 1}, so that CI never passes on tests that did not run.
   */
  public static void skipOrFail(String reason) {
    if ("1".equals(System.getenv(REQUIRE_SERVICES_VARIABLE))) {
      fail(reason + " (" + REQUIRE_SERVICES_VARIABLE + "=1 forbids skipping)");
    }
    Assumptions.abort(reason);
  }

  private static void requirePing(String url) {
    HttpClient http = HttpClient.newBuilder().connectTimeout(PING_TIMEOUT).build();
    HttpRequest ping = HttpRequest.newBuilder(URI.create(url + "/ping")).timeout(PING_TIMEOUT).build();
    try {
      int status = http.send(ping, HttpResponse.BodyHandlers.discarding()).statusCode();
      if (status != PING_OK) {
        fail("InfluxDB " + url + " from " + INFLUX_URL_VARIABLE + " answered /ping with " + status);
      }
    } catch (IOException e) {
      fail("InfluxDB " + url + " from " + INFLUX_URL_VARIABLE + " does not answer /ping: " + e);
    } catch (InterruptedException e) {
      Thread.currentThread().interrupt();
      fail("interrupted while pinging InfluxDB " + url);
    }
  }

  private static String startContainer() {
    GenericContainer<?> container =
        new GenericContainer<>(DockerImageName.parse(CONTAINER_IMAGE))
            .withExposedPorts(INFLUX_HTTP_PORT)
            .withEnv("INFLUXDB_REPORTING_DISABLED", "true")
            .waitingFor(Wait.forHttp("/ping").forStatusCode(PING_OK));
    container.start();
    Runtime.getRuntime().addShutdownHook(new Thread(container::stop, "influxdb-container-stop"));
    return "http://" + container.getHost() + ":" + container.getMappedPort(INFLUX_HTTP_PORT);
  }
}
