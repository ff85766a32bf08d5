package org.steamtally.dashboard.store;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;

/**
 * A test backend that only takes writes: every query answers empty. Subclasses decide what a write
 * does (record it, fail, ...), which is all the spooling tests look at.
 */
abstract class WriteOnlyBackend implements StoreBackend {

    @Override
    public List<Point> points(Measurement m, String site, String unit, Instant from, Instant to) {
        return List.of();
    }

    @Override
    public Map<String, List<Bucket>> buckets(SeriesRef s, Instant from, Instant to, Duration width) {
        return Map.of();
    }

    @Override
    public List<ClosureStats> closureStats(String site, String unit, Instant from, Instant to) {
        return List.of();
    }

    @Override
    public List<SuspectSensor> suspects(String site, String unit, Instant from, Instant to) {
        return List.of();
    }

    @Override
    public List<StoredAlarmEvent> alarmEvents(String site, String unit, Instant from, Instant to) {
        return List.of();
    }

    @Override
    public List<StoredAlarmEvent> lastAlarmEventsBefore(String site, String unit, Instant t) {
        return List.of();
    }

    @Override
    public void close() {
    }
}
