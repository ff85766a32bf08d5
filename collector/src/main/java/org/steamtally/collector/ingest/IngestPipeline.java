package org.steamtally.collector.ingest;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.Gauge;
import io.micrometer.core.instrument.MeterRegistry;
import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.collector.align.Offer;
import org.steamtally.collector.align.SnapshotAligner;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.payload.PayloadOutcome;
import org.steamtally.collector.payload.PayloadParser;
import org.steamtally.collector.payload.Quality;
import org.steamtally.collector.payload.Reading;
import org.steamtally.collector.units.EngineeringUnit;
import org.steamtally.collector.units.Units;

/**
 * From MQTT messages to per-unit snapshots: the MQTT client's thread only {@link #submit}s the bytes
 * into a bounded queue; one worker parses ({@link PayloadParser}), maps the topic to sensors
 * ({@link TopicMap}), converts to SI ({@link Units}, gauge pressures with the site's or the
 * barometer's atmospheric pressure), validates, aligns per unit ({@link SnapshotAligner}) and hands
 * the snapshots to one {@link SnapshotSlot} per unit, where the newest wins. A unit's snapshot is
 * handed over as soon as the reading that completes it has been taken in, or at the allowed lateness
 * when it stays incomplete; the worker's time never runs past the oldest message still waiting in
 * its queue, so that its own backlog never makes a reading late (see {@link #workerClock}).
 *
 * <p>Every reading is either accepted ({@code steamtally.readings.accepted}, tag {@code sensor}) or
 * counted as rejected ({@code steamtally.readings.rejected}, tags {@code sensor} and {@code reason},
 * see {@link RejectionReason}); a message refused as a whole counts once per sensor of its topic, and a
 * message on a topic of no sensor or dropped at the full queue counts once with {@code sensor} "-".
 * Faults are logged at most once per sensor and reason per {@link #LOG_INTERVAL_MS} with the topic and
 * the offending value, and sent to the {@link DeadLetterSink}.
 *
 * <p>Memory is bounded whatever the input rate: the queue by message count and payload bytes, each
 * aligner by its window (see {@link SnapshotAligner}), each slot by one snapshot, and the meters by
 * sensors × reasons. Time comes from the injected {@link Clock}; {@link #processPending} and
 * {@link #tick} let a test drive the worker's steps on its own thread.
 */
public final class IngestPipeline implements AutoCloseable {

    /** One log line per sensor and reason at most this often, ms. */
    public static final long LOG_INTERVAL_MS = 10_000;

    /** The {@code sensor} tag of counts that belong to no sensor. */
    public static final String NO_SENSOR = "-";

    private static final Logger LOG = LoggerFactory.getLogger(IngestPipeline.class);
    private static final int EXCERPT_CHARS = 60;
    /** The worker wakes at least this often to emit due snapshots, ms. */
    private static final long MAX_IDLE_MS = 50;

    /** A message as the MQTT client handed it over; {@code payload} null when it was too large to keep. */
    private record Incoming(String topic, byte[] payload, int length, long arrivalMillis) {
    }

    private final PlantDescription plant;
    private final TopicMap topics;
    private final Clock clock;
    private final DeadLetterSink deadLetters;
    private final MeterRegistry registry;
    private final PayloadParser parser;
    private final int maxPayloadBytes;
    private final long maxFutureSkewMillis;
    private final long maxPastAgeMillis;
    private final long latenessMillis;
    private final long maxQueueBytes;
    /** Topics under the dead-letter prefix are never dead-lettered again, should a filter cover them. */
    private final Optional<String> deadLetterPrefix;

    private final ArrayBlockingQueue<Incoming> queue;
    private final AtomicLong queuedBytes = new AtomicLong();
    private final Counter queueFull;

    private final SnapshotAligner[] aligners;
    private final SnapshotSlot[] slots;
    private final Counter[] emitted;
    private final Map<String, SnapshotSlot> slotByUnit = new LinkedHashMap<>();
    /** First global sensor index of each unit, for the meter arrays. */
    private final int[] sensorOffset;
    private final Counter[] accepted;
    private final Counter[][] rejected;
    private final Counter[] unassigned = new Counter[RejectionReason.values().length];
    private final Map<String, EngineeringUnit> unitCache = new HashMap<>();
    private final RateLimitedLog log;

    private final Optional<String> barometerId;
    private boolean barometerSet;
    private double barometerPa;
    private long barometerMillis;
    private long barometerMaxAgeMillis;

    private final AtomicLong messagesDone = new AtomicLong();
    private volatile boolean running;
    private Thread worker;

