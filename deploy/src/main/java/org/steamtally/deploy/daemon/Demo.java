package org.steamtally.deploy.daemon;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.security.SecureRandom;
import java.time.Clock;
import java.time.Duration;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublishers;
import org.steamtally.dashboard.http.DashboardConfig;
import org.steamtally.dashboard.security.PasswordHash;
import org.steamtally.dashboard.security.Role;
import org.steamtally.dashboard.security.UserAccount;
import org.steamtally.deploy.config.PlantDescriptionException;

/**
 * The demo without external services: an embedded broker (or a given one), the regenerative example
 * unit simulated at its design point and published over MQTT 3.1.1 once a second in real time, the
 * daemon with its embedded store in {@code dataDir}, and the dashboard with the fault-injection
 * routes. One operator account, {@value #OPERATOR}, with a password made up at start.
 */
public final class Demo implements AutoCloseable {

    /** The shipped example the demo runs, inside the jar. */
    public static final String EXAMPLE_RESOURCE = "/org/steamtally/deploy/examples/regenerative.yaml";
    public static final String OPERATOR = "demo";
    /** Fixed so that two runs of the demo show the same noise. */
    private static final long SEED = 20261202L;
    private static final Duration STEP = Duration.ofSeconds(1);

    private final EmbeddedBroker broker;
    private final Daemon daemon;
    private final PlantSimulation simulation;
    private final String password;
    private final String brokerUrl;

    private Demo(EmbeddedBroker broker, String brokerUrl, Daemon daemon, PlantSimulation simulation,
                 String password) {
        this.broker = broker;
        this.brokerUrl = brokerUrl;
        this.daemon = daemon;
        this.simulation = simulation;
        this.password = password;
    }

    /**
     * Starts everything.
     *
     * @param httpPort  the dashboard's port, 0 for any free one
     * @param dataDir   the data directory (store, journal, alarm state)
     * @param brokerUrl an external broker to use instead of the embedded one (tests against Mosquitto)
     * @param env       the environment (an InfluxDB given there is used instead of the embedded store)
     * @param clock     the clock of the daemon and the simulation
     */
    public static Demo start(int httpPort, Path dataDir, Optional<String> brokerUrl, Map<String, String> env,
                             Clock clock) throws IOException, PlantDescriptionException {
        DaemonConfigFiles files = DaemonConfigFiles.parse("regenerative.yaml", exampleText());
        UnitDescription unit = files.plant().units().get(0);
        EmbeddedBroker broker = brokerUrl.isPresent() ? null : EmbeddedBroker.start();
        // A lambda, not broker::url: a method reference evaluates its receiver at once, and there is no
        // embedded broker when an external one is given.
        String url = brokerUrl.orElseGet(() -> broker.url());
        String suffix = HexFormat.of().formatHex(randomBytes(4));
        CollectorSettings collector = CollectorSettings.builder(List.of(url), "steamtally-demo-" + suffix)
                .protocol(MqttProtocol.MQTT_3_1_1).build();
        String password = HexFormat.of().formatHex(randomBytes(8));
        List<UserAccount> users = List.of(new UserAccount(OPERATOR, Role.OPERATOR,
                PasswordHash.create(password.toCharArray())));
        Daemon daemon = null;
        PlantSimulation sim = null;
        try {
            Simulator simulator = Simulator.builder(TruthModel.of(unit,
                    ExampleDesignPoints.forUnit(files.plant().siteId(), unit.id()).orElseThrow())).seed(SEED).build();
            sim = new PlantSimulation(unit, simulator, ReadingPublishers.connect(new PublisherOptions(List.of(url),
                    MqttProtocol.MQTT_3_1_1, "steamtally-demo-sim-" + suffix, PublisherOptions.DEFAULT_WINDOW, true,
                    false)), clock);
            daemon = new Daemon(new Daemon.Config(files.plant(), files.alarms(), collector, dataDir,
                    DashboardConfig.defaults().withPort(httpPort), users, env, clock, files.window()));
            daemon.extend(new DemoFaults(Map.of(unit.id(), sim), clock));
            daemon.start();
            sim.startPeriodic(STEP);
            return new Demo(broker, url, daemon, sim, password);
        } catch (IOException | RuntimeException e) {
            if (sim != null) {
                sim.close();
            }
            if (daemon != null) {
                daemon.close();
            }
            if (broker != null) {
                broker.close();
            }
            throw e;
        }
    }

    /** The text of the shipped regenerative example. */
    public static String exampleText() throws IOException {
        try (InputStream in = Demo.class.getResourceAsStream(EXAMPLE_RESOURCE)) {
            if (in == null) {
                throw new IOException(EXAMPLE_RESOURCE + " is missing from the jar");
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
    }

    private static byte[] randomBytes(int n) {
        byte[] b = new byte[n];
        new SecureRandom().nextBytes(b);
        return b;
    }

    public Daemon daemon() {
        return daemon;
    }

    public PlantSimulation simulation() {
        return simulation;
    }

    /** The dashboard's address. */
    public String address() {
        return "http://127.0.0.1:" + daemon.httpPort();
    }

    /** The broker the simulation publishes to and the collector reads from. */
    public String brokerUrl() {
        return brokerUrl;
    }

    /** The operator's password for this run. */
    public String operatorPassword() {
        return password;
    }

    @Override
    public void close() {
        simulation.close();
        daemon.close();
        if (broker != null) {
            broker.close();
        }
    }
}
