package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.dashboard.store.StoreFixtures.SITE;
import static org.steamtally.dashboard.store.StoreFixtures.T0;
import static org.steamtally.dashboard.store.StoreFixtures.UNIT;

import io.micrometer.core.instrument.simple.SimpleMeterRegistry;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneId;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.cycle.UnitResult;

/**
 * The behaviour every adapter of the store port shares: what is written is read back field for
 * field, ranges are half-open, buckets are aligned to the start of the range, a point written twice
 * is stored once, and shift summaries and alarm history agree. One subclass per adapter.
 */
abstract class ResultStoreContractTest {

    /** Long enough for a loaded two-core machine to write and commit a few thousand points. */
    static final Duration DRAIN = Duration.ofSeconds(60);

    @TempDir
    Path dir;

    SpooledStore store;

    /** A fresh, empty backend. */
    abstract StoreBackend openBackend(Path dataDir);

    /** Removes what {@link #openBackend} created outside {@code dir}. */
    void dropBackend() {
    }

    @BeforeEach
    void open() throws Exception {
        StoreBackend backend = openBackend(dir.resolve("data"));
        store = SpooledStore.open(backend,
                SpoolSettings.forNominalRate(dir.resolve("spool"), 100, 300)
                        .withRetry(Duration.ofMillis(50), Duration.ofSeconds(1)),
                new SimpleMeterRegistry(), StoreListener.NONE, Clock.systemUTC());
    }

    @AfterEach
    void close() {
        if (store != null) {
            store.close();
        }
        dropBackend();
    }

    void drain() throws InterruptedException {
        assertTrue(store.awaitDrained(DRAIN), "store drained within " + DRAIN);
    }

    static List<Point> of(List<Point> points, Measurement m) {
        List<Point> out = new ArrayList<>();
        for (Point p : points) {
            if (p.measurement() == m && !p.isEmpty()) {
                out.add(p);
            }
        }
        out.sort(Comparator.comparing(Point::id).thenComparingLong(Point::timestampMs));
        return out;
    }

    @Test
    void everyFieldOfAResultRecordIsReadBackAsWritten() throws Exception {
        UnitResult r = StoreFixtures.record(T0, 3);
        store.writeResult(r);
        drain();
        List<Point> written = ResultPoints.of(r);
        for (Measurement m : List.of(Measurement.STATES, Measurement.COMPONENTS, Measurement.CYCLE,
                Measurement.CLOSURE)) {
            assertEquals(of(written, m), store.points(m, SITE, UNIT, T0, T0.plusSeconds(1)), m.measurementName());
        }
    }

    @Test
    void theReconciliationOfAResultRecordIsStoredWithItAndReadBack() throws Exception {
        UnitResult r = StoreFixtures.reconciledRecord(T0);
        store.writeResult(r);
        drain();
        StoredReconciliation expected = StoredReconciliation.of(r).orElseThrow();
        assertEquals(2, expected.sensors().size(), "the sensor without a test value is not kept");
        assertEquals(of(ResultPoints.of(expected), Measurement.RECONCILIATION),
                store.points(Measurement.RECONCILIATION, SITE, UNIT, T0, T0.plusMillis(1)));
        assertEquals(List.of(new SuspectSensor("FT-101", 1, 3.9)),
                store.backend().suspects(SITE, UNIT, T0, T0.plusMillis(1)));
    }

    @Test
    void theWindowChannelsVerdictIsStoredWithTheRecordAndReadBack() throws Exception {
        UnitResult r = StoreFixtures.windowRecord(T0);
        store.writeResult(r);
        drain();
        List<Point> back = store.points(Measurement.WINDOW_RECONCILIATION, SITE, UNIT, T0, T0.plusMillis(1));
        assertEquals(of(ResultPoints.of(r), Measurement.WINDOW_RECONCILIATION), back);
        Point p = back.get(0);
        assertEquals(Boolean.FALSE, p.value("passed"));
        // 61.2 / 11.07, the χ² over its quantile.
        assertEquals(61.2 / 11.07, (Double) p.value("chi2_ratio"), 1e-12);
        assertEquals("TT-311,FT-101", p.value("suspects"));
        assertEquals(50L, p.value("samples"));
    }

