package org.steamtally.deploy.bench;

import com.sun.management.OperatingSystemMXBean;
import io.vertx.core.Vertx;
import io.vertx.core.buffer.Buffer;
import io.vertx.core.http.HttpClient;
import io.vertx.core.http.HttpClientOptions;
import io.vertx.core.http.HttpMethod;
import io.vertx.core.http.PoolOptions;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.net.URI;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.AtomicLongArray;
import java.util.stream.Stream;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.SimulatedReading;
import org.steamtally.calc.sim.SimulatedSample;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublisher;
import org.steamtally.collector.mqtt.ReadingPublishers;
import org.steamtally.dashboard.store.Measurement;
import org.steamtally.deploy.config.PlantDescriptionLoader;
import org.steamtally.deploy.daemon.ExampleDesignPoints;

/**
 * The fleet benchmark, end to end: N copies of the regenerative example's unit at 1 Hz per sensor
 * through a Mosquitto of its own, into the daemon ({@code steamtally.jar run}, a child JVM with its
 * own heap limit and the embedded store, or with {@code store=influx} an influxd of the driver's own
 * on free loopback ports), with one Server-Sent-Events stream per unit open on the
 * dashboard as a browser would hold it. A load driver, not a test.
 *
 * <p>Each second T (wall clock, whole seconds) the driver steps every unit's {@link Simulator} at T
 * and publishes its readings, stamped T, at QoS 1 over one MQTT 5 connection, as {@code simulate}
 * does. For every result that arrives on a stream it measures, against the same clock:
 * <ul>
 *   <li><b>from the completing reading</b>: from the end of the publish call of the unit's last
 *       reading of step T (the reading that completes snapshot T) to the event's arrival;
 *   <li><b>from the first reading</b>: from the publish of the unit's first reading of step T;
 *   <li><b>after due</b>: from T + allowed lateness (when the collector hands the snapshot on at the
 *       latest) to the arrival: the daemon's own share.
 * </ul>
 * After the warm-up it counts, over the measurement window, results received on the streams and (after
 * the daemon stopped) stored in the store against N × seconds expected, readings accepted and
 * refused from {@code /metrics}, the daemon's heap (jstat, once a second), CPU time of the daemon,
 * Mosquitto and the driver, and the machine's load. It prints one PASS or FAIL line against the targets
 * and exits 1 when a target is missed.
 *
 * <pre>
 * java -cp ... org.steamtally.deploy.bench.FleetLoadDriver [units=100] [warmup=60] [measure=300]
 *     [lateness=500ms] [spread=0ms] [heap=512m] [store=h2|influx] [influx_nice=0] [jar=deploy/target/steamtally.jar]
 *     [trace=0] [stall=SECONDS@AT]
 *     [example=deploy/examples/regenerative.yaml]
 *     [keep=false]
 * </pre>
 */
public final class FleetLoadDriver {

    /** Targets of the benchmark. */
    static final double P99_TARGET_MS = 200;
    static final double KEPT_UP_FRACTION = 0.999;

    private static final int RING = 64;

    private final Map<String, String> opts;
    private final int units;
    private final int warmup;
    private final int measure;
    private final String lateness;
    private final long latenessMs;
    /**
     * How far the units' publications are spread over each second: unit u publishes its readings of
     * step T (stamped T) at T + u × spread / units, as gateways that each poll their own unit would;
     * 0, all at T at once, is the worst case.
     */
    private final long spreadMs;
    private final Path work;
    /** Where the daemon stores its results: {@code h2}, the embedded store, or {@code influx}, an influxd of our own. */
    private final String store;
    private final List<Process> children = new ArrayList<>();
    private volatile boolean stopping;

    // step bookkeeping: [second % RING][unit]
    private final long[][] stepSecond;
    private final long[][] firstPublishMicros;
    private final long[][] lastPublishMicros;

    private final List<Long> fromLast = new ArrayList<>();
    private final List<Long> fromFirst = new ArrayList<>();
    private final List<Long> afterDue = new ArrayList<>();
    private AtomicLongArray receivedInWindow;
    private final AtomicLong lateSteps = new AtomicLong();
    private final AtomicLong reconnects = new AtomicLong();
    private final List<Long> scrapeMillis = new ArrayList<>();
    private final AtomicLong publishedInWindow = new AtomicLong();
    private final AtomicLong maxStepMillis = new AtomicLong();
    private volatile long windowStart;
    private Duration storeDrain = Duration.ZERO;
    /** The store's backlog traced every {@code trace} seconds: peak points queued, peak journal bytes, and when it last cleared. */
    private volatile double peakQueued;
    private volatile double peakSpoolBytes;
    private volatile long backlogClearedAtMillis = -1;
    private volatile long stallEndMillis = -1;
    private boolean storeDrained;
    private volatile long windowEnd;

    private FleetLoadDriver(Map<String, String> opts) throws IOException {
        this.opts = opts;
        this.units = Integer.parseInt(opts.getOrDefault("units", "100"));
        this.warmup = Integer.parseInt(opts.getOrDefault("warmup", "60"));
        this.measure = Integer.parseInt(opts.getOrDefault("measure", "300"));
        this.lateness = opts.getOrDefault("lateness", "500ms");
        if (!lateness.matches("\\d+ms")) {
            throw new IllegalArgumentException("lateness=" + lateness + ": expected whole milliseconds, e.g. 500ms");
        }
        this.latenessMs = Long.parseLong(lateness.substring(0, lateness.length() - 2));
        String spread = opts.getOrDefault("spread", "0ms");
        if (!spread.matches("\\d+ms")) {
            throw new IllegalArgumentException("spread=" + spread + ": expected whole milliseconds, e.g. 400ms");
        }
        this.spreadMs = Long.parseLong(spread.substring(0, spread.length() - 2));
        if (spreadMs >= latenessMs && spreadMs > 0) {
            throw new IllegalArgumentException("spread=" + spread + " must be shorter than lateness=" + lateness
                    + ": a reading published after its snapshot's lateness is late");
        }
        this.store = opts.getOrDefault("store", "h2");
        if (!store.equals("h2") && !store.equals("influx")) {
            throw new IllegalArgumentException("store=" + store + ": expected h2 (the embedded store) or influx");
        }
        this.work = Files.createTempDirectory("steamtally-fleet-");
        this.stepSecond = new long[RING][units];
        this.firstPublishMicros = new long[RING][units];
        this.lastPublishMicros = new long[RING][units];
        for (long[] row : stepSecond) {
            Arrays.fill(row, -1);
        }
    }

