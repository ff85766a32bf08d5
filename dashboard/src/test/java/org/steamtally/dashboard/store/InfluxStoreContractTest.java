package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.dashboard.store.StoreFixtures.SITE;
import static org.steamtally.dashboard.store.StoreFixtures.T0;
import static org.steamtally.dashboard.store.StoreFixtures.UNIT;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.UUID;
import java.util.concurrent.TimeUnit;
import org.influxdb.InfluxDB;
import org.influxdb.InfluxDBFactory;
import org.influxdb.dto.Query;
import org.junit.jupiter.api.Test;
import org.steamtally.dashboard.TestServices;

/**
 * The store contract against a real InfluxDB 1.x ({@value TestServices#INFLUX_URL_VARIABLE}, or a
 * Testcontainers container where Docker runs), and the outage: the server stopped and started again
 * in the middle of a run, through the control script in {@value #CTL_VARIABLE}.
 */
class InfluxStoreContractTest extends ResultStoreContractTest {

    /** Environment variable naming a script that takes start|stop for the test InfluxDB (.ci/run sets it). */
    static final String CTL_VARIABLE = "STEAMTALLY_TEST_INFLUX_CTL";

    private String url;
    private String database;

    @Override
    StoreBackend openBackend(Path dataDir) {
        url = TestServices.influxUrl();
        // A database of its own per test keeps runs on a shared server apart.
        database = "steamtally_store_" + UUID.randomUUID().toString().replace('-', '_');
        return InfluxStore.connect(InfluxSettings.of(url, database));
    }

    @Override
    void dropBackend() {
        if (database != null) {
            try (InfluxDB influx = InfluxDBFactory.connect(url)) {
                influx.query(new Query("DROP DATABASE \"" + database + "\"", null, true));
            }
        }
    }

    @Test
    void pointsWrittenWhileTheServerIsDownArriveExactlyOnceAfterItIsBack() throws Exception {
        String ctl = System.getenv(CTL_VARIABLE);
        if (ctl == null || ctl.isBlank()) {
            TestServices.skipOrFail("no way to stop and start the test InfluxDB: set " + CTL_VARIABLE
                    + " to a script taking start|stop, as .ci/run does");
        }
        int n = 0;
        for (; n < 100; n++) {
            store.writeResult(StoreFixtures.record(T0.plusSeconds(n), n));
        }
        assertTrue(store.flush(DRAIN));
        control(ctl, "stop");
        try {
            for (; n < 300; n++) {
                store.writeResult(StoreFixtures.record(T0.plusSeconds(n), n));
            }
            assertTrue(store.flush(DRAIN));
            assertTrue(store.spooledPoints() > 0, "points wait in the journal while the server is down");
        } finally {
            control(ctl, "start");
        }
        for (; n < 400; n++) {
            store.writeResult(StoreFixtures.record(T0.plusSeconds(n), n));
        }
        drain();
        for (Measurement m : List.of(Measurement.STATES, Measurement.COMPONENTS, Measurement.CYCLE,
                Measurement.CLOSURE)) {
            List<Point> stored = store.points(m, SITE, UNIT, T0, T0.plusSeconds(n));
            List<Point> expected = new ArrayList<>();
            for (int k = 0; k < n; k++) {
                expected.addAll(of(ResultPoints.of(StoreFixtures.record(T0.plusSeconds(k), k)), m));
            }
            assertEquals(of(expected, m), stored, m.measurementName() + ": every point once, as written");
        }
        // Counted on the server itself, independent of the adapter's query code.
        try (InfluxDB influx = InfluxDBFactory.connect(url)) {
            List<List<Object>> rows = influx.query(new Query("SELECT count(\"valid\") FROM \"states\" GROUP BY \"state\"",
                    database), TimeUnit.MILLISECONDS).getResults().get(0).getSeries().stream()
                    .map(s -> s.getValues().get(0)).toList();
            Set<Long> counts = new HashSet<>();
            rows.forEach(r -> counts.add(((Number) r.get(1)).longValue()));
            assertEquals(Set.of((long) n), counts, "points per state on the server");
        }
    }

    @Test
    void aNamedRetentionPolicyIsWrittenToAndReadFrom() throws Exception {
        try (InfluxDB influx = InfluxDBFactory.connect(url)) {
            influx.query(new Query("CREATE DATABASE \"" + database + "\"", null, true));
            influx.query(new Query("CREATE RETENTION POLICY \"one_year\" ON \"" + database
                    + "\" DURATION 52w REPLICATION 1", null, true));
        }
        InfluxSettings settings = new InfluxSettings(url, database, "one_year", "", "", false, Duration.ofSeconds(10));
        // Points within the policy's duration: a year back from now at most.
        java.time.Instant t = java.time.Instant.now().truncatedTo(java.time.temporal.ChronoUnit.MILLIS);
        try (InfluxStore named = InfluxStore.connect(settings)) {
            named.write(ResultPoints.of(StoreFixtures.record(t, 1)));
            assertEquals(of(ResultPoints.of(StoreFixtures.record(t, 1)), Measurement.CYCLE),
                    named.points(Measurement.CYCLE, SITE, UNIT, t, t.plusSeconds(1)));
        }
        assertEquals(List.of(), store.points(Measurement.CYCLE, SITE, UNIT, t, t.plusSeconds(1)),
                "not in the default policy");
    }

    private static void control(String ctl, String action) throws IOException, InterruptedException {
        Process p = new ProcessBuilder(ctl, action).redirectErrorStream(true).start();
        String out = new String(p.getInputStream().readAllBytes());
        assertTrue(p.waitFor(120, TimeUnit.SECONDS), ctl + " " + action + " finished");
        assertEquals(0, p.exitValue(), ctl + " " + action + ": " + out);
    }
}
