package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.steamtally.dashboard.store.StoreFixtures.SITE;
import static org.steamtally.dashboard.store.StoreFixtures.UNIT;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.Statement;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The embedded store's per-minute rollups give the same buckets and closure statistics as the raw
 * rows they summarise, whatever was written twice or purged. The reference is the same store read
 * without rollups (its raw path, which the contract tests check against hand derivations).
 */
class H2RollupTest {

    /** Minute-aligned, so that one-minute buckets from it are answered by the rollup. */
    private static final Instant MINUTE = Instant.parse("2026-11-30T06:00:00Z");
    private static final String[] CYCLE_FIELDS = H2Rollup.CYCLE_FIELDS.toArray(String[]::new);

    @TempDir
    Path dir;

    private static List<Point> records(int fromK, int toK, int valueOffset) {
        List<Point> out = new ArrayList<>();
        for (int k = fromK; k < toK; k++) {
            // 1 Hz, a quarter second past the second: minutes hold 60 records, the first at +0.25 s.
            out.addAll(ResultPoints.of(StoreFixtures.record(MINUTE.plusMillis(1000L * k + 250), k + valueOffset)));
        }
        return out;
    }

    /** Writes 6 minutes at 1 Hz in batches of 25 records, then replays 70 of them with duplicates and new values. */
    private static void writeWithReplay(H2Store h2) throws Exception {
        for (int k = 0; k < 360; k += 25) {
            h2.write(records(k, Math.min(k + 25, 360), 0));
        }
        // A replay after a crash: records 100..169 again (a point twice in the batch, and values that
        // differ from the stored ones, so the later write must win), plus new records 360..379.
        List<Point> replay = new ArrayList<>(records(100, 170, 1));
        replay.addAll(records(120, 125, 3));
        replay.addAll(records(360, 380, 0));
        h2.write(replay);
        // Cycle points in the minute just started, every other one with the heat added alone (the
        // first of them written alone): fields without samples must neither count nor disturb min and max.
        List<Point> partial = new ArrayList<>();
        for (int k = 380; k < 400; k++) {
            Instant ts = MINUTE.plusMillis(1000L * k + 250);
            if (k % 2 == 0) {
                Object[] values = new Object[Measurement.CYCLE.fields().size()];
                values[Measurement.CYCLE.fieldIndex("heat_added_W")] = 2.9e8 + k;
                partial.add(new Point(Measurement.CYCLE, SITE, UNIT, null, ts.toEpochMilli(), values));
            } else {
                partial.addAll(ResultPoints.of(StoreFixtures.cycleOnly(ts, 2.9e8 + k, 1.0e8 - k)));
            }
        }
        h2.write(partial.subList(0, 1));
        h2.write(partial.subList(1, partial.size()));
    }

    private static void assertRollupEqualsRaw(H2Store rollup, H2Store raw, Instant from, Instant to) {
        SeriesRef cycle = SeriesRef.cycle(SITE, UNIT, CYCLE_FIELDS);
        for (Duration width : List.of(Duration.ofMinutes(1), Duration.ofMinutes(2))) {
            Map<String, List<Bucket>> expected = raw.buckets(cycle, from, to, width);
            Map<String, List<Bucket>> actual = rollup.buckets(cycle, from, to, width);
            assertEquals(expected.keySet(), actual.keySet());
            for (String f : CYCLE_FIELDS) {
                List<Bucket> e = expected.get(f);
                List<Bucket> a = actual.get(f);
                assertFalse(e.isEmpty(), "data in " + from + " .. " + to);
                assertEquals(e.size(), a.size(), f + " buckets");
                for (int i = 0; i < e.size(); i++) {
                    assertEquals(e.get(i).start(), a.get(i).start(), f);
                    assertEquals(e.get(i).count(), a.get(i).count(), f + " count at " + e.get(i).start());
                    assertEquals(e.get(i).min(), a.get(i).min(), 0.0, f);
                    assertEquals(e.get(i).max(), a.get(i).max(), 0.0, f);
                    // Sums of the same doubles in another grouping: 1e-12 of the value.
                    assertEquals(e.get(i).mean(), a.get(i).mean(), 1e-12 * Math.abs(e.get(i).mean()), f);
                }
            }
        }
        // Closure statistics over minute-aligned and over ragged ranges (partial minutes at both ends).
        for (Instant[] r : List.of(new Instant[] {from, to}, new Instant[] {from.plusMillis(12_345), to.minusMillis(
                6_789)})) {
            List<ClosureStats> expected = raw.closureStats(SITE, UNIT, r[0], r[1]);
            List<ClosureStats> actual = rollup.closureStats(SITE, UNIT, r[0], r[1]);
            assertEquals(2, expected.size(), "both checks");
            assertEquals(expected.size(), actual.size());
            for (int i = 0; i < expected.size(); i++) {
                ClosureStats e = expected.get(i);
                ClosureStats a = actual.get(i);
                assertEquals(e.id(), a.id());
                assertEquals(e.count(), a.count(), e.id());
                assertEquals(e.countOutside(), a.countOutside(), e.id());
                assertEquals(e.minZ(), a.minZ(), 0.0, e.id());
                assertEquals(e.maxZ(), a.maxZ(), 0.0, e.id());
                // Residuals are of order 1e6 W: 1e-6 W is 1e-12 of them.
                assertEquals(e.meanResidualW(), a.meanResidualW(), 1e-6, e.id());
                assertEquals(e.meanZ(), a.meanZ(), 1e-12, e.id());
            }
        }
    }