    public static void main(String[] args) throws Exception {
        Map<String, String> opts = new LinkedHashMap<>();
        for (String a : args) {
            int eq = a.indexOf('=');
            if (eq < 1) {
                System.err.println("arguments are key=value: units, warmup, measure, lateness, spread, heap, store, influx_nice, trace, stall, jar,"
                        + " example,"
                        + " keep;"
                        + " got '" + a + "'");
                System.exit(2);
            }
            opts.put(a.substring(0, eq), a.substring(eq + 1));
        }
        FleetLoadDriver d = new FleetLoadDriver(opts);
        Thread hook = new Thread(d::cleanUp, "fleet-cleanup");
        Runtime.getRuntime().addShutdownHook(hook);
        int status;
        try {
            status = d.run();
        } catch (Exception e) {
            System.err.println("fleet: " + e);
            e.printStackTrace();
            status = 2;
        }
        // exit runs the hook, which stops the children and removes the work directory
        System.exit(status);
    }

    private int run() throws Exception {
        Path jar = Path.of(opts.getOrDefault("jar", "deploy/target/steamtally.jar"));
        Path example = Path.of(opts.getOrDefault("example", "deploy/examples/regenerative.yaml"));
        if (!Files.isRegularFile(jar)) {
            throw new IOException("no " + jar + "; build it first with: mvn -B -q package -DskipTests");
        }
        int mqttPort = freePort();
        int httpPort = freePort();
        String broker = "tcp://127.0.0.1:" + mqttPort;
        log("work directory " + work + "; Mosquitto on " + mqttPort + ", dashboard on " + httpPort);

        // the fleet plant and one simulator per unit, from the example's own unit
        FleetPlant fleet = FleetPlant.of(example, null, units, broker, lateness);
        Path config = work.resolve("fleet.yaml");
        Files.writeString(config, fleet.yaml());
        PlantDescription fleetPlant = PlantDescriptionLoader.load(config);
        PlantDescription examplePlant = PlantDescriptionLoader.load(example);
        UnitDescription template = examplePlant.unit(fleet.templateUnitId()).orElseThrow();
        int sensors = template.sensors().size();
        log(units + " units × " + sensors + " sensors = " + units * sensors + " messages/s; plant description "
                + config + " (" + fleetPlant.units().size() + " units)");
        var design = ExampleDesignPoints.forUnit(examplePlant.siteId(), template.id()).orElseThrow(
                () -> new IllegalStateException("no design point for " + template.id()));
        TruthModel truth = TruthModel.of(template, design);
        Simulator[] sims = new Simulator[units];
        for (int u = 0; u < units; u++) {
            sims[u] = Simulator.builder(truth).seed(1000 + u).build();
        }
        Map<String, Integer> sensorIndex = new LinkedHashMap<>();
        String[] siUnit = new String[sensors];
        for (int s = 0; s < sensors; s++) {
            Sensor sensor = template.sensors().get(s);
            sensorIndex.put(sensor.id(), s);
            siUnit[s] = sensor.quantity().siUnit();
        }
        String[][] topics = new String[units][sensors];
        for (int u = 0; u < units; u++) {
            for (int s = 0; s < sensors; s++) {
                topics[u][s] = fleet.topic(u, template.sensors().get(s).id());
            }
        }

        // Mosquitto of our own
        Path mqConf = work.resolve("mosquitto.conf");
        Files.writeString(mqConf, String.join("\n",
                "per_listener_settings false",
                "listener " + mqttPort + " 127.0.0.1",
                "allow_anonymous true",
                "max_queued_messages 1000000",
                "max_queued_bytes 0",
                "max_inflight_messages 65535",
                "max_inflight_bytes 0",
                "persistence false",
                "set_tcp_nodelay true",
                "log_dest stderr",
                "log_type error",
                "log_type warning",
                ""));
        Process mosquitto = start(List.of(opts.getOrDefault("mosquitto", "mosquitto"), "-c", mqConf.toString()),
                work.resolve("mosquitto.log"));
        waitForPort(mqttPort, Duration.ofSeconds(10), mosquitto, "Mosquitto");

        // InfluxDB of our own, when asked for: the daemon then writes there, not to the embedded store
        Process influxd = null;
        Map<String, String> daemonEnv = Map.of();
        if (store.equals("influx")) {
            int influxPort = freePort();
            List<String> command = new ArrayList<>();
            int nice = Integer.parseInt(opts.getOrDefault("influx_nice", "0"));
            if (nice != 0) {
                // the store is not on the results' path (the daemon's journal absorbs its delays), so on a
                // shared machine it may yield the CPU to the daemon, as OPERATIONS.md suggests
                command.addAll(List.of("nice", "-n", Integer.toString(nice)));
            }
            command.addAll(List.of(opts.getOrDefault("influxd", "influxd"), "run", "-config",
                    writeInfluxConfig(influxPort, freePort()).toString()));
            influxd = start(command, work.resolve("influxd.log"));
            waitForPort(influxPort, Duration.ofSeconds(30), influxd, "influxd");
            influxUrl = "http://127.0.0.1:" + influxPort;
            daemonEnv = Map.of("STEAMTALLY_INFLUX_URL", influxUrl, "STEAMTALLY_INFLUX_DATABASE", INFLUX_DATABASE,
                    "STEAMTALLY_INFLUX_CREATE_DATABASE", "true");
            log("influxd pid " + influxd.pid() + " on " + influxPort + ", database " + INFLUX_DATABASE);
        }

        // the daemon
        List<String> cmd = new ArrayList<>(List.of(javaBinary(), "-Xmx" + opts.getOrDefault("heap", "512m")));
        for (String extra : opts.getOrDefault("jvm", "").split(" ")) {
            if (!extra.isBlank()) {
                cmd.add(extra);
            }
        }
        cmd.addAll(List.of("-jar", jar.toString(), "run", "--config", config.toString(),
                "--data-dir", work.resolve("data").toString(), "--http-port", Integer.toString(httpPort)));
        Process daemon = start(cmd, daemonEnv, work.resolve("daemon.log"));
        waitForPort(httpPort, Duration.ofSeconds(90), daemon, "the daemon");
        log("daemon pid " + daemon.pid() + " up");
        Process jstat = start(List.of("jstat", "-gc", Long.toString(daemon.pid()), "1000"), work.resolve("jstat.log"));

        // the dashboard open: one stream per unit
        receivedInWindow = new AtomicLongArray(units);
        Vertx vertx = Vertx.vertx();
        HttpClient http = vertx.createHttpClient(new HttpClientOptions().setDefaultHost("127.0.0.1")
                .setDefaultPort(httpPort), new PoolOptions().setHttp1MaxSize(units + 4));
        CountDownLatch open = new CountDownLatch(units);
        for (int u = 0; u < units; u++) {
            openStream(http, fleet.unitIds().get(u), open);
        }
        if (!open.await(30, TimeUnit.SECONDS)) {
            throw new IOException(open.getCount() + " streams did not open within 30 s");
        }
        log(units + " streams open");

        // publishing, one step a second at whole seconds
        ReadingPublisher publisher = ReadingPublishers.connect(new PublisherOptions(List.of(broker), MqttProtocol.MQTT_5,
                "steamtally-fleet-driver", PublisherOptions.DEFAULT_WINDOW, true, false));
        long startSecond = System.currentTimeMillis() / 1000 + 1;
        windowStart = startSecond + warmup;
        windowEnd = windowStart + measure;
        Thread pub = new Thread(() -> publishLoop(publisher, sims, sensorIndex, siUnit, topics, startSecond),
                "fleet-publisher");
        pub.setDaemon(true);
        pub.start();
        traceBacklog(httpPort, startSecond);
        if (opts.containsKey("stall")) {
            stallStore(influxd, startSecond);
        }

        // sample /proc and /metrics at the window's edges
        sleepUntilMillis(windowStart * 1000 + latenessMs + 50);
        Sample before = sample(daemon, mosquitto, influxd, httpPort);
        log("warm-up over; measuring " + measure + " s");
        // a monitoring system scrapes /metrics meanwhile, as Prometheus would (scrape=0: not at all)
        int scrapeEvery = Integer.parseInt(opts.getOrDefault("scrape", "15"));
        long nextScrape = scrapeEvery > 0 ? System.currentTimeMillis() + scrapeEvery * 1000L : Long.MAX_VALUE;
        long nextLog = windowStart + 30;
        while (System.currentTimeMillis() < windowEnd * 1000 && daemon.isAlive()) {
            long now = System.currentTimeMillis();
            if (now >= nextScrape) {
                long t0 = System.nanoTime();
                metrics(httpPort);
                scrapeMillis.add((System.nanoTime() - t0) / 1_000_000);
                nextScrape += scrapeEvery * 1000L;
            }
            if (now >= nextLog * 1000) {
                log(String.format(Locale.ROOT, "  %d s: %d results received so far in the window, %d late steps",
                        nextLog - windowStart, total(receivedInWindow), lateSteps.get()));
                nextLog += 30;
            }
            sleepUntilMillis(Math.min(Math.min(nextScrape, nextLog * 1000), windowEnd * 1000));
        }
        sleepUntilMillis(windowEnd * 1000 + latenessMs + 50);
        Sample after = sample(daemon, mosquitto, influxd, httpPort);
        // let the last results of the window arrive, stop publishing, then give the store time to catch up
        sleepUntilMillis(windowEnd * 1000 + latenessMs + 3000);
        stopping = true;
        pub.join(5000);
        publisher.close();
        http.close();
        vertx.close();
        long drainStart = System.nanoTime();
        int drainLimit = Integer.parseInt(opts.getOrDefault("drain", "300"));
        double backlog = Double.NaN;
        while (daemon.isAlive() && System.nanoTime() - drainStart < drainLimit * 1_000_000_000L) {
            Map<String, Double> m = metrics(httpPort);
            if (m.containsKey("scrape_failed")) {
                continue;
            }
            backlog = m.getOrDefault("steamtally_store_queue_depth", 0.0)
                    + m.getOrDefault("steamtally_store_spool_bytes", 0.0);
            if (backlog == 0) {
                break;
            }
            Thread.sleep(2000);
        }
        storeDrain = Duration.ofNanos(System.nanoTime() - drainStart);
        storeDrained = backlog == 0;
        log("store " + (storeDrained ? "caught up" : "still behind") + " " + storeDrain.toSeconds()
                + " s after publishing stopped");
        boolean daemonAlive = daemon.isAlive();
        Instant stopAsked = Instant.now();
        daemon.destroy();
        boolean stopped = daemon.waitFor(60, TimeUnit.SECONDS);
        Duration stopTook = Duration.between(stopAsked, Instant.now());
        jstat.destroy();
        jstat.waitFor(5, TimeUnit.SECONDS);
        long[] stored = store.equals("influx") ? storedInInflux(fleet, template) : storedResults(fleet, stopped);

        return report(fleet, sensors, before, after, stored, daemonAlive, stopped, stopTook, daemon.exitValue());
    }

