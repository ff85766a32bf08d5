package org.steamtally.deploy.daemon;

import io.micrometer.prometheusmetrics.PrometheusConfig;
import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import io.vertx.core.Vertx;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.TimeUnit;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.deploy.config.WindowChannelSettings;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.mqtt.ConnectionListener;
import org.steamtally.collector.mqtt.ConnectionState;
import org.steamtally.collector.mqtt.MqttCollector;
import org.steamtally.dashboard.http.DashboardConfig;
import org.steamtally.dashboard.http.DashboardServer;
import org.steamtally.dashboard.http.DashboardSources;
import org.steamtally.dashboard.push.InMemoryLiveResults;
import org.steamtally.dashboard.security.AuditLog;
import org.steamtally.dashboard.security.UserAccount;
import org.steamtally.dashboard.store.H2Store;
import org.steamtally.dashboard.store.InfluxSettings;
import org.steamtally.dashboard.store.InfluxStore;
import org.steamtally.dashboard.store.SpoolSettings;
import org.steamtally.dashboard.store.SpooledStore;
import org.steamtally.dashboard.store.StoreBackend;
import org.steamtally.dashboard.store.StoreListener;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * The daemon wired together: the MQTT collector, one {@link UnitMonitor} per unit, the result store
 * and the dashboard, sharing one meter registry and one clock. {@link #start} brings them up in the
 * order data flows backwards (store, monitors, dashboard, then intake), {@link #close} takes them down
 * in the order data flows: stop intake, finish the snapshots in hand, flush the store, close.
 */
public final class Daemon implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(Daemon.class);
    /** How long a batch of points may wait for more before it is written: a second's results, at most. */
    static final Duration STORE_LINGER = Duration.ofSeconds(1);

    /** Results are kept this long in the embedded store (a year and a bit, for year-on-year review). */
    public static final Duration H2_RETENTION = Duration.ofDays(400);
    /** The store is given this long to take the last points on shutdown. */
    public static final Duration FLUSH_TIMEOUT = Duration.ofSeconds(20);
    /** A unit with no result for this long shows as stale. */
    public static final Duration STALE_AFTER = Duration.ofSeconds(10);
    /**
     * Points per result of the regenerative example (states, components, cycle, closures and the
     * reconciliation's sensors), rounded up: sizes the journal for a day of store outage.
     */
    private static final double POINTS_PER_RESULT = 120;
    private static final double BYTES_PER_POINT = 200;

    /**
     * What the daemon needs.
     *
     * @param plant      the plant description
     * @param alarms     the alarm settings
     * @param collector  how to reach the broker
     * @param dataDir    the data directory: embedded store, journal, alarm state
     * @param dashboard  the dashboard's address and options
     * @param users      the dashboard's accounts
     * @param env        the environment (InfluxDB settings, secrets)
     * @param clock      the clock for everything
     * @param window     the window channel's settings ({@code alarms.window})
     */
    public record Config(PlantDescription plant, AlarmSettings alarms, CollectorSettings collector, Path dataDir,
                         DashboardConfig dashboard, List<UserAccount> users, Map<String, String> env, Clock clock,
                         WindowChannelSettings window) {

        /** A configuration with the window channel at its defaults. */
        public Config(PlantDescription plant, AlarmSettings alarms, CollectorSettings collector, Path dataDir,
                      DashboardConfig dashboard, List<UserAccount> users, Map<String, String> env, Clock clock) {
            this(plant, alarms, collector, dataDir, dashboard, users, env, clock, WindowChannelSettings.DEFAULTS);
        }

        public Config {
            Objects.requireNonNull(window, "window");
            Objects.requireNonNull(plant, "plant");
            Objects.requireNonNull(alarms, "alarms");
            Objects.requireNonNull(collector, "collector");
            Objects.requireNonNull(dataDir, "dataDir");
            Objects.requireNonNull(dashboard, "dashboard");
            users = List.copyOf(users);
            env = Map.copyOf(env);
            Objects.requireNonNull(clock, "clock");
        }
    }

    private final Config config;
    private final PrometheusMeterRegistry registry = new PrometheusMeterRegistry(PrometheusConfig.DEFAULT);
    private final List<DashboardServer.Extension> extensions = new ArrayList<>();
    private SpooledStore store;
    private InMemoryLiveResults live;
    private final List<UnitMonitor> monitors = new ArrayList<>();
    private EngineAlarmBoard board;
    private Vertx vertx;
    private DashboardServer server;
    private MqttCollector collector;
    private int httpPort = -1;
    private volatile boolean closed;

    public Daemon(Config config) {
        this.config = config;
    }

    /** Adds routes to the dashboard; call before {@link #start}. */
    public Daemon extend(DashboardServer.Extension extension) {
        extensions.add(extension);
        return this;
    }

    /**
     * Opens the store, restores the alarms, starts the dashboard and then the intake.
     *
     * @throws IOException when the data directory or the journal cannot be used
     */
    public synchronized Daemon start() throws IOException {
        Clock clock = config.clock();
        PlantDescription plant = config.plant();
        store = openStore();
        live = new InMemoryLiveResults(plant, clock, STALE_AFTER);
        vertx = Vertx.vertx();
        collector = MqttCollector.start(plant, config.collector(), registry, clock, new ConnectionListener() {
            @Override
            public void stateChanged(ConnectionState state, java.util.Optional<Throwable> cause) {
                LOG.info("broker connection {}{}", state, cause.map(t -> ": " + t.getMessage()).orElse(""));
            }

            @Override
            public void downTooLong(Duration down) {
                LOG.warn("broker connection down for {}", down);
            }
        }, config.env()::get);
        EvaluationSlots slots = EvaluationSlots.perCore();
        for (UnitDescription unit : plant.units()) {
            UnitMonitor m = new UnitMonitor(plant.siteId(), unit, config.alarms(), config.window(),
                    config.collector().snapshotPeriod(), collector.slot(unit.id())::take, store, live,
                    new AlarmStateFile(config.dataDir(), unit.id()), registry, clock, slots);
            monitors.add(m);
        }
        board = new EngineAlarmBoard(monitors);
        server = new DashboardServer(vertx, new DashboardSources(plant, live, board, config.users(),
                AuditLog.inMemory(), registry, clock), config.dashboard());
        extensions.forEach(server::extend);
        monitors.forEach(UnitMonitor::start);
        httpPort = await(server.start());
        LOG.info("steamtally started: {} unit(s) of site {}, store {}, dashboard on port {}", plant.units().size(),
                plant.siteId(), store.backend().name(), httpPort);
        return this;
    }

    private SpooledStore openStore() throws IOException {
        Clock clock = config.clock();
        StoreBackend backend;
        if (config.env().containsKey(InfluxSettings.URL)) {
            InfluxSettings influx = InfluxSettings.fromEnvironment(config.env());
            backend = InfluxStore.connect(influx);
            LOG.info("store: InfluxDB at {}", influx);
        } else {
            backend = H2Store.open(config.dataDir().resolve("store"), H2_RETENTION, Duration.ofHours(1), clock);
            LOG.info("store: embedded H2 in {}", config.dataDir().resolve("store"));
        }
        double pointsPerSecond = config.plant().units().size() * POINTS_PER_RESULT
                / config.collector().snapshotPeriod().toMillis() * 1000.0;
        SpoolSettings spool = SpoolSettings.forNominalRate(config.dataDir().resolve("spool"), pointsPerSecond,
                BYTES_PER_POINT);
        if (backend instanceof InfluxStore) {
            spool = spool.withBatchSize(InfluxStore.BATCH_POINTS);
        }
        // The results of all units come in a burst at each snapshot time: written as they come, each
        // burst was a score of small writes competing with the burst's own evaluations for the CPU.
        spool = spool.withLinger(STORE_LINGER, SpoolSettings.LINGER_GAP);
        return SpooledStore.open(backend, spool, registry, new StoreListener() {
            @Override
            public void spoolDropped(long points, long totalDropped, Instant at) {
                LOG.error("store journal full: {} points dropped ({} in all)", points, totalDropped);
            }

            @Override
            public void storeUnavailable(String reason, Instant at) {
                LOG.warn("store unavailable, writing to the journal: {}", reason);
            }

            @Override
            public void storeRecovered(Instant at) {
                LOG.info("store available again, replaying the journal");
            }

            @Override
            public void pointsRejected(long points, String reason, Instant at) {
                LOG.error("store refused {} points: {}", points, reason);
            }
        }, clock);
    }

    private static <T> T await(io.vertx.core.Future<T> f) throws IOException {
        try {
            return f.toCompletionStage().toCompletableFuture().get(30, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted", e);
        } catch (java.util.concurrent.ExecutionException | java.util.concurrent.TimeoutException e) {
            throw new IOException(e.getCause() == null ? e.toString() : e.getCause().getMessage(), e);
        }
    }

    /** The dashboard's port (the bound one when 0 was asked for). */
    public int httpPort() {
        return httpPort;
    }

    public PrometheusMeterRegistry registry() {
        return registry;
    }

    public InMemoryLiveResults live() {
        return live;
    }

    public EngineAlarmBoard board() {
        return board;
    }

    public List<UnitMonitor> monitors() {
        return List.copyOf(monitors);
    }

    public SpooledStore store() {
        return store;
    }

    /** Stops intake, finishes the snapshots in hand, flushes the store, closes the session and the rest. */
    @Override
    public synchronized void close() {
        if (closed) {
            return;
        }
        closed = true;
        LOG.info("steamtally stopping");
        if (collector != null) {
            collector.close();
        }
        monitors.forEach(UnitMonitor::close);
        if (server != null) {
            try {
                await(server.stop());
            } catch (Exception e) {
                LOG.warn("dashboard did not stop cleanly: {}", e.toString());
            }
        }
        if (store != null) {
            try {
                if (!store.flush(FLUSH_TIMEOUT)) {
                    LOG.warn("store not flushed within {}; the rest stays in the journal for the next start",
                            FLUSH_TIMEOUT);
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            store.close();
        }
        if (vertx != null) {
            try {
                await(vertx.close());
            } catch (Exception e) {
                LOG.warn("Vert.x did not stop cleanly: {}", e.toString());
            }
        }
        LOG.info("steamtally stopped");
    }
}