    @Test
    void rollupEqualsTheRawAggregationAfterAReplayWithDuplicates() throws Exception {
        H2StoreContractTest.MovableClock clock = new H2StoreContractTest.MovableClock(MINUTE);
        Path data = dir.resolve("data");
        try (H2Store rollup = H2Store.open(data, Duration.ofDays(1), Duration.ofHours(1), clock, true);
                H2Store raw = H2Store.open(data, Duration.ofDays(1), Duration.ofHours(1), clock, false)) {
            writeWithReplay(rollup);
            assertEquals(400, raw.points(Measurement.CYCLE, SITE, UNIT, MINUTE, MINUTE.plusSeconds(3600)).size(),
                    "each record once");
            assertRollupEqualsRaw(rollup, raw, MINUTE, MINUTE.plusSeconds(400));
            assertRollupEqualsRaw(rollup, raw, MINUTE.plusSeconds(60), MINUTE.plusSeconds(300));
        }
    }

    @Test
    void rollupEqualsTheRawAggregationAfterARetentionPurgeInTheMiddleOfAMinute() throws Exception {
        H2StoreContractTest.MovableClock clock = new H2StoreContractTest.MovableClock(MINUTE);
        Path data = dir.resolve("data");
        try (H2Store rollup = H2Store.open(data, Duration.ofDays(1), Duration.ofHours(1), clock, true);
                H2Store raw = H2Store.open(data, Duration.ofDays(1), Duration.ofHours(1), clock, false)) {
            writeWithReplay(rollup);
            // Cut-off 2 min 30.5 s after the first minute: records 0..150 go, the third minute keeps 29.
            clock.set(MINUTE.plus(Duration.ofDays(1)).plusSeconds(150).plusMillis(500));
            assertEquals(151 * ResultPoints.of(StoreFixtures.record(MINUTE, 0)).size(), rollup.purgeExpired(),
                    "raw points purged; the rollup's rows are not counted");
            assertEquals(29, raw.buckets(SeriesRef.cycle(SITE, UNIT, CYCLE_FIELDS), MINUTE.plusSeconds(120),
                    MINUTE.plusSeconds(180), Duration.ofMinutes(1)).get("heat_added_W").get(0).count());
            assertRollupEqualsRaw(rollup, raw, MINUTE, MINUTE.plusSeconds(400));
        }
    }

    @Test
    void aDatabaseWrittenBeforeRollupsExistedGetsThemFilledAtOpening() throws Exception {
        H2StoreContractTest.MovableClock clock = new H2StoreContractTest.MovableClock(MINUTE);
        Path data = dir.resolve("data");
        try (H2Store h2 = H2Store.open(data, Duration.ofDays(1), Duration.ofHours(1), clock, true)) {
            writeWithReplay(h2);
        }
        String url = "jdbc:h2:file:" + data.toAbsolutePath().resolve("steamtally") + ";DB_CLOSE_ON_EXIT=FALSE";
        try (Connection c = DriverManager.getConnection(url, "sa", ""); Statement st = c.createStatement()) {
            st.execute("DROP TABLE \"" + H2Rollup.CYCLE_TABLE + "\"");
            st.execute("DROP TABLE \"" + H2Rollup.CLOSURE_TABLE + "\"");
        }
        try (H2Store rollup = H2Store.open(data, Duration.ofDays(1), Duration.ofHours(1), clock, true);
                H2Store raw = H2Store.open(data, Duration.ofDays(1), Duration.ofHours(1), clock, false)) {
            assertRollupEqualsRaw(rollup, raw, MINUTE, MINUTE.plusSeconds(400));
        }
    }
}