    /**
     * @param plant       the plant description: units and sensors
     * @param topics      the topics of its sensors
     * @param settings    limits, snapshot period and lateness, barometer
     * @param registry    where the meters go
     * @param clock       the collector's clock: arrival times, timestamp limits, snapshot emission
     * @param deadLetters where refused payloads go; {@link DeadLetterSink#NONE} to keep none
     * @throws IllegalArgumentException when the barometer names no pressure sensor of the plant
     */
    public IngestPipeline(PlantDescription plant, TopicMap topics, CollectorSettings settings, MeterRegistry registry,
                          Clock clock, DeadLetterSink deadLetters) {
        this.plant = Objects.requireNonNull(plant, "plant");
        this.topics = Objects.requireNonNull(topics, "topics");
        Objects.requireNonNull(settings, "settings");
        this.registry = Objects.requireNonNull(registry, "registry");
        this.clock = Objects.requireNonNull(clock, "clock");
        this.deadLetters = Objects.requireNonNull(deadLetters, "deadLetters");
        this.maxPayloadBytes = settings.maxPayloadBytes();
        this.parser = new PayloadParser(maxPayloadBytes, PayloadParser.DEFAULT_MAX_READINGS);
        this.maxFutureSkewMillis = settings.maxFutureSkew().toMillis();
        this.maxPastAgeMillis = settings.maxPastAge().toMillis();
        this.latenessMillis = settings.allowedLateness().toMillis();
        this.maxQueueBytes = settings.queueBytes();
        this.deadLetterPrefix = settings.deadLetterTopic().map(t -> t + "/");
        this.queue = new ArrayBlockingQueue<>(settings.queueMessages());
        this.log = new RateLimitedLog(LOG, clock, LOG_INTERVAL_MS);

        List<UnitDescription> units = plant.units();
        aligners = new SnapshotAligner[units.size()];
        slots = new SnapshotSlot[units.size()];
        emitted = new Counter[units.size()];
        sensorOffset = new int[units.size()];
        int total = 0;
        for (int u = 0; u < units.size(); u++) {
            UnitDescription unit = units.get(u);
            aligners[u] = new SnapshotAligner(unit, settings.snapshotPeriod(), settings.allowedLateness(), true);
            slots[u] = new SnapshotSlot(unit.id(), Counter.builder("steamtally.snapshots.coalesced")
                    .description("snapshots replaced by a newer one before the calc took them")
                    .tag("unit", unit.id()).register(registry));
            emitted[u] = Counter.builder("steamtally.snapshots.emitted").tag("unit", unit.id()).register(registry);
            slotByUnit.put(unit.id(), slots[u]);
            sensorOffset[u] = total;
            total += unit.sensors().size();
        }
        accepted = new Counter[total];
        rejected = new Counter[total][];
        queueFull = rejectedCounter(NO_SENSOR, RejectionReason.QUEUE_FULL);
        unassigned[RejectionReason.QUEUE_FULL.ordinal()] = queueFull;
        Gauge.builder("steamtally.ingest.queue.messages", queue, ArrayBlockingQueue::size)
                .description("messages waiting between the MQTT client and the ingest worker").register(registry);
        Gauge.builder("steamtally.ingest.queue.bytes", queuedBytes, AtomicLong::get).baseUnit("bytes")
                .register(registry);

        this.barometerId = settings.barometer();
        if (barometerId.isPresent()) {
            Sensor b = findSensor(barometerId.get());
            if (b == null || b.quantity() != Quantity.PRESSURE) {
                throw new IllegalArgumentException("barometer \"" + barometerId.get()
                        + "\" is not a pressure sensor of the plant description");
            }
            barometerMaxAgeMillis = b.maxAge().toMillis();
        }
    }

    // ---- the MQTT client's side

    /**
     * Hands one message over; called on the MQTT client's thread. Never blocks and never throws: when
     * the queue is full (by count or bytes) the message is dropped and counted ({@code reason=queue_full}).
     * A payload above the size limit is queued without its bytes, to be counted against its sensors.
     *
     * @return false when the message was dropped
     */
    public boolean submit(String topic, byte[] payload) {
        try {
            int length = payload == null ? 0 : payload.length;
            boolean keep = length <= maxPayloadBytes;
            long charge = keep ? length : 0;
            if (queuedBytes.addAndGet(charge) > maxQueueBytes) {
                queuedBytes.addAndGet(-charge);
                queueFull.increment();
                return false;
            }
            if (!queue.offer(new Incoming(String.valueOf(topic), keep ? payload : null, length, clock.millis()))) {
                queuedBytes.addAndGet(-charge);
                queueFull.increment();
                return false;
            }
            return true;
        } catch (RuntimeException e) {
            // The client thread must survive whatever happens here; the message is lost and counted.
            queueFull.increment();
            return false;
        }
    }

