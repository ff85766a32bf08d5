package org.steamtally.dashboard.store;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import org.steamtally.calc.cycle.UnitResult;

/**
 * The store port: where results, reconciliation, alarm events and readings go, and the queries that
 * trend views and shift reviews ask. Writes never block the caller on the store and never throw for
 * an unreachable store: they are queued and, when the store does not answer, spooled to disk.
 * Queries go to the store directly and throw {@link StoreQueryException} when it cannot answer.
 * Ranges are half-open, {@code from ≤ t < to}; timestamps are kept to the millisecond.
 */
public interface ResultStore extends AutoCloseable {

    /**
     * Queues the points of one result record (states, components, cycle, closure) and, when its
     * global test was made, its reconciliation ({@link StoredReconciliation#of}).
     */
    void writeResult(UnitResult result);

    /** Queues the reconciliation of one record. */
    void writeReconciliation(StoredReconciliation reconciliation);

    /** Queues one alarm event. */
    void writeAlarmEvent(StoredAlarmEvent event);

    /** Queues one raw reading. */
    void writeReading(StoredReading reading);

    /**
     * Waits until every point queued before the call has been written to the store or to the spool.
     *
     * @return whether that happened within {@code timeout}
     */
    boolean flush(Duration timeout) throws InterruptedException;

    /** Every stored point of one measurement and unit in the range. */
    List<Point> points(Measurement measurement, String site, String unit, Instant from, Instant to);

    /** One or more numeric series downsampled into buckets of {@code width} aligned to {@code from}; per field. */
    Map<String, List<Bucket>> series(SeriesRef series, Instant from, Instant to, Duration width);

    /** The summary of one shift of one unit; for the running shift, of its part up to now. */
    ShiftSummary shiftSummary(String site, String unit, Shift shift);

    /** Alarm events of the unit in the range, in time order: transitions, acknowledgements, shelving. */
    List<StoredAlarmEvent> alarmHistory(String site, String unit, Instant from, Instant to);

    /**
     * Sensors that reconciliation flagged as suspect in the range, most often flagged first, then by
     * largest test value. This default reads every reconciliation point of the range; adapters that
     * can ask their store directly override it.
     */
    default List<SuspectSensor> suspects(String site, String unit, Instant from, Instant to) {
        Map<String, long[]> count = new java.util.HashMap<>();
        Map<String, Double> maxTest = new java.util.HashMap<>();
        for (Point p : points(Measurement.RECONCILIATION, site, unit, from, to)) {
            if (p.id() != null && !p.id().isEmpty() && Boolean.TRUE.equals(p.value("suspect"))) {
                count.computeIfAbsent(p.id(), k -> new long[1])[0]++;
                Object t = p.value("test_value");
                double test = t instanceof Double d ? d : 0.0;
                maxTest.merge(p.id(), test, Math::max);
            }
        }
        return count.entrySet().stream()
                .map(e -> new SuspectSensor(e.getKey(), e.getValue()[0], maxTest.get(e.getKey())))
                .sorted(java.util.Comparator.comparingLong(SuspectSensor::suspectCount).reversed()
                        .thenComparing(java.util.Comparator.comparingDouble(SuspectSensor::maxTestValue).reversed()))
                .toList();
    }

    /** Writes what is queued (to the store, or to the spool), syncs the spool and releases everything. */
    @Override
    void close();
}
