package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.dashboard.store.StoreFixtures.T0;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashSet;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The writer in front of the adapters: spooling, replay, the bound on the journal and its meters. */
class SpooledStoreTest {

    @TempDir
    Path dir;

    /** A backend that records what it is given, and in how many writes, and fails while told to. */
    static class FakeBackend extends WriteOnlyBackend {
        final List<Point> written = Collections.synchronizedList(new ArrayList<>());
        final List<Integer> batches = Collections.synchronizedList(new ArrayList<>());
        volatile boolean down;

        @Override
        public String name() {
            return "fake";
        }

        @Override
        public void write(List<Point> points) throws StoreUnavailableException {
            if (down) {
                throw new StoreUnavailableException("fake store is down", null);
            }
            batches.add(points.size());
            written.addAll(points);
        }
    }

    static final class RecordingListener implements StoreListener {
        final AtomicLong dropped = new AtomicLong();
        final AtomicLong outages = new AtomicLong();
        final AtomicLong recoveries = new AtomicLong();

        @Override
        public void spoolDropped(long points, long totalDropped, Instant at) {
            dropped.set(totalDropped);
        }

        @Override
        public void storeUnavailable(String reason, Instant at) {
            outages.incrementAndGet();
        }

        @Override
        public void storeRecovered(Instant at) {
            recoveries.incrementAndGet();
        }
    }

    private SpoolSettings settings() {
        return SpoolSettings.forNominalRate(dir, 100, 300).withRetry(Duration.ofMillis(20), Duration.ofMillis(200));
    }

    private static List<Point> points(int from, int to) {
        List<Point> out = new ArrayList<>();
        for (int k = from; k < to; k++) {
            out.addAll(ResultPoints.of(StoreFixtures.record(T0.plusSeconds(k), k)));
        }
        return out;
    }

