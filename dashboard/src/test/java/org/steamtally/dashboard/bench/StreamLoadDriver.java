package org.steamtally.dashboard.bench;

import com.sun.management.OperatingSystemMXBean;
import io.micrometer.prometheusmetrics.PrometheusConfig;
import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import io.vertx.core.Vertx;
import io.vertx.core.http.HttpClient;
import io.vertx.core.http.HttpClientOptions;
import io.vertx.core.http.HttpMethod;
import io.vertx.core.http.PoolOptions;
import java.lang.management.ManagementFactory;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.dashboard.alarm.InMemoryAlarmBoard;
import org.steamtally.dashboard.fixture.FernholmTestPlant;
import org.steamtally.dashboard.http.DashboardConfig;
import org.steamtally.dashboard.http.DashboardServer;
import org.steamtally.dashboard.http.DashboardSources;
import org.steamtally.dashboard.push.InMemoryLiveResults;
import org.steamtally.dashboard.security.AuditLog;

/**
 * Load driver for the live stream: {@code units} units each publishing one result per second, and
 * {@code clients} clients each holding one Server-Sent-Events stream per unit. Measures the time from
 * {@code publish} to the client reading the event, and the JVM's CPU time, after ten seconds of warm-up. Server and clients share
 * one JVM (separate Vert.x instances), so the CPU figure is an upper bound for the server.
 *
 * <pre>
 * java -cp ... org.steamtally.dashboard.bench.StreamLoadDriver [clients=50] [units=10] [seconds=60]
 * </pre>
 */
public final class StreamLoadDriver {

    private StreamLoadDriver() {
    }

    public static void main(String[] args) throws Exception {
        int clients = args.length > 0 ? Integer.parseInt(args[0]) : 50;
        int unitCount = args.length > 1 ? Integer.parseInt(args[1]) : 10;
        int seconds = args.length > 2 ? Integer.parseInt(args[2]) : 60;

        FernholmTestPlant fixture = new FernholmTestPlant();
        UnitDescription template = fixture.plant().units().get(0);
        List<UnitDescription> units = new ArrayList<>();
        for (int i = 1; i <= unitCount; i++) {
            units.add(new UnitDescription("unit" + i, "unit " + i, template.sensors(), template.states(),
                    template.components(), template.deadState()));
        }
        PlantDescription plant = new PlantDescription(FernholmTestPlant.SITE, "load", 100_800.0, units);
        Clock clock = Clock.systemUTC();
        InMemoryLiveResults live = new InMemoryLiveResults(plant, clock, Duration.ofSeconds(10));
        Vertx serverVertx = Vertx.vertx();
        DashboardServer server = new DashboardServer(serverVertx, new DashboardSources(plant, live,
                new InMemoryAlarmBoard(clock), List.of(), AuditLog.inMemory(),
                new PrometheusMeterRegistry(PrometheusConfig.DEFAULT), clock), DashboardConfig.defaults().withPort(0));
        int port = server.start().toCompletionStage().toCompletableFuture().get();

        UnitResult base = fixture.result(Instant.now());
        Map<String, Long> publishedNanos = new ConcurrentHashMap<>();
        long[] latencies = new long[clients * unitCount * (seconds + 5)];
        AtomicLong count = new AtomicLong();

        Vertx clientVertx = Vertx.vertx();
        HttpClient http = clientVertx.createHttpClient(new HttpClientOptions(),
                new PoolOptions().setHttp1MaxSize(clients * unitCount));
        CountDownLatch open = new CountDownLatch(clients * unitCount);
        for (int c = 0; c < clients; c++) {
            for (UnitDescription u : units) {
                http.request(HttpMethod.GET, port, "127.0.0.1", "/api/v1/units/" + u.id() + "/stream")
                        .compose(req -> req.send()).onSuccess(resp -> {
                            open.countDown();
                            StringBuilder pending = new StringBuilder();
                            resp.handler(buf -> {
                                long now = System.nanoTime();
                                pending.append(buf.toString());
                                int end;
                                while ((end = pending.indexOf("\n\n")) >= 0) {
                                    String event = pending.substring(0, end);
                                    pending.delete(0, end + 2);
                                    int ts = event.indexOf("\"ts\":\"");
                                    int unit = event.indexOf("\"unit\":\"");
                                    if (ts < 0 || unit < 0) {
                                        continue;
                                    }
                                    String key = event.substring(unit + 8, event.indexOf('"', unit + 8)) + "@"
                                            + event.substring(ts + 6, event.indexOf('"', ts + 6));
                                    Long sent = publishedNanos.get(key);
                                    long i = count.getAndIncrement();
                                    if (sent != null && i < latencies.length) {
                                        latencies[(int) i] = now - sent;
                                    }
                                }
                            });
                        });
            }
        }
        if (!open.await(60, TimeUnit.SECONDS)) {
            throw new IllegalStateException("streams did not open: " + open.getCount() + " left");
        }
        count.set(0);

        OperatingSystemMXBean os = (OperatingSystemMXBean) ManagementFactory.getOperatingSystemMXBean();
        // Ten seconds of the same load first, so that the JIT has compiled the paths that are measured.
        long warmupTicks = 10L * unitCount;
        long period = 1_000_000_000L / unitCount;
        long wall0 = System.nanoTime();
        long cpu0 = 0;
        long measuredFrom = 0;
        for (long tick = 0; tick < warmupTicks + (long) seconds * unitCount; tick++) {
            if (tick == warmupTicks) {
                TimeUnit.MILLISECONDS.sleep(500);
                count.set(0);
                cpu0 = os.getProcessCpuTime();
                measuredFrom = System.nanoTime();
            }
            long due = wall0 + tick * period + (tick >= warmupTicks ? 500_000_000L : 0);
            long wait = due - System.nanoTime();
            if (wait > 0) {
                TimeUnit.NANOSECONDS.sleep(wait);
            }
            UnitDescription u = units.get((int) (tick % unitCount));
            Instant ts = Instant.ofEpochMilli(base.timestamp().toEpochMilli() + tick * 1000L / unitCount + tick);
            UnitResult r = new UnitResult(ts, base.site(), u.id(), base.states(), base.components(), base.cycle(),
                    base.closure());
            publishedNanos.put(u.id() + "@" + org.steamtally.dashboard.json.ResultJson.timestamp(ts), System.nanoTime());
            live.publish(r);
        }
        TimeUnit.SECONDS.sleep(2);
        long wall = System.nanoTime() - measuredFrom;
        long cpu = os.getProcessCpuTime() - cpu0;
        int n = (int) Math.min(count.get(), latencies.length);
        long[] sorted = Arrays.copyOf(latencies, n);
        Arrays.sort(sorted);
        long expected = (long) seconds * unitCount * clients;
        System.out.printf("clients %d, units %d, %d s: %d of %d events received%n", clients, unitCount, seconds, n,
                expected);
        System.out.printf("latency publish->client: p50 %.2f ms, p99 %.2f ms, max %.2f ms%n",
                sorted[n / 2] / 1e6, sorted[(int) (n * 0.99)] / 1e6, sorted[n - 1] / 1e6);
        System.out.printf("JVM CPU (server and clients): %.1f %% of one core (%d cores)%n", 100.0 * cpu / wall,
                os.getAvailableProcessors());
        http.close();
        clientVertx.close();
        server.stop();
        serverVertx.close();
        System.exit(0);
    }
}
