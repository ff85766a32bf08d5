package org.steamtally.dashboard.store;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;

/**
 * What an adapter (InfluxDB, embedded H2) provides: idempotent writes of points and the primitive
 * queries the port's queries are built from. Ranges are half-open, {@code from ≤ t < to}. Writes are
 * called from one thread at a time; queries from any thread.
 */
public interface StoreBackend extends AutoCloseable {

    /** A short name for meters and logs, e.g. {@code h2}, {@code influxdb}. */
    String name();

    /**
     * Writes points; a point whose identity (measurement, tags, timestamp) exists already replaces
     * it. Points with every field empty are skipped.
     *
     * @throws StoreUnavailableException when the store cannot be reached; nothing or part was written
     *                                   and the whole list may be written again
     * @throws PointsRejectedException   when the store refuses the points for good
     */
    void write(List<Point> points) throws StoreUnavailableException, PointsRejectedException;

    /** Every point of one measurement and unit in the range, ordered by id, then time. */
    List<Point> points(Measurement measurement, String site, String unit, Instant from, Instant to);

    /**
     * Downsamples each field of {@code series} into buckets of {@code width} aligned to {@code from}
     * (the k-th bucket starts at from + k·width); buckets without samples of a field are left out of
     * that field's list.
     */
    Map<String, List<Bucket>> buckets(SeriesRef series, Instant from, Instant to, Duration width);

    /** Statistics of each first-law check of the unit in the range, ordered by id. */
    List<ClosureStats> closureStats(String site, String unit, Instant from, Instant to);

    /** Sensors flagged suspect in the range, most often flagged first, then by largest test value. */
    List<SuspectSensor> suspects(String site, String unit, Instant from, Instant to);

    /** Alarm events of the unit in the range, in time order (ties by alarm id). */
    List<StoredAlarmEvent> alarmEvents(String site, String unit, Instant from, Instant to);

    /** For each alarm of the unit with an event before {@code t}: its last such event. */
    List<StoredAlarmEvent> lastAlarmEventsBefore(String site, String unit, Instant t);

    @Override
    void close();
}