    @Test
    void pointsWrittenDuringAnOutageReachTheStoreInOrderOnceItIsBack() throws Exception {
        FakeBackend backend = new FakeBackend();
        RecordingListener listener = new RecordingListener();
        SimpleMeterRegistry meters = new SimpleMeterRegistry();
        try (SpooledStore store = SpooledStore.open(backend, settings(), meters, listener, Clock.systemUTC())) {
            for (int k = 0; k < 10; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
            assertTrue(store.flush(Duration.ofSeconds(30)));
            backend.down = true;
            for (int k = 10; k < 50; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
            assertTrue(store.flush(Duration.ofSeconds(30)));
            assertTrue(store.spooledPoints() > 0, "spooled while down");
            assertTrue(meters.get(SpooledStore.SPOOL_BYTES).gauge().value() > 0, "spool size metered");
            backend.down = false;
            assertTrue(store.awaitDrained(Duration.ofSeconds(30)));
            assertEquals(points(0, 50), backend.written, "every point once, in order");
            assertEquals(1, listener.outages.get());
            assertEquals(1, listener.recoveries.get());
            assertEquals(0.0, meters.get(SpooledStore.SPOOL_BYTES).gauge().value());
            assertEquals(0.0, meters.get(SpooledStore.QUEUE_DEPTH).gauge().value());
        }
    }

    @Test
    void whileAWriteHangsTheSpoolerMovesTheQueueToTheJournalAndNoPointIsLost() throws Exception {
        CountDownLatch hanging = new CountDownLatch(1);
        CountDownLatch release = new CountDownLatch(1);
        FakeBackend backend = new FakeBackend() {
            @Override
            public void write(List<Point> points) throws StoreUnavailableException {
                if (hanging.getCount() > 0) {
                    // the first write hangs, as one to a store that stopped answering does until it times out
                    hanging.countDown();
                    try {
                        release.await();
                    } catch (InterruptedException e) {
                        Thread.currentThread().interrupt();
                    }
                }
                super.write(points);
            }
        };
        int perRecord = ResultPoints.of(StoreFixtures.record(T0, 0)).size();
        SpoolSettings small = settings().withQueueCapacity(8 * perRecord).withBatchSize(perRecord);
        SimpleMeterRegistry meters = new SimpleMeterRegistry();
        try (SpooledStore store = SpooledStore.open(backend, small, meters, StoreListener.NONE, Clock.systemUTC())) {
            store.writeResult(StoreFixtures.record(T0, 0));
            assertTrue(hanging.await(10, TimeUnit.SECONDS), "the writer took the first record and hangs");
            for (int k = 1; k < 100; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
            // 99 records into a queue with room for 8, while the only write hangs: the spooler takes the
            // queue down to half full or less, into the journal
            long deadline = System.nanoTime() + Duration.ofSeconds(10).toNanos();
            while (meters.get(SpooledStore.QUEUE_DEPTH).gauge().value() > 4 * perRecord && System.nanoTime() < deadline) {
                Thread.sleep(10);
            }
            assertTrue(meters.get(SpooledStore.QUEUE_DEPTH).gauge().value() <= 4 * perRecord,
                    "queue relieved while the write hangs: " + meters.get(SpooledStore.QUEUE_DEPTH).gauge().value());
            assertTrue(store.spooledPoints() >= 99 * perRecord - 8 * perRecord, "journaled: " + store.spooledPoints());
            release.countDown();
            assertTrue(store.awaitDrained(Duration.ofSeconds(30)));
            // order is not promised across a hang (see SpooledStore): every point, each once
            List<Point> expected = points(0, 100);
            assertEquals(expected.size(), backend.written.size(), "no point lost or written twice");
            assertEquals(new HashSet<>(expected), new HashSet<>(backend.written));
        }
    }

    @Test
    void aLingeringBatchTakesThePointsOfABurstAndIsWrittenOnceWhenFull() throws Exception {
        FakeBackend backend = new FakeBackend();
        List<Point> burst = points(0, 10);
        // a gap and a linger far longer than the test: only a full batch can end the wait
        SpoolSettings lingering = settings().withBatchSize(burst.size())
                .withLinger(Duration.ofSeconds(10), Duration.ofSeconds(10));
        SimpleMeterRegistry meters = new SimpleMeterRegistry();
        try (SpooledStore store = SpooledStore.open(backend, lingering, meters, StoreListener.NONE,
                Clock.systemUTC())) {
            for (int k = 0; k < 10; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
            assertTrue(store.flush(Duration.ofSeconds(5)), "written as soon as the batch was full");
            assertEquals(List.of(burst.size()), backend.batches, "one write");
            assertEquals(burst, backend.written);
            assertEquals(1.0, meters.get(SpooledStore.WRITES).counter().count());
        }
    }

    @Test
    void aLingeringBatchIsWrittenWhenThePointsPauseWithoutWaitingOutTheLinger() throws Exception {
        FakeBackend backend = new FakeBackend();
        SpoolSettings lingering = settings().withBatchSize(100_000)
                .withLinger(Duration.ofSeconds(10), Duration.ofMillis(100));
        try (SpooledStore store = SpooledStore.open(backend, lingering, new SimpleMeterRegistry(), StoreListener.NONE,
                Clock.systemUTC())) {
            for (int k = 0; k < 10; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
            // far sooner than the 10 s linger: the 100 ms pause after the last point ended it
            assertTrue(store.flush(Duration.ofSeconds(5)));
            assertEquals(points(0, 10), backend.written);
        }
    }

    @Test
    void closingWhileABatchLingersWritesItAndLosesNoPoint() throws Exception {
        FakeBackend backend = new FakeBackend();
        SpoolSettings lingering = settings().withBatchSize(100_000)
                .withLinger(Duration.ofSeconds(10), Duration.ofSeconds(10));
        long start = System.nanoTime();
        try (SpooledStore store = SpooledStore.open(backend, lingering, new SimpleMeterRegistry(), StoreListener.NONE,
                Clock.systemUTC())) {
            for (int k = 0; k < 10; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
        }
        assertEquals(points(0, 10), backend.written, "the lingering batch was written at close");
        assertTrue(System.nanoTime() - start < Duration.ofSeconds(9).toNanos(), "close did not wait out the linger");
    }

    @Test
    void aLingerGapLongerThanTheLingerIsRefusedWithBothValues() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> settings().withLinger(Duration.ofMillis(100), Duration.ofSeconds(1)));
        assertTrue(e.getMessage().contains("PT1S") && e.getMessage().contains("PT0.1S"), e.getMessage());
    }

    @Test
    void pointsSpooledAtCloseAreReplayedByTheNextStart() throws Exception {
        FakeBackend backend = new FakeBackend();
        backend.down = true;
        try (SpooledStore store = SpooledStore.open(backend, settings(), new SimpleMeterRegistry(),
                StoreListener.NONE, Clock.systemUTC())) {
            for (int k = 0; k < 20; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
            assertTrue(store.flush(Duration.ofSeconds(30)));
        }
        FakeBackend next = new FakeBackend();
        try (SpooledStore store = SpooledStore.open(next, settings(), new SimpleMeterRegistry(), StoreListener.NONE,
                Clock.systemUTC())) {
            assertTrue(store.awaitDrained(Duration.ofSeconds(30)));
            assertEquals(points(0, 20), next.written);
        }
    }

    @Test
    void aFullSpoolDropsTheOldestPointsCountsThemAndTellsTheListener() throws Exception {
        FakeBackend backend = new FakeBackend();
        backend.down = true;
        RecordingListener listener = new RecordingListener();
        SimpleMeterRegistry meters = new SimpleMeterRegistry();
        int perRecord = ResultPoints.of(StoreFixtures.record(T0, 0)).size();
        long bytesPerRecord = 0;
        for (Point p : ResultPoints.of(StoreFixtures.record(T0, 0))) {
            bytesPerRecord += SpoolSettings.journalBytes(p);
        }
        // Room for about 40 records in four segments of about 10.
        SpoolSettings small = settings().withSpoolBytes(40 * bytesPerRecord, 10 * bytesPerRecord);
        try (SpooledStore store = SpooledStore.open(backend, small, meters, listener, Clock.systemUTC())) {
            for (int k = 0; k < 100; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
            assertTrue(store.flush(Duration.ofSeconds(30)));
            double dropped = meters.get(SpooledStore.SPOOL_DROPPED).counter().count();
            assertTrue(dropped >= 50 * perRecord, "at least the oldest half dropped: " + dropped);
            assertEquals((long) dropped, listener.dropped.get(), "the listener hears the same count");
            assertEquals(100 * perRecord - (long) dropped, store.spooledPoints(), "the rest is kept");
            assertTrue(meters.get(SpooledStore.SPOOL_BYTES).gauge().value() <= 40 * bytesPerRecord);
            backend.down = false;
            assertTrue(store.awaitDrained(Duration.ofSeconds(30)));
            List<Point> all = points(0, 100);
            assertEquals(all.subList((int) dropped, all.size()), backend.written, "the newest points arrive, in order");
        }
    }

    @Test
    void aTornRecordLeftByACrashIsSkippedAndTheRestReplayed() throws Exception {
        FakeBackend backend = new FakeBackend();
        backend.down = true;
        try (SpooledStore store = SpooledStore.open(backend, settings(), new SimpleMeterRegistry(),
                StoreListener.NONE, Clock.systemUTC())) {
            for (int k = 0; k < 5; k++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
            }
            assertTrue(store.flush(Duration.ofSeconds(30)));
        }
        Path segment;
        try (var files = java.nio.file.Files.list(dir)) {
            segment = files.sorted().reduce((a, b) -> b).orElseThrow();
        }
        // Half of a sixth record: a header promising 200 bytes and 50 of them.
        java.nio.file.Files.write(segment, java.nio.ByteBuffer.allocate(58).putInt(200).putInt(7).array(),
                java.nio.file.StandardOpenOption.APPEND);
        FakeBackend next = new FakeBackend();
        try (SpooledStore store = SpooledStore.open(next, settings(), new SimpleMeterRegistry(), StoreListener.NONE,
                Clock.systemUTC())) {
            assertEquals(58, store.recoveredTornBytes());
            assertTrue(store.awaitDrained(Duration.ofSeconds(30)));
            assertEquals(points(0, 5), next.written);
        }
    }
}
