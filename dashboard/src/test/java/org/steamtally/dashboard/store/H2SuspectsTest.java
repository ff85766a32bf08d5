package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.dashboard.store.StoreFixtures.SITE;
import static org.steamtally.dashboard.store.StoreFixtures.T0;
import static org.steamtally.dashboard.store.StoreFixtures.UNIT;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The embedded store's suspect table ({@link H2Suspects}) and primary key order: the suspect list
 * is the one the raw reconciliation rows give, replays and the retention purge keep the table in
 * step, and a database made with the former schema (the {@code reconciliation_summary} index, the
 * id before {@code ts} in every key) opens and answers as before.
 */
class H2SuspectsTest {

    private static final Duration TEN_YEARS = Duration.ofDays(3650);

    /** The suspect query as it read the raw table before the suspect table existed. */
    private static final String RAW_SUSPECTS = "SELECT \"sensor\", COUNT(*), MAX(\"test_value\") FROM \"reconciliation\""
            + " WHERE \"site\" = ? AND \"unit\" = ? AND \"ts\" >= ? AND \"ts\" < ? AND \"suspect\" = TRUE"
            + " GROUP BY \"sensor\" ORDER BY 2 DESC, 3 DESC, 1";

    @TempDir
    Path dir;

    private H2Store open(Path data) {
        return H2Store.open(data, TEN_YEARS, Duration.ofHours(1), Clock.systemUTC());
    }

    private static Connection jdbc(Path data) throws SQLException {
        return DriverManager.getConnection("jdbc:h2:file:" + data.toAbsolutePath().resolve("steamtally")
                + ";DB_CLOSE_ON_EXIT=FALSE", "sa", "");
    }

    private static long count(Connection c, String sql) throws SQLException {
        try (Statement st = c.createStatement(); ResultSet rs = st.executeQuery(sql)) {
            rs.next();
            return rs.getLong(1);
        }
    }

    static List<SuspectSensor> rawSuspects(Connection c, Instant from, Instant to) throws SQLException {
        return suspects(c, RAW_SUSPECTS, from, to);
    }

    /** The suspects {@code sql} finds for the test's site and unit in [from, to). */
    private static List<SuspectSensor> suspects(Connection c, String sql, Instant from, Instant to)
            throws SQLException {
        try (var ps = c.prepareStatement(sql)) {
            ps.setString(1, SITE);
            ps.setString(2, UNIT);
            ps.setLong(3, from.toEpochMilli());
            ps.setLong(4, to.toEpochMilli());
            List<SuspectSensor> out = new ArrayList<>();
            try (ResultSet rs = ps.executeQuery()) {
                while (rs.next()) {
                    out.add(new SuspectSensor(rs.getString(1), rs.getLong(2), rs.getDouble(3)));
                }
            }
            return out;
        }
    }

    /** 200 reconciliations, seed 20261202, each sensor suspect with probability 0.2. */
    private static List<StoredReconciliation> seededReconciliations() {
        Random random = new Random(20261202L);
        List<StoredReconciliation> out = new ArrayList<>();
        for (int k = 0; k < 200; k++) {
            out.add(StoreFixtures.reconciliation(T0.plusSeconds(k), random.nextDouble() < 0.2,
                    2.0 + 3.0 * random.nextDouble(), random.nextDouble() < 0.2, 2.0 + 3.0 * random.nextDouble()));
        }
        return out;
    }

    private static void writeInBatches(H2Store h2, List<StoredReconciliation> all) throws Exception {
        for (int i = 0; i < all.size(); i += 30) {
            List<Point> batch = new ArrayList<>();
            for (StoredReconciliation r : all.subList(i, Math.min(all.size(), i + 30))) {
                batch.addAll(ResultPoints.of(r));
            }
            h2.write(batch);
        }
    }

    @Test
    void suspectListIsTheOneTheRawReconciliationRowsGiveAndHoldsOnlySuspectRows() throws Exception {
        Path data = dir.resolve("data");
        List<StoredReconciliation> all = seededReconciliations();
        long suspectRows = all.stream().flatMap(r -> r.sensors().stream()).filter(StoredReconciliation.Sensor::suspect)
                .count();
        try (H2Store h2 = open(data); Connection c = jdbc(data)) {
            writeInBatches(h2, all);
            assertEquals(suspectRows, count(c, "SELECT COUNT(*) FROM \"reconciliation_suspect\""),
                    "one row per suspect sensor point, seed 20261202");
            for (Instant[] range : List.of(new Instant[] {T0, T0.plusSeconds(200)},
                    new Instant[] {T0.plusSeconds(37), T0.plusSeconds(121)}, new Instant[] {T0, T0.plusSeconds(1)})) {
                assertEquals(rawSuspects(c, range[0], range[1]), h2.suspects(SITE, UNIT, range[0], range[1]),
                        "range " + range[0] + " to " + range[1] + ", seed 20261202");
            }
            assertFalse(H2Suspects.indexExists(c, H2Suspects.OLD_INDEX), "a new database has no index on every row");
        }
    }

