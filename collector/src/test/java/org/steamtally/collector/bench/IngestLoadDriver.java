package org.steamtally.collector.bench;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import java.util.UUID;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.locks.LockSupport;
import org.eclipse.paho.mqttv5.client.IMqttToken;
import org.eclipse.paho.mqttv5.client.MqttAsyncClient;
import org.eclipse.paho.mqttv5.client.MqttCallback;
import org.eclipse.paho.mqttv5.client.MqttConnectionOptions;
import org.eclipse.paho.mqttv5.client.MqttDisconnectResponse;
import org.eclipse.paho.mqttv5.client.persist.MemoryPersistence;
import org.eclipse.paho.mqttv5.common.MqttException;
import org.eclipse.paho.mqttv5.common.MqttMessage;
import org.eclipse.paho.mqttv5.common.packet.MqttProperties;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.ingest.DeadLetterSink;
import org.steamtally.collector.ingest.IngestPipeline;
import org.steamtally.collector.ingest.TopicMap;
import org.steamtally.collector.mqtt.ConnectionListener;
import org.steamtally.collector.mqtt.ConnectionState;
import org.steamtally.collector.mqtt.MessageSource;
import org.steamtally.collector.mqtt.MessageSources;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublisher;
import org.steamtally.collector.mqtt.ReadingPublishers;

/**
 * Load driver (not a test) against a real MQTT 5 broker on loopback, all in one run:
 * <ol>
 *   <li>the raw ceiling: a bare Paho subscriber that only counts, fed by one windowed QoS 1 publisher
 *       as fast as it goes;</li>
 *   <li>the collector's sustained rate for the same load through its {@link MessageSource} and
 *       {@link IngestPipeline} (parse, convert, validate, align);</li>
 *   <li>publish-to-snapshot latency at a fixed 10,000 messages/s: each reading's value is its sequence
 *       number, so the first snapshot the consumer takes that carries a value at or above it dates
 *       its arrival;</li>
 *   <li>heap: the peak of the heap pools over the whole run.</li>
 * </ol>
 * Arguments: broker URL (default tcp://127.0.0.1:1883), messages per throughput round (300000),
 * rounds (2), latency seconds (20). Run with {@code -Xmx256m} to hold it to the heap target.
 */
public final class IngestLoadDriver {

    private static final int QOS = 1;
    private static final int SENSORS = 20;
    private static final int WINDOW = 1000;
    private static final int LATENCY_RATE = 10_000;
    private static final int LATENCY_WINDOW = 100;
    /** A reading of about 120 bytes, as the collector's publishers send them. */
    private static final String PAYLOAD = "{\"value\": %d, \"ts\": %d, \"unit\": \"kg/s\", \"quality\": \"good\", "
            + "\"src\": \"fernholm-bench-gw-01\", \"pad\": \"%s\"}";

    private IngestLoadDriver() {
    }

