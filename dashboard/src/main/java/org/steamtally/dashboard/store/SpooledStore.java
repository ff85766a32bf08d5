package org.steamtally.dashboard.store;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.Gauge;
import io.micrometer.core.instrument.MeterRegistry;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.locks.LockSupport;
import org.steamtally.calc.cycle.UnitResult;

/**
 * The store port over one adapter, with a bounded in-memory queue, batching, and an on-disk journal
 * that keeps points while the store is unreachable.
 *
 * <p>Callers only enqueue; one writer thread sends batches to the store. When a write fails because
 * the store cannot be reached, the batch and everything after it go to the journal, and the store is
 * tried again after a wait that doubles from {@link SpoolSettings#retryMin} to
 * {@link SpoolSettings#retryMax}. Once it answers, the journal is replayed in order, batch by batch,
 * while new points keep queuing behind it; since a point's identity is its measurement, tags and
 * timestamp, a batch replayed twice (after a crash between write and acknowledgement) overwrites
 * rather than duplicates. While a write hangs (a store that answers slowly or not at all until the
 * request times out), a spooler thread moves points from the queue to the journal whenever the queue
 * is more than half full, so that callers, the units' evaluation threads, neither wait nor contend
 * for the journal; only when the queue is full all the same (the disk cannot keep up either) does a
 * caller append its points to the journal itself. The journal is forced to disk every
 * {@link SpoolSettings#syncInterval}.
 *
 * <p>Points reach the store in the order they were queued, except that a batch whose write failed
 * goes after any points the spooler journaled meanwhile. Neither store cares: a point written later
 * than a newer one lands in the same place.
 *
 * <p>Meters: {@code steamtally.store.queue.depth} (points in memory), {@code steamtally.store.spool.bytes}
 * (journal size), {@code steamtally.store.spool.dropped} (points dropped from a full journal),
 * {@code steamtally.store.rejected} (points the store refused for good), each tagged with
 * {@code store}. The {@link StoreListener} hears of drops, outages and recovery.
 */
public final class SpooledStore implements ResultStore {

    static final String QUEUE_DEPTH = "steamtally.store.queue.depth";
    static final String SPOOL_BYTES = "steamtally.store.spool.bytes";
    static final String SPOOL_DROPPED = "steamtally.store.spool.dropped";
    static final String REJECTED = "steamtally.store.rejected";
    static final String WRITES = "steamtally.store.writes";

    /** Longest the writer waits for new points before looking at the journal again. */
    private static final Duration IDLE_POLL = Duration.ofMillis(100);
    /** Longest the spooler sleeps between looks at the queue when nobody wakes it. */
    private static final Duration SPOOLER_POLL = Duration.ofMillis(50);

    private static final System.Logger LOG = System.getLogger(SpooledStore.class.getName());

    private final StoreBackend backend;
    private final SpoolSettings settings;
    private final Clock clock;
    private final StoreListener listener;
    private final Journal journal;
    private final ArrayBlockingQueue<Point> queue;
    private final Counter droppedCounter;
    private final Counter rejectedCounter;
    private final Counter writesCounter;
    private final Thread writer;
    /** Moves points from a queue more than half full to the journal while the writer is stuck in a write. */
    private final Thread spooler;
    private final int highWater;
    /** Held while points go from the queue to the journal, so that two threads' batches keep their order. */
    private final Object queueToJournal = new Object();
    private final ScheduledExecutorService syncer;
    private final java.util.concurrent.ExecutorService queries;

    private final Object progress = new Object();
    private long submitted;
    private long handled;
    private long totalDropped;

    private volatile boolean closing;
    // Writer-thread state.
    private boolean down;
    private Instant nextAttempt = Instant.MIN;
    private Duration wait;

