package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.dashboard.store.StoreFixtures.SITE;
import static org.steamtally.dashboard.store.StoreFixtures.T0;
import static org.steamtally.dashboard.store.StoreFixtures.UNIT;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A writer killed with SIGKILL in the middle of writing loses at most its last second of points and
 * leaves the journal and the embedded database in a state a clean restart opens and continues.
 */
class KilledWriterTest {

    /** The promise: what was handed over one second before the kill survives it. */
    private static final Duration LOSS_BOUND = Duration.ofSeconds(1);

    @TempDir
    Path dir;

    @Test
    void sigkillMidWriteLeavesJournalAndDatabaseIntactUpToTheLastSecond() throws Exception {
        Path h2 = dir.resolve("h2");
        Path h2Spool = dir.resolve("h2-spool");
        Path spool = dir.resolve("spool");
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Process child = new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"),
                KilledWriterChild.class.getName(), h2.toString(), h2Spool.toString(), spool.toString())
                .redirectError(ProcessBuilder.Redirect.INHERIT).start();
        List<long[]> seen = new ArrayList<>();
        long killAt;
        try (BufferedReader out = new BufferedReader(new InputStreamReader(child.getInputStream(),
                StandardCharsets.UTF_8))) {
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
            String line;
            while ((line = out.readLine()) != null) {
                seen.add(new long[] {System.nanoTime(), Long.parseLong(line.substring("written ".length()))});
                long running = seen.get(seen.size() - 1)[0] - seen.get(0)[0];
                if ((running > TimeUnit.SECONDS.toNanos(3) && seen.size() > 10) || System.nanoTime() > deadline) {
                    break;
                }
            }
            killAt = System.nanoTime();
            child.destroyForcibly();
            assertTrue(child.waitFor(30, TimeUnit.SECONDS), "child gone");
        }
        assertEquals(137, child.exitValue(), "killed by SIGKILL (128 + 9)");
        long safe = -1;
        for (long[] s : seen) {
            if (s[0] <= killAt - LOSS_BOUND.toNanos()) {
                safe = s[1];
            }
        }
        assertTrue(safe >= KilledWriterChild.BLOCK - 1, "the child wrote for more than a second: " + seen.size()
                + " blocks seen");

        // The embedded database opens and holds every record up to the safe one.
        try (H2Store store = H2Store.open(h2, Duration.ofDays(3650), Duration.ofHours(1), Clock.systemUTC())) {
            List<Point> cycle = store.points(Measurement.CYCLE, SITE, UNIT, T0, T0.plusSeconds(safe + 1));
            assertEquals(safe + 1, cycle.size(), "records 0.." + safe + " in the database");
            for (int k = 0; k <= safe; k++) {
                assertEquals(T0.plusSeconds(k).toEpochMilli(), cycle.get(k).timestampMs());
            }
            // The suspect table, written in the same transactions, agrees with the raw rows.
            Instant end = T0.plusSeconds(safe + 3600);
            List<SuspectSensor> suspects = store.suspects(SITE, UNIT, T0, end);
            try (Connection c = DriverManager.getConnection("jdbc:h2:file:"
                    + h2.toAbsolutePath().resolve("steamtally") + ";DB_CLOSE_ON_EXIT=FALSE", "sa", "")) {
                assertEquals(H2SuspectsTest.rawSuspects(c, T0, end), suspects);
            }
            assertTrue(suspects.stream().mapToLong(SuspectSensor::suspectCount).sum() > safe / 3,
                    "suspects of records 0.." + safe + " listed: " + suspects);
            store.write(ResultPoints.of(StoreFixtures.record(T0.minusSeconds(1), 0)));
            assertEquals(1, store.points(Measurement.CYCLE, SITE, UNIT, T0.minusSeconds(1), T0).size(),
                    "the reopened database takes writes");
        }

        // The journal opens, skips any torn tail, and replays a gap-free prefix of what was written.
        SpooledStoreTest.FakeBackend backend = new SpooledStoreTest.FakeBackend();
        try (SpooledStore store = SpooledStore.open(backend, SpoolSettings.forNominalRate(spool, 100, 300),
                new SimpleMeterRegistry(), StoreListener.NONE, Clock.systemUTC())) {
            assertTrue(store.awaitDrained(Duration.ofSeconds(60)));
        }
        List<Point> replayed = new ArrayList<>(backend.written);
        int perRecord = ResultPoints.of(StoreFixtures.record(T0, 0)).size();
        assertTrue(replayed.size() >= (safe + 1) * perRecord, "journal holds records 0.." + safe + ": "
                + replayed.size() + " points");
        List<Point> expected = new ArrayList<>();
        for (int k = 0; expected.size() < replayed.size(); k++) {
            expected.addAll(ResultPoints.of(StoreFixtures.record(T0.plusSeconds(k), k)));
        }
        assertEquals(expected.subList(0, replayed.size()), replayed, "in order, each once, nothing damaged");
    }
}
