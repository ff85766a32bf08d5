package org.steamtally.dashboard.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.dashboard.fixture.TestDashboard.await;

import io.vertx.core.buffer.Buffer;
import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.client.HttpResponse;
import io.vertx.ext.web.client.WebClient;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.util.List;
import java.util.function.UnaryOperator;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.dashboard.fixture.FernholmTestPlant;
import org.steamtally.dashboard.fixture.StoreHistory;
import org.steamtally.dashboard.fixture.TestDashboard;
import org.steamtally.dashboard.store.ShiftCalendar;

/**
 * Trends, shift summaries and alarm history against a running server over a real embedded store,
 * filled with one record a minute across the night in which Europe/Berlin leaves summer time
 * (2026-10-25, clocks back from 03:00 CEST to 02:00 CET, i.e. at 01:00 UTC: EU rule, Directive
 * 2000/84/EC, last Sunday of October).
 */
class HistoryApiTest {

    static final Instant FROM = Instant.parse("2026-10-24T10:00:00Z");
    static final Instant TO = Instant.parse("2026-10-25T07:00:00Z");
    static final Instant SUSPECT = Instant.parse("2026-10-24T21:00:00Z");
    /** The store's clock: after the data, so no shift of interest is running. */
    static final Clock STORE_CLOCK = Clock.fixed(Instant.parse("2026-10-26T00:00:00Z"), ZoneOffset.UTC);

    @TempDir
    static Path dir;

    static StoreHistory history;
    static TestDashboard dash;
    static WebClient client;

    @BeforeAll
    static void start() throws Exception {
        FernholmTestPlant plant = new FernholmTestPlant();
        history = new StoreHistory(dir, STORE_CLOCK).fill(plant, FROM, TO, SUSPECT);
        ShiftCalendar shifts = ShiftCalendar.threeShifts(ZoneId.of("Europe/Berlin"));
        dash = new TestDashboard(UnaryOperator.identity(), s -> s.withStore(history.store, shifts));
        client = WebClient.create(dash.vertx);
    }

    @AfterAll
    static void stop() {
        client.close();
        dash.close();
        history.close();
    }

    private static HttpResponse<Buffer> get(String path) {
        return await(client.get(dash.port, "127.0.0.1", path).send());
    }

    private static JsonObject ok(String path) {
        HttpResponse<Buffer> r = get(path);
        assertEquals(200, r.statusCode(), r.bodyAsString());
        assertTrue(r.getHeader("Content-Type").startsWith("application/json"), r.getHeader("Content-Type"));
        assertFalse(r.bodyAsString().contains("NaN"), "no NaN in " + r.bodyAsString());
        return r.bodyAsJsonObject();
    }

    private static void badRequest(String path, String... messageParts) {
        HttpResponse<Buffer> r = get(path);
        assertEquals(400, r.statusCode(), r.bodyAsString());
        String message = r.bodyAsJsonObject().getString("message");
        for (String part : messageParts) {
            assertTrue(message.contains(part), message);
        }
    }

    /** The mean, smallest and largest thermal efficiency of the records in [from, to), by hand. */
    private static double[] efficiency(Instant from, Instant to) {
        double sum = 0;
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        int n = 0;
        for (UnitResult r : history.results) {
            if (!r.timestamp().isBefore(from) && r.timestamp().isBefore(to)) {
                double e = r.cycle().thermalEfficiency().getAsDouble();
                sum += e;
                min = Math.min(min, e);
                max = Math.max(max, e);
                n++;
            }
        }
        return new double[] {sum / n, min, max, n};
    }

    @Test
    void trendBucketsGiveMeanMinMaxAndCountOfTheRecordsInEachBucket() {
        JsonObject body = ok("/api/v1/units/unit3/trends?series=thermal_efficiency,net_work_W,heat_rate_kJ_per_kWh"
                + "&from=2026-10-24T20:00:00Z&to=2026-10-24T21:00:00Z&bucket=PT10M");
        assertEquals("PT10M", body.getString("bucket"));
        JsonArray buckets = body.getJsonObject("series").getJsonObject("thermal_efficiency").getJsonArray("buckets");
        assertEquals(6, buckets.size());
        for (int i = 0; i < 6; i++) {
            JsonObject b = buckets.getJsonObject(i);
            Instant start = Instant.parse("2026-10-24T20:00:00Z").plusSeconds(600L * i);
            assertEquals(start.toString(), b.getString("t"));
            double[] hand = efficiency(start, start.plusSeconds(600));
            assertEquals(10, b.getLong("count"));
            assertEquals(hand[0], b.getDouble("mean"), 1e-12);
            assertEquals(hand[1], b.getDouble("min"), 0.0);
            assertEquals(hand[2], b.getDouble("max"), 0.0);
        }
        assertEquals("W", body.getJsonObject("series").getJsonObject("net_work_W").getString("unit"));
        assertEquals(6, body.getJsonObject("series").getJsonObject("heat_rate_kJ_per_kWh").getJsonArray("buckets")
                .size());
    }