    // ---- the worker

    /** Starts the worker thread; {@link #close} stops it. */
    public synchronized void start() {
        if (worker != null) {
            throw new IllegalStateException("ingest worker already started");
        }
        running = true;
        worker = new Thread(this::runWorker, "steamtally-ingest");
        worker.setDaemon(true);
        worker.start();
    }

    private void runWorker() {
        while (running) {
            try {
                Incoming first = queue.poll(idleWaitMillis(), TimeUnit.MILLISECONDS);
                if (first != null) {
                    take(first);
                    processPending(1024);
                }
                tick();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            } catch (RuntimeException e) {
                // A fault of ours must not stop ingestion; it is logged (rate-limited) and the loop goes on.
                log.warn("worker-fault", () -> "ingest worker: unexpected " + e);
            }
        }
    }

    private long idleWaitMillis() {
        long now = clock.millis();
        long wait = MAX_IDLE_MS;
        for (SnapshotAligner a : aligners) {
            if (a.nextSnapshotMillis().isPresent()) {
                long due = a.nextSnapshotMillis().getAsLong() + latenessMillis + 1;
                wait = Math.min(wait, Math.max(1, due - now));
            }
        }
        return wait;
    }

    /**
     * Processes up to {@code max} queued messages on the calling thread (the worker's step, for tests).
     *
     * @return how many were processed
     */
    public int processPending(int max) {
        int n = 0;
        Incoming m;
        while (n < max && (m = queue.poll()) != null) {
            take(m);
            n++;
        }
        return n;
    }

    /**
     * Moves every unit's aligner to the {@linkplain #workerClock worker's clock} and hands due snapshots
     * to the slots (the worker's step).
     */
    public void tick() {
        long now = workerClock();
        for (int u = 0; u < aligners.length; u++) {
            deliver(u, aligners[u].advanceTo(now));
        }
    }

    /**
     * The time the aligners and the timestamp limits go by: the clock, but never later than the
     * arrival of the oldest message still waiting in the queue. A reading queued behind the worker's
     * own backlog did not arrive late: judged by the clock alone, a backlog of a few seconds (a cold
     * start of a large fleet, the burst after a broker restart) turns every sensor of every unit stale
     * at once and raises a flood of alarms that is the daemon's own doing, not the plant's.
     */
    private long workerClock() {
        long now = clock.millis();
        Incoming oldest = queue.peek();
        return oldest == null ? now : Math.min(now, oldest.arrivalMillis());
    }

    private void deliver(int u, List<Snapshot> due) {
        // Indexed: this runs for every unit at every message, nearly always with nothing due, and an
        // iterator over the empty list was about 4 % of the daemon's allocation at 30 units.
        for (int i = 0; i < due.size(); i++) {
            slots[u].put(due.get(i));
            emitted[u].increment();
        }
    }

    private void take(Incoming m) {
        if (m.payload() != null) {
            queuedBytes.addAndGet(-m.length());
        }
        try {
            handle(m);
        } finally {
            messagesDone.incrementAndGet();
        }
    }

    private void handle(Incoming m) {
        List<TopicMap.Target> targets = topics.targets(m.topic());
        // The message is judged as of its arrival, however long it waited in the queue: its age, its
        // skew, and the snapshots due before it.
        long now = Math.min(clock.millis(), m.arrivalMillis());
        for (int u = 0; u < aligners.length; u++) {
            deliver(u, aligners[u].advanceTo(now));
        }
        if (targets.isEmpty()) {
            count(NO_SENSOR, -1, RejectionReason.UNMAPPED_TOPIC);
            fault(m, null, RejectionReason.UNMAPPED_TOPIC, "topic of no sensor", excerpt(m.payload()));
            return;
        }
        if (m.payload() == null) {
            String message = "payload of " + m.length() + " bytes exceeds the limit of " + maxPayloadBytes;
            for (TopicMap.Target t : targets) {
                countRejected(t, RejectionReason.TOO_LARGE);
            }
            fault(m, targets.get(0), RejectionReason.TOO_LARGE, message, "");
            return;
        }
        PayloadOutcome outcome = parser.parse(m.payload(), Instant.ofEpochMilli(m.arrivalMillis()));
        if (outcome instanceof PayloadOutcome.Rejected r) {
            RejectionReason reason = RejectionReason.of(r.reason());
            for (TopicMap.Target t : targets) {
                countRejected(t, reason);
            }
            fault(m, targets.get(0), reason, r.message(), r.excerpt());
            return;
        }
        boolean faulted = false;
        for (Reading reading : ((PayloadOutcome.Accepted) outcome).readings()) {
            for (TopicMap.Target t : targets) {
                String problem = offer(t, reading, now);
                if (problem != null && !faulted) {
                    faulted = true;
                    RejectionReason reason = lastReason;
                    fault(m, t, reason, problem, Double.toString(reading.value())
                            + reading.unit().map(u -> " " + u).orElse("") + " at " + reading.timestamp());
                }
            }
        }
        // The reading may have completed its unit's snapshot: handed over now, not at the next message.
        long after = workerClock();
        int last = -1;
        for (TopicMap.Target t : targets) {
            if (t.unitIndex() != last) {
                last = t.unitIndex();
                deliver(last, aligners[last].advanceTo(after));
            }
        }
    }