    private SpooledStore(StoreBackend backend, SpoolSettings settings, MeterRegistry registry, StoreListener listener,
            Clock clock) throws IOException {
        this.backend = Objects.requireNonNull(backend, "backend");
        this.settings = Objects.requireNonNull(settings, "settings");
        this.clock = Objects.requireNonNull(clock, "clock");
        this.listener = Objects.requireNonNull(listener, "listener");
        this.journal = new Journal(settings.spoolDir(), settings.spoolMaxBytes(), settings.segmentBytes());
        this.queue = new ArrayBlockingQueue<>(settings.queueCapacity());
        this.wait = settings.retryMin();
        String store = backend.name();
        Gauge.builder(QUEUE_DEPTH, queue, Collection::size).tag("store", store)
                .description("points queued in memory for the store").register(registry);
        Gauge.builder(SPOOL_BYTES, journal, Journal::bytes).tag("store", store).baseUnit("bytes")
                .description("size of the on-disk journal of points not yet in the store").register(registry);
        this.droppedCounter = Counter.builder(SPOOL_DROPPED).tag("store", store)
                .description("points dropped, oldest first, because the journal was full").register(registry);
        this.rejectedCounter = Counter.builder(REJECTED).tag("store", store)
                .description("points the store refused for good").register(registry);
        this.writesCounter = Counter.builder(WRITES).tag("store", store)
                .description("writes to the store, each a batch of points, whether it succeeded or not").register(registry);
        this.writer = new Thread(this::run, "steamtally-store-writer-" + store);
        this.writer.setDaemon(true);
        this.highWater = Math.max(1, settings.queueCapacity() / 2);
        this.spooler = new Thread(this::relieve, "steamtally-store-spooler-" + store);
        this.spooler.setDaemon(true);
        this.queries = Executors.newSingleThreadExecutor(r -> {
            Thread t = new Thread(r, "steamtally-store-query-" + store);
            t.setDaemon(true);
            return t;
        });
        this.syncer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "steamtally-store-spool-sync-" + store);
            t.setDaemon(true);
            return t;
        });
    }

    /**
     * Opens the journal (recovering it up to its last whole record), starts the writer and the
     * journal's sync schedule. Points recovered from the journal are replayed first.
     */
    public static SpooledStore open(StoreBackend backend, SpoolSettings settings, MeterRegistry registry,
            StoreListener listener, Clock clock) throws IOException {
        SpooledStore s = new SpooledStore(backend, settings, registry, listener, clock);
        long ms = settings.syncInterval().toMillis();
        s.syncer.scheduleWithFixedDelay(s::sync, ms, ms, TimeUnit.MILLISECONDS);
        s.writer.start();
        s.spooler.start();
        return s;
    }

    /** The adapter underneath, for queries the port does not offer. */
    public StoreBackend backend() {
        return backend;
    }

    /** Points in the journal waiting for the store. */
    public long spooledPoints() {
        return journal.pendingRecords();
    }

    /** Bytes of torn records cut off the journal when it was opened. */
    public long recoveredTornBytes() {
        return journal.recoveredTornBytes();
    }

    @Override
    public void writeResult(UnitResult result) {
        // The record's reconciliation goes with it, so that a caller cannot store one without the other.
        List<Point> points = new java.util.ArrayList<>(ResultPoints.of(result));
        StoredReconciliation.of(result).ifPresent(rec -> points.addAll(ResultPoints.of(rec)));
        enqueue(points);
    }

    @Override
    public void writeReconciliation(StoredReconciliation reconciliation) {
        enqueue(ResultPoints.of(reconciliation));
    }

    @Override
    public void writeAlarmEvent(StoredAlarmEvent event) {
        enqueue(List.of(ResultPoints.of(event)));
    }

    @Override
    public void writeReading(StoredReading reading) {
        enqueue(List.of(ResultPoints.of(reading)));
    }

    /** Queues points; when the queue is full, the rest go to the journal from the calling thread. */
    public void enqueue(List<Point> points) {
        if (closing) {
            throw new IllegalStateException("the " + backend.name() + " store is closed; " + points.size()
                    + " points not taken");
        }
        synchronized (progress) {
            submitted += points.size();
        }
        List<Point> overflow = null;
        for (Point p : points) {
            if (overflow == null && queue.offer(p)) {
                continue;
            }
            if (overflow == null) {
                overflow = new ArrayList<>();
            }
            overflow.add(p);
        }
        if (queue.size() > highWater) {
            LockSupport.unpark(spooler);
        }
        if (overflow != null) {
            // The spooler has not kept the queue from filling: the disk is slow too. Wait for it here
            // rather than lose the points.
            spool(overflow);
            handled(overflow.size());
        }
    }

    /**
     * The spooler's loop: whenever the queue is more than half full, moves the oldest points in it to
     * the journal, a batch at a time, until it is no more than half full. The writer, once its write
     * returns, finds the journal pending and replays it in order behind what it was writing.
     */
    private void relieve() {
        while (!closing) {
            LockSupport.parkNanos(this, SPOOLER_POLL.toNanos());
            try {
                while (queue.size() > highWater && !closing) {
                    int moved;
                    synchronized (queueToJournal) {
                        moved = queueToJournal(null);
                    }
                    if (moved == 0) {
                        break;
                    }
                }
            } catch (RuntimeException e) {
                // The spooler must outlive one bad batch, like the writer.
                LOG.log(System.Logger.Level.ERROR, "store spooler (" + backend.name() + "): " + e, e);
            }
        }
    }

    /**
     * Moves a batch of the oldest queued points, after {@code first} (taken from the queue already,
     * or null), to the journal; returns how many. The caller holds the {@link #queueToJournal} lock.
     */
    private int queueToJournal(Point first) {
        List<Point> batch = new ArrayList<>(Math.min(settings.batchSize(), 4096));
        if (first != null) {
            batch.add(first);
        }
        queue.drainTo(batch, settings.batchSize() - batch.size());
        if (!batch.isEmpty()) {
            spool(batch);
            handled(batch.size());
        }
        return batch.size();
    }

    @Override
    public boolean flush(Duration timeout) throws InterruptedException {
        long target;
        synchronized (progress) {
            target = submitted;
        }
        long deadline = System.nanoTime() + timeout.toNanos();
        synchronized (progress) {
            while (handled < target) {
                long left = deadline - System.nanoTime();
                if (left <= 0) {
                    return false;
                }
                TimeUnit.NANOSECONDS.timedWait(progress, left);
            }
        }
        sync();
        return true;
    }

    /**
     * Waits until the queue and the journal are empty: everything written so far is in the store.
     *
     * @return whether that happened within {@code timeout}
     */
    public boolean awaitDrained(Duration timeout) throws InterruptedException {
        if (!flush(timeout)) {
            return false;
        }
        long deadline = System.nanoTime() + timeout.toNanos();
        synchronized (progress) {
            while (!journal.isEmpty()) {
                long left = deadline - System.nanoTime();
                if (left <= 0) {
                    return false;
                }
                TimeUnit.NANOSECONDS.timedWait(progress, Math.min(left, IDLE_POLL.toNanos()));
            }
        }
        return true;
    }

    private void handled(int n) {
        synchronized (progress) {
            handled += n;
            progress.notifyAll();
        }
    }

    private void run() {
        while (true) {
            try {
                if (closing && queue.isEmpty()) {
                    return;
                }
                if (!journal.isEmpty() || down) {
                    journalQueued();
                } else {
                    List<Point> batch = drain();
                    if (!batch.isEmpty()) {
                        direct(batch);
                        handled(batch.size());
                    }
                }
                if (!journal.isEmpty() && ready() && !closing) {
                    replayStep();
                }
            } catch (InterruptedException e) {
                if (closing) {
                    return;
                }
            } catch (IOException | RuntimeException e) {
                // The writer must outlive any one bad batch; what was lost is logged and counted.
                LOG.log(System.Logger.Level.ERROR, "store writer (" + backend.name() + "): " + e, e);
            }
        }
    }

    /**
     * Behind the journal, or while the store is down: moves a batch of queued points to the journal,
     * behind what is there, waiting for points at most until the next attempt on the store is due. The
     * wait holds the queue-to-journal lock, which the spooler needs only when the queue is half full,
     * and then the wait is over at once.
     */
    private void journalQueued() throws InterruptedException {
        Duration timeout = Duration.ZERO;
        if (!ready()) {
            Duration untilRetry = Duration.between(clock.instant(), nextAttempt);
            timeout = untilRetry.compareTo(IDLE_POLL) < 0 ? untilRetry : IDLE_POLL;
        } else if (journal.isEmpty()) {
            timeout = IDLE_POLL; // down, due for an attempt, with nothing to replay: wait for a point to try with
        }
        synchronized (queueToJournal) {
            Point first = timeout.isZero() || timeout.isNegative() ? queue.poll()
                    : queue.poll(timeout.toNanos(), TimeUnit.NANOSECONDS);
            if (first != null) {
                queueToJournal(first);
            }
        }
    }

    /** Takes the next batch for a direct write, waiting up to {@link #IDLE_POLL} for its first point. */
    private List<Point> drain() throws InterruptedException {
        List<Point> batch = new ArrayList<>(Math.min(settings.batchSize(), 4096));
        Point first = queue.poll(IDLE_POLL.toNanos(), TimeUnit.NANOSECONDS);
        if (first != null) {
            batch.add(first);
            queue.drainTo(batch, settings.batchSize() - 1);
            gather(batch);
        }
        return batch;
    }

    /**
     * Holds a batch that is not full for more points, up to {@link SpoolSettings#linger} from now,
     * until it is full or no point has come for {@link SpoolSettings#lingerGap}: one write after a
     * burst of results instead of many small ones during it. Not while closing (looked at every
     * {@link #IDLE_POLL}), nor for the journal's batches, which are full or the last of a backlog.
     */
    private void gather(List<Point> batch) {
        long last = System.nanoTime();
        long deadline = last + settings.linger().toNanos();
        long gap = settings.lingerGap().toNanos();
        try {
            while (batch.size() < settings.batchSize() && !closing) {
                long left = Math.min(deadline, last + gap) - System.nanoTime();
                if (left <= 0) {
                    return;
                }
                Point next = queue.poll(Math.min(left, IDLE_POLL.toNanos()), TimeUnit.NANOSECONDS);
                if (next != null) {
                    batch.add(next);
                    queue.drainTo(batch, settings.batchSize() - batch.size());
                    last = System.nanoTime();
                }
            }
        } catch (InterruptedException e) {
            // The batch in hand is written (or spooled) all the same; the writer stops at its next wait.
            Thread.currentThread().interrupt();
        }
    }

    private boolean ready() {
        return !down || !clock.instant().isBefore(nextAttempt);
    }

    private void direct(List<Point> batch) {
        try {
            writesCounter.increment();
            backend.write(batch);
        } catch (StoreUnavailableException e) {
            markDown(e);
            spool(batch);
        } catch (PointsRejectedException e) {
            reject(batch.size(), e);
        } catch (RuntimeException e) {
            // An adapter's unexpected failure must not lose the batch: keep it for a later attempt.
            markDown(new StoreUnavailableException("unexpected failure of the " + backend.name() + " store: " + e, e));
            spool(batch);
        }
    }

    private void replayStep() throws IOException {
        List<byte[]> records = journal.peek(settings.batchSize());
        List<Point> points = new ArrayList<>(records.size());
        for (byte[] r : records) {
            try {
                points.add(PointCodec.decode(r));
            } catch (IllegalArgumentException e) {
                reject(1, e);
            }
        }
        try {
            writesCounter.increment();
            backend.write(points);
        } catch (StoreUnavailableException e) {
            markDown(e);
            return;
        } catch (PointsRejectedException e) {
            reject(points.size(), e);
        } catch (RuntimeException e) {
            markDown(new StoreUnavailableException("unexpected failure of the " + backend.name() + " store: " + e, e));
            return;
        }
        journal.acknowledge();
        if (down) {
            down = false;
            wait = settings.retryMin();
        }
        if (journal.isEmpty()) {
            LOG.log(System.Logger.Level.INFO, "store " + backend.name() + ": journal replayed");
            listener.storeRecovered(clock.instant());
        }
        synchronized (progress) {
            progress.notifyAll();
        }
    }

    private void markDown(StoreUnavailableException e) {
        if (!down) {
            LOG.log(System.Logger.Level.WARNING, "store " + backend.name() + " unavailable, spooling: " + e.getMessage());
            listener.storeUnavailable(e.getMessage(), clock.instant());
            wait = settings.retryMin();
        } else {
            Duration doubled = wait.multipliedBy(2);
            wait = doubled.compareTo(settings.retryMax()) > 0 ? settings.retryMax() : doubled;
        }
        down = true;
        nextAttempt = clock.instant().plus(wait);
    }

    private void reject(long n, Exception e) {
        rejectedCounter.increment(n);
        LOG.log(System.Logger.Level.ERROR, "store " + backend.name() + " refused " + n + " points: " + e.getMessage());
        listener.pointsRejected(n, e.getMessage(), clock.instant());
    }

    private void spool(List<Point> points) {
        List<byte[]> records = new ArrayList<>(points.size());
        for (Point p : points) {
            records.add(PointCodec.encode(p));
        }
        long dropped;
        try {
            dropped = journal.append(records);
        } catch (IOException e) {
            LOG.log(System.Logger.Level.ERROR, "journal " + settings.spoolDir() + " cannot take " + points.size()
                    + " points, they are lost: " + e, e);
            dropped = points.size();
        }
        if (dropped > 0) {
            long total;
            synchronized (progress) {
                totalDropped += dropped;
                total = totalDropped;
            }
            droppedCounter.increment(dropped);
            LOG.log(System.Logger.Level.WARNING, "journal full: dropped the oldest " + dropped + " points");
            listener.spoolDropped(dropped, total, clock.instant());
        }
    }

    private void sync() {
        try {
            journal.sync();
        } catch (IOException e) {
            LOG.log(System.Logger.Level.ERROR, "journal " + settings.spoolDir() + " cannot be synced: " + e, e);
        }
    }

    @Override
    public List<Point> points(Measurement measurement, String site, String unit, Instant from, Instant to) {
        return backend.points(measurement, site, unit, from, to);
    }

    @Override
    public Map<String, List<Bucket>> series(SeriesRef series, Instant from, Instant to, Duration width) {
        if (!to.isAfter(from) || width.isNegative() || width.isZero()) {
            throw new IllegalArgumentException("series range " + from + " to " + to + " in buckets of " + width
                    + ": expected from < to and a positive width");
        }
        return backend.buckets(series, from, to, width);
    }

    @Override
    public ShiftSummary shiftSummary(String site, String unit, Shift shift) {
        return ShiftSummaries.summarise(backend, clock, queries, site, unit, shift);
    }

    @Override
    public List<SuspectSensor> suspects(String site, String unit, Instant from, Instant to) {
        return backend.suspects(site, unit, from, to);
    }

    @Override
    public List<StoredAlarmEvent> alarmHistory(String site, String unit, Instant from, Instant to) {
        return backend.alarmEvents(site, unit, from, to);
    }

    @Override
    public void close() {
        if (closing) {
            return;
        }
        closing = true;
        LockSupport.unpark(spooler);
        try {
            spooler.join(Duration.ofSeconds(30).toMillis());
            writer.join(Duration.ofSeconds(30).toMillis());
            if (writer.isAlive()) {
                writer.interrupt();
                writer.join();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        // What the writer could not hand over goes to the journal for the next start.
        List<Point> rest = new ArrayList<>();
        queue.drainTo(rest);
        if (!rest.isEmpty()) {
            spool(rest);
            handled(rest.size());
        }
        syncer.shutdownNow();
        queries.shutdownNow();
        try {
            journal.close();
        } catch (IOException e) {
            throw new UncheckedIOException("closing the journal " + settings.spoolDir(), e);
        } finally {
            backend.close();
        }
    }
}