    @Test
    void theClosureResidualComesWithItsSigmaAndTheBandFactor() {
        JsonObject c = ok("/api/v1/units/unit3/trends?series=closure_residual_W"
                + "&from=2026-10-24T20:00:00Z&to=2026-10-24T22:00:00Z&bucket=PT30M")
                .getJsonObject("series").getJsonObject("closure_residual_W");
        assertEquals("cycle", c.getString("closure"));
        assertEquals(2.0, c.getDouble("k"), 0.0);
        JsonArray b = c.getJsonArray("buckets");
        assertEquals(4, b.size());
        double sigma = history.results.get(0).closure().stream().filter(k -> k.id().equals("cycle")).findFirst()
                .orElseThrow().sigmaW();
        assertTrue(b.getJsonObject(0).getDouble("sigma_mean") > 0.5 * sigma, b.encode());
    }

    @Test
    void reconciledMinusMeasuredIsGivenForTheSensorsFlaggedSuspect() {
        JsonArray sensors = ok("/api/v1/units/unit3/trends?series=reconciled_minus_measured"
                + "&from=2026-10-24T20:00:00Z&to=2026-10-24T22:00:00Z&bucket=PT10M")
                .getJsonObject("series").getJsonObject("reconciled_minus_measured").getJsonArray("sensors");
        JsonObject first = sensors.getJsonObject(0);
        assertEquals(FernholmTestPlant.SCRIPT_TAG, first.getString("sensor"));
        assertEquals(40, first.getLong("suspect_count"));
        assertEquals("K", first.getString("unit"));
        // From 21:10 on the thermometer reads 1.4 K above 293.0 and reconciles to 293.05 (fixture).
        JsonObject late = first.getJsonArray("buckets").stream().map(JsonObject.class::cast)
                .filter(o -> o.getString("t").equals("2026-10-24T21:20:00Z")).findFirst().orElseThrow();
        assertEquals(293.05 - 294.4, late.getDouble("mean"), 1e-9);
        assertNull(late.getValue("min"), "the extremes of a difference of means are not known");
    }

    @Test
    void withoutABucketTheTrendChoosesOneThatKeepsTheCountModerate() {
        JsonObject body = ok("/api/v1/units/unit3/trends?series=net_work_W&from=2026-10-24T10:00:00Z"
                + "&to=2026-10-25T10:00:00Z");
        assertEquals("PT2M", body.getString("bucket"), "24 h in at most 720 buckets");
    }

    @Test
    void badTrendParametersAreRefusedNamingTheParameterAndValue() {
        String range = "&from=2026-10-24T20:00:00Z&to=2026-10-25T20:00:00Z";
        badRequest("/api/v1/units/unit3/trends?series=net_work_W,efficiency" + range, "'series'", "'efficiency'");
        badRequest("/api/v1/units/unit3/trends?series=net_work_W&bucket=10min" + range, "'bucket'", "'10min'");
        badRequest("/api/v1/units/unit3/trends?series=net_work_W&bucket=PT0S" + range, "'bucket'", "PT0S");
        badRequest("/api/v1/units/unit3/trends?series=net_work_W&bucket=PT1S" + range, "'bucket'", "PT1S",
                "86400 buckets", "at most 5000", "PT18S");
        badRequest("/api/v1/units/unit3/trends?series=net_work_W&from=2026-10-25T20:00:00Z&to=2026-10-24T20:00:00Z",
                "'from'", "2026-10-25T20:00:00Z");
        badRequest("/api/v1/units/unit3/trends?series=net_work_W&from=2026-10-24&to=2026-10-25T20:00:00Z",
                "'from'", "'2026-10-24'");
        assertEquals(404, get("/api/v1/units/unit9/trends?series=net_work_W" + range).statusCode());
    }