    /** The reason of the last refusal by {@link #offer}; the worker is single-threaded. */
    private RejectionReason lastReason;

    /** Validates and aligns one reading for one sensor; null when accepted, else why not. */
    private String offer(TopicMap.Target t, Reading reading, long now) {
        Sensor sensor = t.sensor();
        if (reading.quality() == Quality.BAD) {
            return refuse(t, RejectionReason.QUALITY_BAD, "the reading's quality is bad");
        }
        String spelling = reading.unit().orElse(sensor.engineeringUnit());
        EngineeringUnit unit = unitCache.get(spelling);
        if (unit == null) {
            try {
                unit = Units.parse(spelling);
            } catch (IllegalArgumentException e) {
                return refuse(t, RejectionReason.UNKNOWN_UNIT, e.getMessage());
            }
            unitCache.put(spelling, unit);
        }
        if (!unit.measures(sensor.quantity())) {
            return refuse(t, RejectionReason.UNIT_MISMATCH, "unit " + spelling + " measures "
                    + unit.quantity().label() + ", but sensor " + sensor.id() + " measures " + sensor.quantity().label());
        }
        double si = unit.toSi(reading.value(), atmosphericPa(now));
        if (!Double.isFinite(si)) {
            return refuse(t, RejectionReason.NOT_FINITE, "value overflows in SI");
        }
        if (!sensor.isPlausible(si)) {
            return refuse(t, RejectionReason.OUT_OF_RANGE, "value " + si + " " + sensor.quantity().siUnit()
                    + " outside the plausible range " + sensor.rangeMinSi() + " to " + sensor.rangeMaxSi());
        }
        long ts = reading.timestamp().toEpochMilli();
        if (ts > now + maxFutureSkewMillis) {
            return refuse(t, RejectionReason.TOO_FAR_FUTURE, "stamped " + (ts - now) + " ms ahead of the clock,"
                    + " more than the allowed " + maxFutureSkewMillis + " ms");
        }
        if (ts < now - maxPastAgeMillis) {
            return refuse(t, RejectionReason.TOO_OLD, "stamped " + (now - ts) + " ms behind the clock,"
                    + " more than the allowed " + maxPastAgeMillis + " ms");
        }
        // Within the skew a publisher's clock may run ahead of ours: taken as stamped now.
        long effective = Math.min(ts, now);
        Offer offer = aligners[t.unitIndex()].offer(t.sensorIndex(), effective, si);
        switch (offer) {
            case ACCEPTED:
                accepted(t).increment();
                if (barometerId.isPresent() && barometerId.get().equals(sensor.id())
                        && (!barometerSet || effective >= barometerMillis)) {
                    barometerSet = true;
                    barometerPa = si;
                    barometerMillis = effective;
                }
                return null;
            case DUPLICATE:
                countRejected(t, RejectionReason.DUPLICATE);
                return null;
            case SUPERSEDED:
                countRejected(t, RejectionReason.SUPERSEDED);
                return null;
            case CONFLICT:
                return refuse(t, RejectionReason.CONFLICT, "another value for the same instant is already held");
            case AHEAD:
                return refuse(t, RejectionReason.TOO_FAR_FUTURE, "ahead of the aligner's clock");
            case NOT_FINITE:
                return refuse(t, RejectionReason.NOT_FINITE, "value is not finite");
            case IMPLAUSIBLE:
            default:
                return refuse(t, RejectionReason.OUT_OF_RANGE, "value outside the plausible range");
        }
    }