    public static void main(String[] args) throws Exception {
        String url = args.length > 0 ? args[0] : "tcp://127.0.0.1:1883";
        int n = args.length > 1 ? Integer.parseInt(args[1]) : 300_000;
        int rounds = args.length > 2 ? Integer.parseInt(args[2]) : 2;
        int latencySeconds = args.length > 3 ? Integer.parseInt(args[3]) : 20;
        String run = UUID.randomUUID().toString().substring(0, 8);
        PlantDescription plant = plant("bench-" + run);
        TopicMap topics = TopicMap.of(plant, Optional.of("steamtally/bench/{site}/{unit}/{sensor}"));
        String[] topicOf = new String[SENSORS];
        for (int i = 0; i < SENSORS; i++) {
            topicOf[i] = topics.topicOf(sensorId(i)).orElseThrow();
        }
        System.out.printf("payload %d bytes, %d messages per round, QoS %d, window %d, broker %s%n",
                payload(123456, System.currentTimeMillis()).length, n, QOS, WINDOW, url);

        pipelineAlone(plant, topicOf);
        for (int r = 1; r <= rounds; r++) {
            double raw = rawCeiling(url, topics.subscriptionFilters().get(0), topicOf, n, run + "-r" + r);
            double ours = collectorRate(url, plant, topics, topicOf, n, run + "-c" + r);
            System.out.printf("round %d: raw ceiling %.0f msg/s, collector %.0f msg/s = %.0f %% of raw%n",
                    r, raw, ours, 100 * ours / raw);
        }
        latency(url, plant, topics, topicOf, latencySeconds, run + "-l");
        long peak = 0;
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                peak += pool.getPeakUsage().getUsed();
            }
        }
        System.out.printf("heap: peak used %.1f MB (sum of heap pool peaks), max %.0f MB%n", peak / 1e6,
                Runtime.getRuntime().maxMemory() / 1e6);
        System.exit(0);
    }

    private static String sensorId(int i) {
        return String.format("FT-%03d", i);
    }

    private static PlantDescription plant(String site) {
        List<Sensor> sensors = new ArrayList<>();
        for (int i = 0; i < SENSORS; i++) {
            sensors.add(new Sensor(sensorId(i), Quantity.MASS_FLOW, "kg/s", 1.0, UncertaintyBasis.STANDARD, 0.0, 1e9,
                    Duration.ofSeconds(5), Optional.empty()));
        }
        return new PlantDescription(site, "Bench", 101_325.0, List.of(
                new UnitDescription("unit1", "Bench unit", sensors, List.of(), List.of(), DeadState.STANDARD)));
    }

    private static byte[] payload(long value, long ts) {
        return String.format(PAYLOAD, value, ts, "x".repeat(8)).getBytes(StandardCharsets.UTF_8);
    }

    private static ReadingPublisher publisher(String url, String id) {
        return publisher(url, id, WINDOW);
    }

    private static ReadingPublisher publisher(String url, String id, int window) {
        return ReadingPublishers.connect(new PublisherOptions(List.of(url), MqttProtocol.MQTT_5, "bench-pub-" + id,
                window, true, false));
    }

    /** Publishes n readings as fast as the window allows; timestamps 1 ms apart in the recent past. */
    private static void blast(ReadingPublisher pub, String[] topicOf, int n) throws InterruptedException {
        long base = System.currentTimeMillis() - 30 * 60_000L;
        for (int i = 0; i < n; i++) {
            pub.publish(topicOf[i % SENSORS], payload(i, base + i), QOS);
        }
    }

    /** The ingest pipeline without a broker: submit and process on this thread, for its headroom. */
    private static void pipelineAlone(PlantDescription plant, String[] topicOf) {
        int n = 1_000_000;
        TopicMap topics = TopicMap.of(plant, Optional.of("steamtally/bench/{site}/{unit}/{sensor}"));
        CollectorSettings s = CollectorSettings.builder(List.of("tcp://127.0.0.1:1883"), "bench-alone")
                .snapshotPeriod(Duration.ofMillis(100)).allowedLateness(Duration.ZERO).build();
        byte[][] payloads = new byte[1000][];
        long base = System.currentTimeMillis() - 30 * 60_000L;
        for (int round = 0; round < 2; round++) {
            IngestPipeline pipeline = new IngestPipeline(plant, topics, s, new SimpleMeterRegistry(), Clock.systemUTC(),
                    DeadLetterSink.NONE);
            long start = System.nanoTime();
            for (int i = 0; i < n; i++) {
                if (i % 1000 == 0) {
                    for (int k = 0; k < payloads.length; k++) {
                        payloads[k] = payload(i + k, base + i + k);
                    }
                }
                pipeline.submit(topicOf[i % SENSORS], payloads[i % 1000]);
                if (i % 1000 == 999) {
                    pipeline.processPending(Integer.MAX_VALUE);
                    pipeline.tick();
                }
            }
            double seconds = (System.nanoTime() - start) / 1e9;
            // Building the payloads is counted too, so this is a lower bound on the pipeline's own rate.
            System.out.printf("pipeline alone, one thread, round %d: %.0f msg/s%n", round + 1, n / seconds);
        }
    }

    private static double rawCeiling(String url, String filter, String[] topicOf, int n, String id) throws Exception {
        AtomicLong count = new AtomicLong();
        AtomicLong first = new AtomicLong();
        AtomicLong last = new AtomicLong();
        MqttAsyncClient sub = new MqttAsyncClient(url, "bench-raw-" + id, new MemoryPersistence());
        sub.setCallback(new MqttCallback() {
            @Override
            public void messageArrived(String topic, MqttMessage message) {
                long now = System.nanoTime();
                if (count.getAndIncrement() == 0) {
                    first.set(now);
                }
                last.set(now);
            }

            @Override
            public void disconnected(MqttDisconnectResponse r) {
            }

            @Override
            public void mqttErrorOccurred(MqttException e) {
            }

            @Override
            public void deliveryComplete(IMqttToken t) {
            }

            @Override
            public void connectComplete(boolean reconnect, String serverURI) {
            }

            @Override
            public void authPacketArrived(int code, MqttProperties p) {
            }
        });
        MqttConnectionOptions o = new MqttConnectionOptions();
        o.setCleanStart(true);
        sub.connect(o).waitForCompletion(10_000);
        sub.subscribe(filter, QOS).waitForCompletion(10_000);
        ReadingPublisher pub = publisher(url, id);
        blast(pub, topicOf, n);
        waitFor(() -> count.get() >= n, Duration.ofSeconds(120));
        pub.close();
        sub.disconnect().waitForCompletion(10_000);
        sub.close();
        if (count.get() < n) {
            System.out.printf("raw subscriber received only %d of %d%n", count.get(), n);
        }
        return (count.get() - 1) / ((last.get() - first.get()) / 1e9);
    }

    private static double collectorRate(String url, PlantDescription plant, TopicMap topics, String[] topicOf, int n,
                                        String id) throws Exception {
        SimpleMeterRegistry registry = new SimpleMeterRegistry();
        CollectorSettings s = CollectorSettings.builder(List.of(url), "bench-collector-" + id)
                .sessionExpiry(Duration.ZERO).snapshotPeriod(Duration.ofMillis(100)).allowedLateness(Duration.ZERO)
                .build();
        IngestPipeline pipeline = new IngestPipeline(plant, topics, s, registry, Clock.systemUTC(), DeadLetterSink.NONE);
        AtomicLong first = new AtomicLong();
        AtomicLong arrived = new AtomicLong();
        pipeline.start();
        MessageSource source = MessageSources.open(s, topics.subscriptionFilters(), ConnectionListener.NONE, registry,
                Clock.systemUTC(), System::getenv);
        source.start((topic, payload) -> {
            if (arrived.getAndIncrement() == 0) {
                first.set(System.nanoTime());
            }
            pipeline.submit(topic, payload);
        });
        waitFor(() -> source.state() == ConnectionState.CONNECTED, Duration.ofSeconds(30));
        ReadingPublisher pub = publisher(url, id);
        blast(pub, topicOf, n);
        waitFor(() -> pipeline.messagesProcessed() >= n, Duration.ofSeconds(120));
        long end = System.nanoTime();
        double accepted = registry.find("steamtally.readings.accepted").counters().stream()
                .mapToDouble(Counter::count).sum();
        double refused = registry.find("steamtally.readings.rejected").counters().stream()
                .mapToDouble(Counter::count).sum();
        System.out.printf("  collector: %d processed, %.0f accepted, %.0f refused%n", pipeline.messagesProcessed(),
                accepted, refused);
        pub.close();
        source.close();
        pipeline.close();
        return (pipeline.messagesProcessed() - 1) / ((end - first.get()) / 1e9);
    }

    private static void latency(String url, PlantDescription plant, TopicMap topics, String[] topicOf, int seconds,
                                String id) throws Exception {
        int n = LATENCY_RATE * seconds;
        SimpleMeterRegistry registry = new SimpleMeterRegistry();
        CollectorSettings s = CollectorSettings.builder(List.of(url), "bench-latency-" + id)
                .sessionExpiry(Duration.ZERO).snapshotPeriod(Duration.ofMillis(10)).allowedLateness(Duration.ZERO)
                .build();
        IngestPipeline pipeline = new IngestPipeline(plant, topics, s, registry, Clock.systemUTC(), DeadLetterSink.NONE);
        pipeline.start();
        MessageSource source = MessageSources.open(s, topics.subscriptionFilters(), ConnectionListener.NONE, registry,
                Clock.systemUTC(), System::getenv);
        long[] published = new long[n];
        long[] arrived = new long[n];
        long[] latencyNanos = new long[n];
        long[] collectorNanos = new long[n];
        Arrays.fill(latencyNanos, -1);
        Arrays.fill(collectorNanos, -1);
        source.start((topic, payload) -> {
            int seq = sequenceOf(payload);
            if (seq >= 0 && seq < n) {
                arrived[seq] = System.nanoTime();
            }
            pipeline.submit(topic, payload);
        });
        waitFor(() -> source.state() == ConnectionState.CONNECTED, Duration.ofSeconds(30));

        Thread consumer = new Thread(() -> {
            long[] seen = new long[SENSORS];
            Arrays.fill(seen, -1);
            int dated = 0;
            try {
                while (dated < n && !Thread.currentThread().isInterrupted()) {
                    Optional<Snapshot> snap = pipeline.slot("unit1").take(Duration.ofSeconds(1));
                    if (snap.isEmpty()) {
                        continue;
                    }
                    long now = System.nanoTime();
                    double[] v = snap.get().valuesSi();
                    for (int k = 0; k < SENSORS; k++) {
                        long upTo = (long) v[k];
                        if (snap.get().status()[k] == Snapshot.SensorStatus.MISSING) {
                            continue;
                        }
                        // Every sequence number of sensor k up to the value now carried has arrived.
                        for (long seq = seen[k] < 0 ? k : seen[k] + SENSORS; seq <= upTo && seq < n; seq += SENSORS) {
                            if (published[(int) seq] != 0) {
                                latencyNanos[(int) seq] = now - published[(int) seq];
                                dated++;
                            }
                            if (arrived[(int) seq] != 0) {
                                collectorNanos[(int) seq] = now - arrived[(int) seq];
                            }
                        }
                        seen[k] = Math.max(seen[k], upTo);
                    }
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "bench-consumer");
        consumer.start();

        // A narrower window than for throughput: at a paced rate a full window is only queueing in the publisher.
        ReadingPublisher pub = publisher(url, id, LATENCY_WINDOW);
        long start = System.nanoTime();
        long interval = 1_000_000_000L / LATENCY_RATE;
        for (int i = 0; i < n; i++) {
            long due = start + i * interval;
            long wait;
            while ((wait = due - System.nanoTime()) > 0) {
                LockSupport.parkNanos(wait);
            }
            long now = System.nanoTime();
            published[i] = now;
            pub.publish(topicOf[i % SENSORS], payload(i, System.currentTimeMillis()), QOS);
        }
        double achieved = n / ((System.nanoTime() - start) / 1e9);
        waitFor(() -> pipeline.messagesProcessed() >= n, Duration.ofSeconds(60));
        Thread.sleep(500);
        consumer.interrupt();
        consumer.join();
        long[] dated = Arrays.stream(latencyNanos).filter(x -> x >= 0).sorted().toArray();
        System.out.printf("latency at %.0f msg/s offered (%d s, snapshot period 10 ms, lateness 0): %d of %d dated, "
                        + "p50 %.1f ms, p99 %.1f ms, p99.9 %.1f ms, max %.1f ms%n", achieved, seconds, dated.length, n,
                pct(dated, 0.50), pct(dated, 0.99), pct(dated, 0.999), dated.length == 0 ? 0 : dated[dated.length - 1] / 1e6);
        System.gc();
        System.out.printf("  heap in use after a full collection, collector still running: %.1f MB%n",
                ManagementFactory.getMemoryMXBean().getHeapMemoryUsage().getUsed() / 1e6);
        long[] ours = Arrays.stream(collectorNanos).filter(x -> x >= 0).sorted().toArray();
        System.out.printf("  of which arrival at the collector's client to snapshot taken: p50 %.1f ms, p99 %.1f ms,"
                + " p99.9 %.1f ms%n", pct(ours, 0.50), pct(ours, 0.99), pct(ours, 0.999));
        pub.close();
        source.close();
        pipeline.close();
    }

    /** The value field of a bench payload, which is the sequence number; -1 when absent. */
    private static int sequenceOf(byte[] payload) {
        int i = 9; // after {"value":
        while (i < payload.length && payload[i] == ' ') {
            i++;
        }
        int v = 0;
        boolean any = false;
        while (i < payload.length && payload[i] >= '0' && payload[i] <= '9') {
            v = v * 10 + (payload[i] - '0');
            i++;
            any = true;
        }
        return any ? v : -1;
    }

    private static double pct(long[] sorted, double p) {
        if (sorted.length == 0) {
            return Double.NaN;
        }
        return sorted[(int) Math.min(sorted.length - 1, Math.floor(p * sorted.length))] / 1e6;
    }

    private static void waitFor(java.util.function.BooleanSupplier done, Duration timeout) throws InterruptedException {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (!done.getAsBoolean() && System.nanoTime() < deadline) {
            Thread.sleep(5);
        }
    }
}