    // ---- publishing

    private void publishLoop(ReadingPublisher publisher, Simulator[] sims, Map<String, Integer> sensorIndex,
                             String[] siUnit, String[][] topics, long startSecond) {
        long second = startSecond;
        while (!stopping) {
            sleepUntilMillis(second * 1000);
            if (stopping) {
                return;
            }
            long begin = System.currentTimeMillis();
            Instant t = Instant.ofEpochSecond(second);
            int slot = (int) (second % RING);
            boolean inWindow = second >= windowStart && second < windowEnd;
            // only the window's figures are reported, so only its steps can spoil them
            if (inWindow && begin - second * 1000 > 500) {
                lateSteps.incrementAndGet();
            }
            try {
                for (int u = 0; u < sims.length; u++) {
                    if (spreadMs > 0) {
                        sleepUntilMillis(second * 1000 + u * spreadMs / sims.length);
                    }
                    SimulatedSample sample = sims[u].step(t);
                    long first = -1;
                    long last = -1;
                    for (SimulatedReading r : sample.readings()) {
                        int s = sensorIndex.get(r.sensorId());
                        byte[] payload = ("{\"ts\":" + r.timestamp().toEpochMilli() + ",\"value\":"
                                + Double.toString(r.valueSi()) + ",\"unit\":\"" + siUnit[s] + "\"}")
                                .getBytes(StandardCharsets.UTF_8);
                        long before = nowMicros();
                        publisher.publish(topics[u][s], payload, 1);
                        last = nowMicros();
                        if (first < 0) {
                            first = before;
                        }
                        if (inWindow) {
                            publishedInWindow.incrementAndGet();
                        }
                    }
                    synchronized (this) {
                        firstPublishMicros[slot][u] = first;
                        lastPublishMicros[slot][u] = last;
                        stepSecond[slot][u] = second;
                    }
                }
            } catch (InterruptedException e) {
                return;
            } catch (RuntimeException e) {
                log("publisher: " + e);
                if (!publisher.isConnected()) {
                    reconnects.incrementAndGet();
                    try {
                        publisher.reconnect();
                    } catch (RuntimeException again) {
                        log("publisher: reconnect failed: " + again);
                    }
                }
            }
            if (inWindow) {
                maxStepMillis.accumulateAndGet(System.currentTimeMillis() - begin, Math::max);
            }
            // a step that overran skips the seconds it missed rather than publishing them in a burst
            second = Math.max(second + 1, System.currentTimeMillis() / 1000);
        }
    }