    private double atmosphericPa(long now) {
        if (barometerSet && now - barometerMillis <= barometerMaxAgeMillis) {
            return barometerPa;
        }
        return plant.atmosphericPressurePa();
    }

    private String refuse(TopicMap.Target t, RejectionReason reason, String message) {
        countRejected(t, reason);
        lastReason = reason;
        return message;
    }

    private void fault(Incoming m, TopicMap.Target t, RejectionReason reason, String message, String excerpt) {
        String sensor = t == null ? NO_SENSOR : t.sensor().id();
        log.warn(sensor + "/" + reason.tag(), () -> "refused " + reason.tag() + " on topic " + m.topic()
                + (t == null ? "" : " (sensor " + sensor + ")") + ": " + message + ": " + excerpt);
        if (deadLetterPrefix.isPresent() && m.topic().startsWith(deadLetterPrefix.get())) {
            return;
        }
        try {
            deadLetters.refused(m.topic(), m.payload() == null ? new byte[0] : m.payload(), reason, message);
        } catch (RuntimeException e) {
            log.warn("dead-letter", () -> "dead-letter sink failed: " + e);
        }
    }

    // ---- meters

    private Counter accepted(TopicMap.Target t) {
        int i = sensorOffset[t.unitIndex()] + t.sensorIndex();
        Counter c = accepted[i];
        if (c == null) {
            c = Counter.builder("steamtally.readings.accepted").description("readings taken into a unit's snapshots")
                    .tag("sensor", t.sensor().id()).register(registry);
            accepted[i] = c;
        }
        return c;
    }

    private void countRejected(TopicMap.Target t, RejectionReason reason) {
        count(t.sensor().id(), sensorOffset[t.unitIndex()] + t.sensorIndex(), reason);
    }

    private void count(String sensorId, int index, RejectionReason reason) {
        Counter[] row;
        if (index < 0) {
            row = unassigned;
        } else {
            row = rejected[index];
            if (row == null) {
                row = new Counter[RejectionReason.values().length];
                rejected[index] = row;
            }
        }
        Counter c = row[reason.ordinal()];
        if (c == null) {
            c = rejectedCounter(sensorId, reason);
            row[reason.ordinal()] = c;
        }
        c.increment();
    }

    private Counter rejectedCounter(String sensorId, RejectionReason reason) {
        return Counter.builder("steamtally.readings.rejected").description("readings or messages not taken, by reason")
                .tag("sensor", sensorId).tag("reason", reason.tag()).register(registry);
    }

    // ---- queries

    /** The slot where snapshots of unit {@code unitId} are handed over. */
    public SnapshotSlot slot(String unitId) {
        SnapshotSlot s = slotByUnit.get(unitId);
        if (s == null) {
            throw new IllegalArgumentException("no unit \"" + unitId + "\" in the plant description (units: "
                    + String.join(", ", slotByUnit.keySet()) + ")");
        }
        return s;
    }

    /** Every unit's slot, in the plant description's order. */
    public List<SnapshotSlot> slots() {
        return List.copyOf(slotByUnit.values());
    }

    /** Messages taken off the queue and handled so far. */
    public long messagesProcessed() {
        return messagesDone.get();
    }

    /** Messages waiting in the queue. */
    public int queued() {
        return queue.size();
    }

    /** The topic map in use. */
    public TopicMap topics() {
        return topics;
    }

    /** Stops the worker thread, if started, and waits briefly for it. Queued messages are dropped. */
    @Override
    public void close() {
        Thread w;
        synchronized (this) {
            running = false;
            w = worker;
            worker = null;
        }
        if (w != null) {
            w.interrupt();
            try {
                w.join(5_000);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
    }

    private Sensor findSensor(String id) {
        for (UnitDescription u : plant.units()) {
            Optional<Sensor> s = u.sensor(id);
            if (s.isPresent()) {
                return s.get();
            }
        }
        return null;
    }

    private static String excerpt(byte[] payload) {
        if (payload == null) {
            return "";
        }
        String text = new String(payload, 0, Math.min(payload.length, 4 * EXCERPT_CHARS), StandardCharsets.UTF_8);
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < text.length() && out.length() < EXCERPT_CHARS; i++) {
            char c = text.charAt(i);
            out.append(Character.isISOControl(c) ? '?' : c);
        }
        return out.toString();
    }

    /** For tests that want the units in use. */
    List<String> unitIds() {
        return new ArrayList<>(slotByUnit.keySet());
    }
}