    @Test
    void reconciliationAlarmEventsAndReadingsAreReadBackAsWritten() throws Exception {
        StoredReconciliation rec = StoreFixtures.reconciliation(T0, true, 3.4, false, 0.2);
        StoredAlarmEvent shelve = StoreFixtures.alarm(T0, "closure_cycle", "shelve", "unacknowledged", "shelved",
                false);
        StoredReading reading = StoreFixtures.reading(T0, "PT-101", 1.65e7);
        store.writeReconciliation(rec);
        store.writeAlarmEvent(shelve);
        store.writeReading(reading);
        drain();
        Instant to = T0.plusMillis(1);
        assertEquals(of(ResultPoints.of(rec), Measurement.RECONCILIATION),
                store.points(Measurement.RECONCILIATION, SITE, UNIT, T0, to));
        assertEquals(List.of(ResultPoints.of(shelve)), store.points(Measurement.ALARMS, SITE, UNIT, T0, to));
        assertEquals(List.of(ResultPoints.of(reading)), store.points(Measurement.READINGS, SITE, UNIT, T0, to));
        assertEquals(List.of(shelve), store.alarmHistory(SITE, UNIT, T0, to));
    }

    @Test
    void tagValuesWithSpacesCommasEqualsSignsAndQuotesAreStoredAndFound() throws Exception {
        String site = "fern holm, 'north'";
        String unit = "unit=1 \\ a";
        UnitResult r = StoreFixtures.record(site, unit, T0, 5);
        store.writeResult(r);
        drain();
        assertEquals(of(ResultPoints.of(r), Measurement.COMPONENTS),
                store.points(Measurement.COMPONENTS, site, unit, T0, T0.plusSeconds(1)));
        assertEquals(1, store.series(SeriesRef.of(Measurement.COMPONENTS, site, unit, "feed pump, 2", "work_out_W"),
                T0, T0.plusSeconds(1), Duration.ofSeconds(1)).get("work_out_W").size());
    }

    @Test
    void rangesIncludeTheirStartAndExcludeTheirEnd() throws Exception {
        for (int k = 0; k < 10; k++) {
            store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
        }
        drain();
        List<Point> cycle = store.points(Measurement.CYCLE, SITE, UNIT, T0.plusSeconds(2), T0.plusSeconds(5));
        assertEquals(List.of(T0.plusSeconds(2).toEpochMilli(), T0.plusSeconds(3).toEpochMilli(),
                T0.plusSeconds(4).toEpochMilli()), cycle.stream().map(Point::timestampMs).toList());
        assertEquals(9, store.points(Measurement.STATES, SITE, UNIT, T0.plusSeconds(2), T0.plusSeconds(5)).size(),
                "three states at three instants");
        assertEquals(List.of(), store.points(Measurement.CYCLE, "elsewhere", UNIT, T0, T0.plusSeconds(10)),
                "another site's range is empty");
    }

    @Test
    void writingAPointAgainReplacesItInsteadOfAddingOne() throws Exception {
        store.writeResult(StoreFixtures.record(T0, 1));
        drain();
        // In a later batch, as a replay after a crash would send it.
        store.writeResult(StoreFixtures.record(T0, 2));
        drain();
        List<Point> states = store.points(Measurement.STATES, SITE, UNIT, T0, T0.plusSeconds(1));
        assertEquals(3, states.size(), "one point per state");
        assertEquals(of(ResultPoints.of(StoreFixtures.record(T0, 2)), Measurement.STATES), states, "the later write wins");
    }