    @Test
    void aReplayThatClearsTheSuspectFlagTakesTheSensorOffTheListAndARepeatAddsNothing() throws Exception {
        try (H2Store h2 = open(dir.resolve("data"))) {
            h2.write(ResultPoints.of(StoreFixtures.reconciliation(T0, true, 4.0, false, 0.5)));
            assertEquals(List.of(new SuspectSensor("FT-101", 1, 4.0)), h2.suspects(SITE, UNIT, T0, T0.plusSeconds(1)));
            // The same points with other flags: a stored point fails the INSERTs, the batch is merged.
            h2.write(ResultPoints.of(StoreFixtures.reconciliation(T0, false, 0.4, true, 3.9)));
            assertEquals(List.of(new SuspectSensor("TT-202", 1, 3.9)), h2.suspects(SITE, UNIT, T0, T0.plusSeconds(1)));
            h2.write(ResultPoints.of(StoreFixtures.reconciliation(T0, false, 0.4, true, 3.9)));
            assertEquals(List.of(new SuspectSensor("TT-202", 1, 3.9)), h2.suspects(SITE, UNIT, T0, T0.plusSeconds(1)),
                    "a replayed batch replaces, never duplicates");
        }
    }

    @Test
    void thePurgeDeletesExpiredSuspectRowsWithTheRawRows() throws Exception {
        H2StoreContractTest.MovableClock clock = new H2StoreContractTest.MovableClock(T0);
        Path data = dir.resolve("data");
        try (H2Store h2 = H2Store.open(data, Duration.ofDays(2), Duration.ofHours(1), clock);
                Connection c = jdbc(data)) {
            h2.write(ResultPoints.of(StoreFixtures.reconciliation(T0, true, 4.0, false, 0.5)));
            h2.write(ResultPoints.of(StoreFixtures.reconciliation(T0.plus(Duration.ofDays(3)), false, 0.5, true, 3.0)));
            clock.set(T0.plus(Duration.ofDays(3)));
            h2.purgeExpired();
            assertEquals(1, count(c, "SELECT COUNT(*) FROM \"reconciliation_suspect\""), "day 0's row is gone");
            assertEquals(List.of(new SuspectSensor("TT-202", 1, 3.0)),
                    h2.suspects(SITE, UNIT, T0, T0.plus(Duration.ofDays(4))));
        }
    }

    @Test
    void aDatabaseWithTheFormerSchemaOpensAndAnswersAsBeforeAndKeepsTakingWrites() throws Exception {
        Path data = dir.resolve("data");
        List<StoredReconciliation> all = seededReconciliations();
        List<SuspectSensor> suspects;
        List<Point> states;
        try (H2Store h2 = open(data)) {
            writeInBatches(h2, all);
            h2.write(ResultPoints.of(StoreFixtures.record(T0, 1)));
            suspects = h2.suspects(SITE, UNIT, T0, T0.plusSeconds(200));
            states = h2.points(Measurement.STATES, SITE, UNIT, T0, T0.plusSeconds(1));
        }
        // Turn the database into what the former schema made: no suspect table, the covering index
        // led by suspect on every reconciliation row, the id before ts in the states and components keys.
        try (Connection c = jdbc(data); Statement st = c.createStatement()) {
            st.execute("DROP TABLE \"reconciliation_suspect\"");
            st.execute("CREATE INDEX \"reconciliation_summary\" ON \"reconciliation\" (\"site\", \"unit\", \"suspect\","
                    + " \"ts\", \"sensor\", \"test_value\")");
            st.execute("ALTER TABLE \"states\" DROP PRIMARY KEY");
            st.execute("ALTER TABLE \"states\" ADD PRIMARY KEY (\"site\", \"unit\", \"state\", \"ts\")");
            st.execute("ALTER TABLE \"components\" DROP PRIMARY KEY");
            st.execute("ALTER TABLE \"components\" ADD PRIMARY KEY (\"site\", \"unit\", \"component\", \"ts\")");
            st.execute("SHUTDOWN");
        }
        try (H2Store h2 = open(data)) {
            assertEquals(suspects, h2.suspects(SITE, UNIT, T0, T0.plusSeconds(200)), "the suspect table was filled");
            assertEquals(states, h2.points(Measurement.STATES, SITE, UNIT, T0, T0.plusSeconds(1)));
            // A replay into the former key order replaces; a new point is added.
            h2.write(ResultPoints.of(StoreFixtures.record(T0, 2)));
            h2.write(ResultPoints.of(StoreFixtures.record(T0.plusSeconds(1), 3)));
            assertEquals(ResultStoreContractTest.of(ResultPoints.of(StoreFixtures.record(T0, 2)), Measurement.STATES),
                    h2.points(Measurement.STATES, SITE, UNIT, T0, T0.plusSeconds(1)));
            assertEquals(2 * states.size(), h2.points(Measurement.STATES, SITE, UNIT, T0, T0.plusSeconds(2)).size());
            h2.write(ResultPoints.of(StoreFixtures.reconciliation(T0.plusSeconds(300), true, 9.5, false, 0.1)));
            List<SuspectSensor> after = h2.suspects(SITE, UNIT, T0, T0.plusSeconds(301));
            assertEquals("FT-101", after.stream().filter(s -> s.maxTestValue() == 9.5).findFirst().orElseThrow()
                    .sensorId(), "a new suspect is listed");
        }
        try (Connection c = jdbc(data)) {
            assertFalse(H2Suspects.indexExists(c, H2Suspects.OLD_INDEX), "the index on every row is dropped");
            assertEquals(rawSuspects(c, T0, T0.plusSeconds(301)),
                    suspectsOfTable(c, T0, T0.plusSeconds(301)));
            assertTrue(count(c, "SELECT COUNT(*) FROM \"reconciliation_suspect\"") > 0);
        }
    }

    private static List<SuspectSensor> suspectsOfTable(Connection c, Instant from, Instant to) throws SQLException {
        return suspects(c, H2Suspects.query(), from, to);
    }
}