    // ---- the dashboard's streams

    private void openStream(HttpClient http, String unitId, CountDownLatch open) {
        int unitIndex = Integer.parseInt(unitId.substring(4)) - 1;
        StringBuilder pending = new StringBuilder();
        http.request(HttpMethod.GET, "/api/v1/units/" + unitId + "/stream")
                .compose(req -> req.putHeader("Accept", "text/event-stream").send())
                .onSuccess(resp -> {
                    if (resp.statusCode() != 200) {
                        log("stream of " + unitId + ": HTTP " + resp.statusCode());
                        return;
                    }
                    open.countDown();
                    resp.handler((Buffer b) -> {
                        long arrival = nowMicros();
                        pending.append(b.toString(StandardCharsets.UTF_8));
                        int end;
                        while ((end = pending.indexOf("\n\n")) >= 0) {
                            String event = pending.substring(0, end);
                            pending.delete(0, end + 2);
                            if (event.startsWith("event: result")) {
                                onResult(unitIndex, event, arrival);
                            }
                        }
                    });
                })
                .onFailure(e -> log("stream of " + unitId + " failed: " + e));
    }

    private void onResult(int unit, String event, long arrivalMicros) {
        int at = event.indexOf("\"ts\":\"");
        if (at < 0) {
            return;
        }
        Instant ts = Instant.parse(event.substring(at + 6, event.indexOf('"', at + 6)));
        long second = ts.getEpochSecond();
        if (second < windowStart || second >= windowEnd) {
            return;
        }
        receivedInWindow.incrementAndGet(unit);
        int slot = (int) (second % RING);
        long dueMicros = (second * 1000 + latenessMs) * 1000;
        synchronized (this) {
            afterDue.add(arrivalMicros - dueMicros);
            if (stepSecond[slot][unit] == second) {
                fromLast.add(arrivalMicros - lastPublishMicros[slot][unit]);
                fromFirst.add(arrivalMicros - firstPublishMicros[slot][unit]);
            }
        }
    }

    // ---- measurements

    private record Sample(long nanos, long daemonTicks, long mosquittoTicks, long influxTicks, long driverCpuNanos,
                          long machineBusy,
                          long machineTotal, String loadavg, Map<String, Double> metrics, Map<String, Long> threads) {
    }

    /** CPU ticks of the daemon's threads by name, with unit ids and pool numbers folded to '*'. */
    private static Map<String, Long> threadTicks(long pid) {
        Map<String, Long> out = new LinkedHashMap<>();
        try (Stream<Path> tasks = Files.list(Path.of("/proc/" + pid + "/task"))) {
            tasks.forEach(t -> {
                try {
                    String stat = Files.readString(t.resolve("stat"));
                    String name = stat.substring(stat.indexOf('(') + 1, stat.lastIndexOf(')'))
                            .replaceAll("unit\\d+", "*").replaceAll("\\d+", "*");
                    String[] f = stat.substring(stat.lastIndexOf(')') + 2).split(" ");
                    out.merge(name, Long.parseLong(f[11]) + Long.parseLong(f[12]), Long::sum);
                } catch (IOException | RuntimeException e) {
                    // the thread ended meanwhile
                }
            });
        } catch (IOException e) {
            // the process ended
        }
        return out;
    }