    @Test
    void bucketsGiveMeanMinMaxAndCountAlignedToTheStartOfTheRange() throws Exception {
        for (int k = 0; k < 30; k++) {
            store.writeResult(StoreFixtures.record(T0.plusSeconds(k), k));
        }
        drain();
        // main_steam p_Pa = 16.5e6 + k at T0 + k s. Buckets of 10 s from T0 + 5 s: k = 5..14 and 15..24.
        Map<String, List<Bucket>> b = store.series(SeriesRef.of(Measurement.STATES, SITE, UNIT, "main_steam", "p_Pa",
                "m_kg_per_s"), T0.plusSeconds(5), T0.plusSeconds(25), Duration.ofSeconds(10));
        List<Bucket> p = b.get("p_Pa");
        assertEquals(2, p.size(), "buckets");
        assertEquals(T0.plusSeconds(5), p.get(0).start());
        assertEquals(T0.plusSeconds(15), p.get(1).start());
        // Hand derivation: the mean of 16.5e6 + k over k = 5..14 is 16.5e6 + 9.5.
        // 1e-6 Pa: summation order differs between stores; 1e-13 of the value.
        assertEquals(16.5e6 + 9.5, p.get(0).mean(), 1e-6);
        assertEquals(16.5e6 + 5, p.get(0).min(), 0.0);
        assertEquals(16.5e6 + 14, p.get(0).max(), 0.0);
        assertEquals(10, p.get(0).count());
        assertEquals(16.5e6 + 19.5, p.get(1).mean(), 1e-6);
        assertEquals(150.0 + 0.01 * 19.5, b.get("m_kg_per_s").get(1).mean(), 1e-12);
        // An empty field gives no buckets: the condensate's enthalpy is never known.
        assertEquals(List.of(), store.series(SeriesRef.of(Measurement.STATES, SITE, UNIT, "condensate",
                "h_J_per_kg"), T0, T0.plusSeconds(30), Duration.ofSeconds(10)).get("h_J_per_kg"));
    }

    /** FT-101's test values in the first records, where it is suspect. */
    private static final double[] FLOW_TESTS = {3.1, 4.2, 2.5};

    @Test
    void shiftSummaryGivesEnergyEfficiencyClosureAlarmTimeAndSuspects() throws Exception {
        Instant start = Instant.parse("2026-11-30T05:00:00Z");
        Shift shift = new Shift(LocalDate.of(2026, 11, 30), "test", start, start.plus(Duration.ofMinutes(10)));
        for (int k = 0; k < 60; k++) {
            Instant ts = start.plusSeconds(10L * k);
            store.writeResult(StoreFixtures.record(ts, k));
            double flowTest = k < FLOW_TESTS.length ? FLOW_TESTS[k] : 0.3;
            store.writeReconciliation(StoreFixtures.reconciliation(ts, k < 3, flowTest, k == 3, 5.0));
        }
        store.writeAlarmEvent(StoreFixtures.alarm(start.minus(Duration.ofMinutes(5)), "A", "transition", "normal",
                "unacknowledged", true));
        store.writeAlarmEvent(StoreFixtures.alarm(start.plus(Duration.ofMinutes(2)), "A", "transition",
                "unacknowledged", "returned_unacknowledged", false));
        store.writeAlarmEvent(StoreFixtures.alarm(start.plus(Duration.ofMinutes(1)), "B", "transition", "normal",
                "unacknowledged", true));
        store.writeAlarmEvent(StoreFixtures.alarm(start.plus(Duration.ofMinutes(2)), "B", "acknowledge",
                "unacknowledged", "acknowledged", true));
        store.writeAlarmEvent(StoreFixtures.alarm(start.plus(Duration.ofMinutes(4)), "B", "transition",
                "acknowledged", "normal", false));
        store.writeAlarmEvent(StoreFixtures.alarm(start.plus(Duration.ofMinutes(6)), "C", "shelve", "normal",
                "shelved", false));
        drain();

        ShiftSummary s = store.shiftSummary(SITE, UNIT, shift);
        // Hand derivation: 3.0e8 W for 600 s is 1.8e11 J = 50 MWh; 1.1e8 W for 600 s = 18.333... MWh.
        // 1e-9 MWh: sums of 10 one-minute terms in doubles.
        assertEquals(50.0, s.energyInMWh(), 1e-9);
        assertEquals(1.1e8 * 600 / 3.6e9, s.energyOutMWh(), 1e-9);
        // η_k = 0.36 + 0.0001·(k mod 6): its mean over whole periods is 0.36 + 0.0001·2.5.
        assertEquals(0.36025, s.meanEfficiency().getAsDouble(), 1e-12);
        assertEquals(0.36, s.worstEfficiency().getAsDouble(), 0.0);
        double heatRateSum = 0.0;
        for (int j = 0; j < 6; j++) {
            heatRateSum += 3600.0 / (0.36 + 0.0001 * j);
        }
        assertEquals(heatRateSum / 6, s.meanHeatRateKJPerKWh().getAsDouble(), 1e-9);
        assertEquals(10000.0, s.worstHeatRateKJPerKWh().getAsDouble(), 1e-9);
        assertEquals(Duration.ofMinutes(10), s.covered());
        assertEquals(shift.end(), s.until());

        // z_k = (k mod 6) − 2.5: two values of six (±2.5) lie outside ±2; mean 0.
        ClosureStats cycle = s.closures().stream().filter(c -> c.id().equals("cycle")).findFirst().orElseThrow();
        assertEquals(60, cycle.count());
        assertEquals(20, cycle.countOutside());
        assertEquals(0.0, cycle.meanZ(), 1e-12);
        assertEquals(2.5, cycle.maxAbsZ(), 0.0);
        assertEquals(2, s.closures().size(), "both checks");

        // A is active from before the shift to +2 min, B from +1 to +4 min, C is only shelved.
        assertEquals(Duration.ofMinutes(4), s.alarmsActive());
        assertEquals(List.of(new SuspectSensor("FT-101", 3, 4.2), new SuspectSensor("TT-202", 1, 5.0)),
                s.topSuspects());
        assertEquals(6, store.alarmHistory(SITE, UNIT, start.minus(Duration.ofHours(1)), shift.end()).size());
    }