    @Test
    void shiftSummariesFollowTheWallClockAcrossTheEndOfSummerTime() {
        JsonObject body = ok("/api/v1/units/unit3/shifts?from=2026-10-24T12:00:00Z&to=2026-10-25T05:00:00Z");
        assertEquals("Europe/Berlin", body.getString("zone"));
        JsonArray shifts = body.getJsonArray("shifts");
        assertEquals(2, shifts.size(), shifts.encode());
        JsonObject late = shifts.getJsonObject(0);
        JsonObject night = shifts.getJsonObject(1);
        assertEquals("late", late.getString("shift"));
        assertEquals(8 * 3600.0, late.getDouble("length_s"), 0.0);
        assertEquals("night", night.getString("shift"));
        assertEquals("2026-10-24", night.getString("date"));
        assertEquals("2026-10-24T20:00:00Z", night.getString("start"), "22:00 CEST");
        assertEquals("2026-10-25T05:00:00Z", night.getString("end"), "06:00 CET");
        assertEquals(9 * 3600.0, night.getDouble("length_s"), 0.0, "the night the clocks go back lasts 9 h");
        assertEquals(9 * 3600.0, night.getDouble("covered_s"), 0.0);
        // Energy by hand: one record a minute, each standing for its minute; 1 MWh = 3.6e9 J.
        double joules = 0;
        for (UnitResult r : history.results) {
            if (!r.timestamp().isBefore(Instant.parse(night.getString("start")))
                    && r.timestamp().isBefore(Instant.parse(night.getString("end")))) {
                joules += r.cycle().heatAddedW().getAsDouble() * 60.0;
            }
        }
        assertEquals(joules / 3.6e9, night.getDouble("energy_in_MWh"), 1e-9 * joules / 3.6e9);
        double[] eta = efficiency(Instant.parse(night.getString("start")), Instant.parse(night.getString("end")));
        assertEquals(eta[0], night.getDouble("mean_thermal_efficiency"), 1e-12);
        assertEquals(FernholmTestPlant.SCRIPT_TAG, night.getJsonArray("top_suspects").getJsonObject(0)
                .getString("sensor"));
        assertTrue(night.getDouble("alarms_active_s") > 0, night.encode());
    }

    @Test
    void shiftsThatHaveNotStartedByTheStoresClockAreLeftOutAndTheRunningOneIsMarked() {
        JsonArray shifts = ok("/api/v1/units/unit3/shifts?from=2026-10-25T20:00:00Z&to=2026-10-26T12:00:00Z")
                .getJsonArray("shifts");
        assertEquals(1, shifts.size(), shifts.encode());
        JsonObject night = shifts.getJsonObject(0);
        assertEquals("2026-10-25T21:00:00Z", night.getString("start"), "22:00 CET");
        assertTrue(night.getBoolean("running"));
        assertEquals(STORE_CLOCK.instant().toString(), night.getString("until"));
        assertNull(night.getValue("mean_thermal_efficiency"), "no data, no efficiency");
    }

    @Test
    void shiftSummariesDownloadAsCsvWithAFileName() {
        HttpResponse<Buffer> r = get("/api/v1/units/unit3/shifts?from=2026-10-24T12:00:00Z&to=2026-10-25T05:00:00Z"
                + "&format=csv");
        assertEquals(200, r.statusCode(), r.bodyAsString());
        assertEquals("text/csv; charset=utf-8", r.getHeader("Content-Type"));
        assertEquals("attachment; filename=\"steamtally-fernholm-unit3-shifts-20261024T120000Z-20261025T050000Z.csv\"",
                r.getHeader("Content-Disposition"));
        List<String> lines = List.of(r.bodyAsString().split("\r\n"));
        assertEquals(3, lines.size(), r.bodyAsString());
        assertTrue(lines.get(0).startsWith("date,shift,start_utc,end_utc,start_local,end_local,length_h,"), lines.get(0));
        String night = lines.get(2);
        assertTrue(night.startsWith("2026-10-24,night,2026-10-24T20:00:00Z,2026-10-25T05:00:00Z,"
                + "2026-10-24T22:00:00+02:00,2026-10-25T06:00:00+01:00,9,"), night);
        assertTrue(night.endsWith("," + FernholmTestPlant.SCRIPT_TAG + " (40)"), night);
    }

    @Test
    void tooManyShiftsAreRefusedNamingTheLimit() {
        badRequest("/api/v1/units/unit3/shifts?from=2026-09-01T00:00:00Z&to=2026-10-25T00:00:00Z",
                "more than 100 shifts");
        badRequest("/api/v1/units/unit3/shifts?from=2026-10-24T00:00:00Z&to=2026-10-25T00:00:00Z&format=xlsx",
                "'format'", "'xlsx'");
    }

    @Test
    void alarmHistoryListsTransitionsAndTheOperatorsActionsWithTheirUser() {
        JsonObject body = ok("/api/v1/units/unit3/alarms/history?from=2026-10-24T20:00:00Z&to=2026-10-25T00:00:00Z");
        JsonArray events = body.getJsonArray("events");
        assertEquals(4, events.size(), events.encode());
        assertFalse(body.getBoolean("truncated"));
        assertEquals("transition", events.getJsonObject(0).getString("kind"));
        assertEquals(2.9, events.getJsonObject(0).getDouble("value"), 0.0);
        assertNull(events.getJsonObject(0).getString("user"));
        JsonObject ack = events.getJsonObject(1);
        assertEquals("acknowledge", ack.getString("kind"));
        assertEquals(TestDashboard.OPERATOR, ack.getString("user"));
        JsonObject shelve = events.getJsonObject(2);
        assertEquals("shelve", shelve.getString("kind"));
        assertEquals(TestDashboard.OPERATOR, shelve.getString("user"));
        assertEquals("thermometer to be recalibrated, 4 h", shelve.getString("note"));
        assertEquals("normal", events.getJsonObject(3).getString("new_state"));
    }
}