    private Sample sample(Process daemon, Process mosquitto, Process influxd, int httpPort) throws IOException,
            InterruptedException {
        long[] machine = machineTicks();
        long t0 = System.nanoTime();
        Map<String, Double> metrics = metrics(httpPort);
        log(String.format(Locale.ROOT, "/metrics: %.0f lines, %.0f kB, %.0f ms", metrics.get("scrape_lines"),
                metrics.get("scrape_bytes") / 1000, (System.nanoTime() - t0) / 1e6));
        return new Sample(System.nanoTime(), processTicks(daemon.pid()), processTicks(mosquitto.pid()),
                influxd == null ? 0 : processTicks(influxd.pid()),
                ((OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean()).getProcessCpuTime(),
                machine[0], machine[1], Files.readString(Path.of("/proc/loadavg")).trim(), metrics,
                threadTicks(daemon.pid()));
    }

    /**
     * With {@code trace=N} (seconds, 0 or absent: off), a thread scrapes the store's queue depth and
     * journal size every N seconds from the start of publishing and writes them to
     * {@code backlog.tsv} in the working directory, keeping the peaks and when the backlog last cleared.
     */
    private void traceBacklog(int httpPort, long startSecond) {
        int every = Integer.parseInt(opts.getOrDefault("trace", "0"));
        if (every <= 0) {
            return;
        }
        inBackground("fleet-backlog-trace", "backlog trace", () -> {
            try (var out = Files.newBufferedWriter(work.resolve("backlog.tsv"))) {
                out.write("seconds\tqueued_points\tjournal_bytes\tstore_writes\tevaluation_ms\tsnapshot_to_result_ms\n");
                boolean behind = false;
                Map<String, Double> previous = Map.of();
                while (!stopping) {
                    Map<String, Double> m = metrics(httpPort);
                    long at = System.currentTimeMillis();
                    if (!m.containsKey("scrape_failed")) {
                        double queued = m.getOrDefault("steamtally_store_queue_depth", 0.0);
                        double spooled = m.getOrDefault("steamtally_store_spool_bytes", 0.0);
                        peakQueued = Math.max(peakQueued, queued);
                        peakSpoolBytes = Math.max(peakSpoolBytes, spooled);
                        if (spooled > 0) {
                            behind = true;
                        } else if (behind) {
                            behind = false;
                            backlogClearedAtMillis = at;
                        }
                        // the daemon's own timers over the interval: is it computing slowly, or waiting?
                        out.write(String.format(Locale.ROOT, "%.1f\t%.0f\t%.0f\t%.0f\t%s\t%s%n",
                                (at - startSecond * 1000) / 1000.0, queued, spooled,
                                m.getOrDefault("steamtally_store_writes_total", 0.0),
                                meanMillis(previous, m, "steamtally_calc_time_seconds"),
                                meanMillis(previous, m, "steamtally_snapshot_latency_seconds")));
                        out.flush();
                        previous = m;
                    }
                    Thread.sleep(every * 1000L);
                }
            }
        });
    }

    /**
     * With {@code stall=S@A}: the store stops answering for S seconds from A seconds after publishing
     * started (influxd stopped with SIGSTOP and resumed with SIGCONT), as a store that hangs in a long
     * compaction or on a stuck disk would; the daemon's writes time out and go to its journal.
     */
    private void stallStore(Process influxd, long startSecond) {
        String stall = opts.get("stall");
        if (influxd == null || !stall.matches("\\d+@\\d+")) {
            throw new IllegalArgumentException("stall=" + stall + ": expected SECONDS@AT, e.g. 60@30, and store=influx");
        }
        int seconds = Integer.parseInt(stall.substring(0, stall.indexOf('@')));
        int at = Integer.parseInt(stall.substring(stall.indexOf('@') + 1));
        inBackground("fleet-store-stall", "stall", () -> {
            sleepUntilMillis((startSecond + at) * 1000);
            signal(influxd, "STOP");
            log("influxd stopped (SIGSTOP) for " + seconds + " s");
            sleepUntilMillis((startSecond + at + seconds) * 1000);
            signal(influxd, "CONT");
            stallEndMillis = System.currentTimeMillis();
            log("influxd resumed (SIGCONT)");
        });
    }

    /** A task of one of the driver's background threads. */
    private interface BackgroundTask {
        void run() throws IOException, InterruptedException;
    }

    /** Runs {@code task} on a daemon thread; a failure is logged as {@code what} stopping. */
    private static void inBackground(String name, String what, BackgroundTask task) {
        Thread t = new Thread(() -> {
            try {
                task.run();
            } catch (IOException e) {
                log(what + " stopped: " + e);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, name);
        t.setDaemon(true);
        t.start();
    }

    private static void signal(Process p, String signal) throws IOException, InterruptedException {
        int exit = new ProcessBuilder("kill", "-" + signal, Long.toString(p.pid())).inheritIO().start().waitFor();
        if (exit != 0) {
            throw new IOException("kill -" + signal + " " + p.pid() + " exited " + exit);
        }
    }

    /** Sums of the daemon's meters by name, with the rejected readings split by reason. */
    private static Map<String, Double> metrics(int httpPort) throws IOException, InterruptedException {
        var client = java.net.http.HttpClient.newHttpClient();
        String body;
        try {
            // the whole body within the limit: the request timeout alone covers only the headers
            body = client.sendAsync(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + httpPort + "/metrics"))
                    .timeout(Duration.ofSeconds(30)).build(), HttpResponse.BodyHandlers.ofString())
                    .get(30, TimeUnit.SECONDS).body();
        } catch (java.util.concurrent.ExecutionException | java.util.concurrent.TimeoutException e) {
            log("/metrics did not answer within 30 s: " + e);
            return new LinkedHashMap<>(Map.of("scrape_failed", 1.0));
        }
        Map<String, Double> sums = new LinkedHashMap<>();
        long[] size = {0, 0};
        body.lines().forEach(line -> {
            size[0] += line.length() + 1;
            size[1]++;
            if (line.startsWith("#") || line.isBlank()) {
                return;
            }
            int brace = line.indexOf('{');
            int space = line.lastIndexOf(' ');
            String name = brace > 0 ? line.substring(0, brace) : line.substring(0, space);
            double value;
            try {
                value = Double.parseDouble(line.substring(space + 1));
            } catch (NumberFormatException e) {
                return;
            }
            if (name.equals("steamtally_readings_rejected_total")) {
                int r = line.indexOf("reason=\"");
                name += "{" + line.substring(r, line.indexOf('"', r + 8) + 1) + "}";
            }
            sums.merge(name, value, Double::sum);
        });
        sums.put("scrape_bytes", (double) size[0]);
        sums.put("scrape_lines", (double) size[1]);
        return sums;
    }

    /** The mean of a timer between two samples, in ms, from its {@code _sum} and {@code _count}; "–" when empty. */
    private static String meanMillis(Sample a, Sample b, String timer) {
        return meanMillis(a.metrics(), b.metrics(), timer);
    }

    /** A timer's mean between two scrapes of /metrics, ms; "–" when it did not run between them. */
    private static String meanMillis(Map<String, Double> a, Map<String, Double> b, String timer) {
        double count = b.getOrDefault(timer + "_count", 0.0) - a.getOrDefault(timer + "_count", 0.0);
        double sum = b.getOrDefault(timer + "_sum", 0.0) - a.getOrDefault(timer + "_sum", 0.0);
        return count > 0 ? String.format(Locale.ROOT, "%.1f", 1000 * sum / count) : "–";
    }

    private static long processTicks(long pid) {
        try {
            String stat = Files.readString(Path.of("/proc/" + pid + "/stat"));
            String[] f = stat.substring(stat.lastIndexOf(')') + 2).split(" ");
            return Long.parseLong(f[11]) + Long.parseLong(f[12]); // utime, stime (fields 14, 15)
        } catch (IOException | RuntimeException e) {
            return -1;
        }
    }

    private static long[] machineTicks() throws IOException {
        String[] f = Files.readAllLines(Path.of("/proc/stat")).get(0).trim().split("\\s+");
        long total = 0;
        for (int i = 1; i < f.length; i++) {
            total += Long.parseLong(f[i]);
        }
        long idle = Long.parseLong(f[4]) + Long.parseLong(f[5]);
        return new long[] {total - idle, total};
    }

    /**
     * Results per unit in the window, from the embedded store after the daemon stopped: distinct
     * timestamps of each unit's state points (every result has them; the cycle point only when the
     * cycle's figures are valid). Null when the store could not be read.
     */
    private long[] storedResults(FleetPlant fleet, boolean stopped) {
        if (!stopped) {
            return null;
        }
        String url = "jdbc:h2:file:" + work.resolve("data").resolve("store").resolve("steamtally").toAbsolutePath();
        long[] n = new long[units];
        try (java.sql.Connection c = java.sql.DriverManager.getConnection(url, "sa", "");
             java.sql.PreparedStatement st = c.prepareStatement("SELECT \"unit\", COUNT(DISTINCT \"ts\") FROM \""
                     + Measurement.STATES.measurementName() + "\" WHERE \"site\" = ? AND \"ts\" >= ? AND \"ts\" < ?"
                     + " GROUP BY \"unit\"")) {
            st.setString(1, fleet.site());
            st.setLong(2, windowStart * 1000);
            st.setLong(3, windowEnd * 1000);
            try (java.sql.ResultSet rs = st.executeQuery()) {
                while (rs.next()) {
                    int u = fleet.unitIds().indexOf(rs.getString(1));
                    if (u >= 0) {
                        n[u] = rs.getLong(2);
                    }
                }
            }
            return n;
        } catch (java.sql.SQLException e) {
            log("store not read: " + e);
            return null;
        }
    }

    /** The database the daemon writes to in the driver's own influxd. */
    private static final String INFLUX_DATABASE = "steamtally_fleet";
    /** The driver's influxd, when {@code store=influx}. */
    private String influxUrl;

    /**
     * A configuration for influxd 1.x with its data under the work directory, HTTP and the backup RPC
     * on the given loopback ports, and no statistics database (it would only take CPU from the run).
     */
    private Path writeInfluxConfig(int httpPort, int rpcPort) throws IOException {
        Path dir = work.resolve("influxdb");
        for (String d : List.of("meta", "data", "wal")) {
            Files.createDirectories(dir.resolve(d));
        }
        Path conf = dir.resolve("influxdb.conf");
        Files.writeString(conf, String.join("\n",
                "reporting-disabled = true",
                "bind-address = \"127.0.0.1:" + rpcPort + "\"",
                "[meta]",
                "  dir = \"" + dir.resolve("meta") + "\"",
                "  logging-enabled = false",
                "[data]",
                "  dir = \"" + dir.resolve("data") + "\"",
                "  wal-dir = \"" + dir.resolve("wal") + "\"",
                "  query-log-enabled = false",
                "[monitor]",
                "  store-enabled = false",
                "[http]",
                "  enabled = true",
                "  bind-address = \"127.0.0.1:" + httpPort + "\"",
                "  auth-enabled = false",
                "  log-enabled = false",
                "[logging]",
                "  level = \"warn\"",
                ""));
        return conf;
    }

    /**
     * Results per unit in the window, from the driver's influxd: the points of the unit's first state
     * (every result has one per state), counted by unit. Null when the query fails.
     */
    private long[] storedInInflux(FleetPlant fleet, UnitDescription template) {
        String state = template.states().get(0).id();
        String q = "SELECT count(\"valid\") FROM \"" + Measurement.STATES.measurementName() + "\" WHERE \"site\" = '"
                + fleet.site() + "' AND \"state\" = '" + state + "' AND time >= " + windowStart + "s AND time < "
                + windowEnd + "s GROUP BY \"unit\"";
        try {
            HttpResponse<String> r = java.net.http.HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create(
                    influxUrl + "/query?db=" + INFLUX_DATABASE + "&q=" + java.net.URLEncoder.encode(q,
                            StandardCharsets.UTF_8))).timeout(Duration.ofSeconds(60)).GET().build(),
                    HttpResponse.BodyHandlers.ofString());
            if (r.statusCode() != 200) {
                log("store not read: HTTP " + r.statusCode() + " " + r.body());
                return null;
            }
            long[] n = new long[units];
            var series = new com.fasterxml.jackson.databind.ObjectMapper().readTree(r.body())
                    .path("results").path(0).path("series");
            for (var s : series) {
                int u = fleet.unitIds().indexOf(s.path("tags").path("unit").asText());
                if (u >= 0) {
                    n[u] = s.path("values").path(0).path(1).asLong();
                }
            }
            return n;
        } catch (IOException e) {
            log("store not read: " + e);
            return null;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return null;
        }
    }

    /** Heap figures from jstat -gc: peak used (all pools), peak old generation, capacity; MB. */
    private double[] heap() throws IOException {
        double peakUsed = 0;
        double peakOld = 0;
        double capacity = 0;
        long collections = 0;
        double gcSeconds = 0;
        List<String> lines = Files.readAllLines(work.resolve("jstat.log"));
        String[] head = null;
        for (String line : lines) {
            String[] f = line.trim().split("\\s+");
            if (f.length > 0 && f[0].equals("S0C")) {
                head = f;
                continue;
            }
            if (head == null || f.length != head.length) {
                continue;
            }
            Map<String, Double> v = new LinkedHashMap<>();
            for (int i = 0; i < f.length; i++) {
                try {
                    v.put(head[i], Double.parseDouble(f[i]));
                } catch (NumberFormatException e) {
                    v.put(head[i], 0.0);
                }
            }
            double used = v.get("S0U") + v.get("S1U") + v.get("EU") + v.get("OU");
            peakUsed = Math.max(peakUsed, used);
            peakOld = Math.max(peakOld, v.get("OU"));
            capacity = Math.max(capacity, v.get("S0C") + v.get("S1C") + v.get("EC") + v.get("OC"));
            collections = (long) (v.get("YGC") + v.get("FGC"));
            gcSeconds = v.get("GCT");
        }
        return new double[] {peakUsed / 1024, peakOld / 1024, capacity / 1024, collections, gcSeconds};
    }

    private int report(FleetPlant fleet, int sensors, Sample a, Sample b, long[] stored, boolean daemonAlive,
                       boolean stopped, Duration stopTook, int daemonExit) throws IOException {
        double seconds = (b.nanos() - a.nanos()) / 1e9;
        long expected = (long) units * measure;
        long received = total(receivedInWindow);
        long storedTotal = stored == null ? -1 : Arrays.stream(stored).sum();
        double accepted = delta(a, b, "steamtally_readings_accepted_total");
        double rejected = 0;
        StringBuilder reasons = new StringBuilder();
        for (String k : b.metrics().keySet()) {
            if (k.startsWith("steamtally_readings_rejected_total{")) {
                double d = delta(a, b, k);
                rejected += d;
                if (d > 0) {
                    reasons.append(' ').append(k.substring(k.indexOf('"') + 1, k.lastIndexOf('"'))).append('=')
                            .append((long) d);
                }
            }
        }
        double coalesced = delta(a, b, "steamtally_snapshots_coalesced_total");
        double emitted = delta(a, b, "steamtally_snapshots_emitted_total");
        double streamDropped = delta(a, b, "steamtally_dashboard_stream_dropped_total");
        double spoolDropped = delta(a, b, "steamtally_store_spool_dropped_total");
        double[] heap = heap();
        double hz = 100; // USER_HZ on Linux
        double daemonCpu = (b.daemonTicks() - a.daemonTicks()) / hz / seconds;
        double mosquittoCpu = (b.mosquittoTicks() - a.mosquittoTicks()) / hz / seconds;
        double influxCpu = (b.influxTicks() - a.influxTicks()) / hz / seconds;
        double driverCpu = (b.driverCpuNanos() - a.driverCpuNanos()) / 1e9 / seconds;
        double machineCpu = (double) (b.machineBusy() - a.machineBusy()) / (b.machineTotal() - a.machineTotal());
        long[] last = percentiles(fromLast);
        long[] first = percentiles(fromFirst);
        long[] due = percentiles(afterDue);

        PrintFormat p = new PrintFormat();
        p.line("fleet benchmark: %d units × %d sensors at 1 Hz = %d messages/s offered; warm-up %d s, measured %d s;"
                + " allowed lateness %s; units' publications spread over %d ms of each second; daemon -Xmx%s; store %s%s",
                units, sensors, units * sensors, warmup, measure, lateness, spreadMs, opts.getOrDefault("heap", "512m"),
                store.equals("influx") ? "InfluxDB (an influxd of the driver's own)" : "embedded H2",
                opts.containsKey("influx_nice") ? " at nice " + opts.get("influx_nice") : "");
        p.line("machine: %d cores; load average at the window's start %s, at its end %s; machine CPU busy %.0f %%",
                Runtime.getRuntime().availableProcessors(), a.loadavg(), b.loadavg(), 100 * machineCpu);
        p.line("published in the window: %d messages (%.0f/s); late steps in it (started > 500 ms after their second): %d;"
                + " its longest step %d ms; publisher reconnects %d", publishedInWindow.get(),
                publishedInWindow.get() / (double) measure, lateSteps.get(), maxStepMillis.get(), reconnects.get());
        p.line("readings accepted: %.0f (%.0f/s); refused: %.0f%s", accepted, accepted / seconds, rejected,
                reasons);
        p.line("snapshots emitted: %.0f; replaced before the calc took them: %.0f", emitted, coalesced);
        p.line("results on the streams: %d of %d expected (%.3f %%); stream events dropped: %.0f", received, expected,
                100.0 * received / expected, streamDropped);
        p.line("results stored: %s of %d expected%s; journal dropped: %.0f; store backlog at the window's start %.0f"
                + " points + %.0f journal bytes, at its end %.0f + %.0f; %s %d s after publishing stopped",
                storedTotal < 0 ? "?" : storedTotal, expected,
                storedTotal < 0 ? "" : String.format(Locale.ROOT, " (%.3f %%)", 100.0 * storedTotal / expected),
                spoolDropped, a.metrics().getOrDefault("steamtally_store_queue_depth", 0.0),
                a.metrics().getOrDefault("steamtally_store_spool_bytes", 0.0),
                b.metrics().getOrDefault("steamtally_store_queue_depth", 0.0),
                b.metrics().getOrDefault("steamtally_store_spool_bytes", 0.0),
                storeDrained ? "caught up" : "still behind", storeDrain.toSeconds());
        if (opts.containsKey("trace")) {
            p.line("store backlog traced every %s s (backlog.tsv): peak %.0f points queued, %.0f journal bytes; %s%s",
                    opts.get("trace"), peakQueued, peakSpoolBytes, peakSpoolBytes == 0 ? "journal empty throughout"
                            : backlogClearedAtMillis < 0 ? "journal never emptied after filling"
                            : String.format(Locale.ROOT, "journal last emptied %.0f s after publishing started",
                                    (backlogClearedAtMillis - windowStart * 1000 + warmup * 1000L) / 1000.0),
                    stallEndMillis < 0 || backlogClearedAtMillis < 0 ? "" : String.format(Locale.ROOT,
                            ", %.0f s after the store resumed", (backlogClearedAtMillis - stallEndMillis) / 1000.0));
        }
        p.line("latency from the completing reading's publish to the result on the stream, ms: p50 %s  p95 %s  p99 %s"
                + "  max %s  (n=%d)", ms(last[0]), ms(last[1]), ms(last[2]), ms(last[3]), fromLast.size());
        p.line("latency from the first reading's publish, ms:                                   p50 %s  p95 %s  p99 %s"
                + "  max %s", ms(first[0]), ms(first[1]), ms(first[2]), ms(first[3]));
        p.line("after the snapshot was due (its time + lateness), ms:                           p50 %s  p95 %s  p99 %s"
                + "  max %s", ms(due[0]), ms(due[1]), ms(due[2]), ms(due[3]));
        p.line("the daemon's own timers, mean over the window: evaluation of a snapshot %s ms; from a snapshot's time"
                + " to its result stored and published %s ms", meanMillis(a, b, "steamtally_calc_time_seconds"),
                meanMillis(a, b, "steamtally_snapshot_latency_seconds"));
        p.line("store writes (batches of points): %.1f a second", delta(a, b, "steamtally_store_writes_total") / seconds);
        p.line("/metrics scraped every %s s in the window: %d scrapes, longest %s ms", opts.getOrDefault("scrape", "15"),
                scrapeMillis.size(), scrapeMillis.stream().mapToLong(Long::longValue).max().orElse(0));
        p.line("daemon heap (jstat): peak in use %.0f MB (old generation peak %.0f MB) of %.0f MB committed;"
                + " %d collections, %.1f s in GC", heap[0], heap[1], heap[2], (long) heap[3], heap[4]);
        p.line("CPU, share of one core: daemon %.0f %%, Mosquitto %.0f %%%s, driver (publisher, streams) %.0f %%",
                100 * daemonCpu, 100 * mosquittoCpu, store.equals("influx")
                        ? String.format(Locale.ROOT, ", influxd %.0f %%", 100 * influxCpu) : "", 100 * driverCpu);
        Map<String, Long> threadCpu = new LinkedHashMap<>();
        b.threads().forEach((k, v) -> threadCpu.put(k, v - a.threads().getOrDefault(k, 0L)));
        StringBuilder top = new StringBuilder();
        threadCpu.entrySet().stream().sorted(Map.Entry.<String, Long>comparingByValue().reversed()).limit(8)
                .forEach(e -> top.append(String.format(Locale.ROOT, " %s %.0f %%;", e.getKey(),
                        100 * e.getValue() / hz / seconds)));
        p.line("daemon threads by CPU (share of one core; names truncated by Linux to 15 characters):%s", top);
        p.line("daemon stopped on SIGTERM in %.1f s (exit %s)", stopTook.toMillis() / 1000.0,
                stopped ? Integer.toString(daemonExit) : "none, killed");

        List<String> missed = new ArrayList<>();
        if (!daemonAlive) {
            missed.add("the daemon died during the run (see " + work.resolve("daemon.log") + ")");
        }
        if (received < KEPT_UP_FRACTION * expected) {
            missed.add("results on the streams " + received + " < 99.9 % of " + expected);
        }
        double journalGrowth = b.metrics().getOrDefault("steamtally_store_spool_bytes", 0.0)
                - a.metrics().getOrDefault("steamtally_store_spool_bytes", 0.0);
        if (journalGrowth > 1e6) {
            missed.add(String.format(Locale.ROOT, "the store fell behind: its journal grew by %.0f MB in the window",
                    journalGrowth / 1e6));
        }
        if (!storeDrained) {
            missed.add("the store had not caught up " + storeDrain.toSeconds() + " s after publishing stopped");
        }
        if (storedTotal < KEPT_UP_FRACTION * expected) {
            missed.add("results stored " + storedTotal + " < 99.9 % of " + expected);
        }
        if (rejected > 0) {
            missed.add(String.format(Locale.ROOT, "%.0f readings refused", rejected));
        }
        if (last[2] < 0 || last[2] / 1000.0 >= P99_TARGET_MS) {
            missed.add("p99 from the completing reading " + ms(last[2]) + " ms ≥ " + P99_TARGET_MS + " ms");
        }
        if (reconnects.get() > 0) {
            missed.add("the publisher lost its connection " + reconnects.get() + " times");
        }
        if (lateSteps.get() > measure / 100) {
            missed.add("the publisher fell behind (" + lateSteps.get() + " late steps): the figures are the driver's");
        }
        if (missed.isEmpty()) {
            p.line("PASS: %d units kept up (≥ 99.9 %% of results on the stream and in the store), p99 %s ms < %.0f ms,"
                    + " heap limit %s", units, ms(last[2]), P99_TARGET_MS, opts.getOrDefault("heap", "512m"));
        } else {
            p.line("FAIL: %s", String.join("; ", missed));
        }
        Files.writeString(Path.of(opts.getOrDefault("report", work.getParent().resolve(
                "steamtally-fleet-" + units + "-" + System.currentTimeMillis() / 1000 + ".txt").toString())), p.text());
        return missed.isEmpty() ? 0 : 1;
    }

    private static final class PrintFormat {
        private final StringBuilder text = new StringBuilder();

        void line(String format, Object... args) {
            String s = String.format(Locale.ROOT, format, args);
            System.out.println(s);
            text.append(s).append('\n');
        }

        String text() {
            return text.toString();
        }
    }

    private static double delta(Sample a, Sample b, String name) {
        return b.metrics().getOrDefault(name, 0.0) - a.metrics().getOrDefault(name, 0.0);
    }

    /** p50, p95, p99, max in µs; -1 each when empty. */
    private static long[] percentiles(List<Long> values) {
        if (values.isEmpty()) {
            return new long[] {-1, -1, -1, -1};
        }
        long[] v = values.stream().mapToLong(Long::longValue).sorted().toArray();
        return new long[] {v[rank(v.length, 0.50)], v[rank(v.length, 0.95)], v[rank(v.length, 0.99)], v[v.length - 1]};
    }

    /** Nearest-rank percentile index. */
    private static int rank(int n, double q) {
        return Math.max(0, Math.min(n - 1, (int) Math.ceil(q * n) - 1));
    }

    private static String ms(long micros) {
        return micros < 0 ? "–" : String.format(Locale.ROOT, "%.1f", micros / 1000.0);
    }

    private static long total(AtomicLongArray a) {
        long n = 0;
        for (int i = 0; i < a.length(); i++) {
            n += a.get(i);
        }
        return n;
    }

    // ---- processes and time

    private Process start(List<String> command, Path logFile) throws IOException {
        return start(command, Map.of(), logFile);
    }

    private Process start(List<String> command, Map<String, String> env, Path logFile) throws IOException {
        synchronized (children) {
            if (stopping && !children.isEmpty()) {
                throw new IOException("stopping");
            }
            ProcessBuilder b = new ProcessBuilder(command).redirectErrorStream(true)
                    .redirectOutput(ProcessBuilder.Redirect.appendTo(logFile.toFile()));
            b.environment().putAll(env);
            Process p = b.start();
            children.add(p);
            return p;
        }
    }

    /** Stops every child (the daemon with SIGTERM first, so that it flushes), then removes the work directory. */
    private void cleanUp() {
        stopping = true;
        List<Process> all;
        synchronized (children) {
            all = new ArrayList<>(children);
        }
        for (int i = all.size() - 1; i >= 0; i--) {
            Process p = all.get(i);
            if (p.isAlive()) {
                p.destroy();
                try {
                    if (!p.waitFor(30, TimeUnit.SECONDS)) {
                        p.destroyForcibly();
                    }
                } catch (InterruptedException e) {
                    p.destroyForcibly();
                }
            }
        }
        if (Boolean.parseBoolean(opts.getOrDefault("keep", "false"))) {
            System.err.println("fleet: kept " + work);
            return;
        }
        try (Stream<Path> paths = Files.walk(work)) {
            paths.sorted(Comparator.reverseOrder()).forEach(f -> f.toFile().delete());
        } catch (IOException e) {
            System.err.println("fleet: " + work + " not removed: " + e);
        }
    }

    private static String javaBinary() {
        return Path.of(System.getProperty("java.home"), "bin", "java").toString();
    }

    /** A port that was free a moment ago, never 1883 or 8086 (other services use those). */
    private static int freePort() throws IOException {
        while (true) {
            try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
                int p = s.getLocalPort();
                if (p != 1883 && p != 8086 && p != 8080) {
                    return p;
                }
            }
        }
    }

    private static void waitForPort(int port, Duration timeout, Process p, String what) throws IOException,
            InterruptedException {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (System.nanoTime() < deadline) {
            if (!p.isAlive()) {
                throw new IOException(what + " exited with " + p.exitValue() + " before listening on " + port);
            }
            try (Socket s = new Socket()) {
                s.connect(new InetSocketAddress("127.0.0.1", port), 200);
                return;
            } catch (IOException e) {
                Thread.sleep(100);
            }
        }
        throw new IOException(what + " not listening on " + port + " within " + timeout);
    }

    private static void sleepUntilMillis(long wallMillis) {
        long left;
        while ((left = wallMillis - System.currentTimeMillis()) > 0) {
            try {
                Thread.sleep(Math.min(left, 1000));
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            }
        }
    }

    private static long nowMicros() {
        Instant n = Instant.now();
        return n.getEpochSecond() * 1_000_000 + n.getNano() / 1000;
    }

    private static void log(String s) {
        System.err.println(Instant.now() + " fleet: " + s);
    }
}