    @Test
    void nightShiftsAcrossBothDaylightSavingChangesIntegrateSevenAndNineHours() throws Exception {
        ShiftCalendar calendar = ShiftCalendar.threeShifts(ZoneId.of("Europe/Berlin"));
        // Europe/Berlin: clocks go forward at 02:00 on 29 March 2026 and back at 03:00 on 25 October 2026
        // (EU rule: last Sunday of March and of October, 01:00 UTC).
        Shift spring = calendar.shiftContaining(Instant.parse("2026-03-29T01:30:00Z"));
        Shift autumn = calendar.shiftContaining(Instant.parse("2026-10-25T01:30:00Z"));
        for (Shift shift : List.of(spring, autumn)) {
            for (Instant t = shift.start(); t.isBefore(shift.end()); t = t.plusSeconds(60)) {
                store.writeResult(StoreFixtures.cycleOnly(t, 3.0e8, 1.1e8));
            }
        }
        drain();
        // 3.0e8 W × 7 h = 2100 MWh; × 9 h = 2700 MWh.
        assertEquals(2100.0, store.shiftSummary(SITE, UNIT, spring).energyInMWh(), 1e-9);
        assertEquals(2700.0, store.shiftSummary(SITE, UNIT, autumn).energyInMWh(), 1e-9);
        assertEquals(Duration.ofHours(9), store.shiftSummary(SITE, UNIT, autumn).covered());
    }

    @Test
    void shiftWithoutDataHasNoEfficiencyAndNoEnergy() {
        Instant start = Instant.parse("2026-11-29T05:00:00Z");
        ShiftSummary s = store.shiftSummary(SITE, UNIT,
                new Shift(LocalDate.of(2026, 11, 29), "empty", start, start.plus(Duration.ofHours(8))));
        assertEquals(0.0, s.energyInMWh(), 0.0);
        assertTrue(s.meanEfficiency().isEmpty(), "no efficiency without samples");
        assertEquals(Duration.ZERO, s.covered());
        assertEquals(List.of(), s.closures());
    }
}
