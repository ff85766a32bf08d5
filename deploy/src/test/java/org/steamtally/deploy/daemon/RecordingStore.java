package org.steamtally.deploy.daemon;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CopyOnWriteArrayList;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.dashboard.store.Bucket;
import org.steamtally.dashboard.store.Measurement;
import org.steamtally.dashboard.store.Point;
import org.steamtally.dashboard.store.ResultStore;
import org.steamtally.dashboard.store.SeriesRef;
import org.steamtally.dashboard.store.Shift;
import org.steamtally.dashboard.store.ShiftSummary;
import org.steamtally.dashboard.store.StoredAlarmEvent;
import org.steamtally.dashboard.store.StoredReading;
import org.steamtally.dashboard.store.StoredReconciliation;

/**
 * A store that keeps what it is given in lists, for tests of the wiring. Queries are not offered. A
 * result's reconciliation is kept with it, as the real store keeps it; reconciliations written on
 * their own are kept apart.
 */
final class RecordingStore implements ResultStore {

    final List<UnitResult> results = new CopyOnWriteArrayList<>();
    /** The reconciliations stored with the results. */
    final List<StoredReconciliation> reconciliations = new CopyOnWriteArrayList<>();
    /** Reconciliations written on their own, not with a result. */
    final List<StoredReconciliation> separateReconciliations = new CopyOnWriteArrayList<>();
    final List<StoredAlarmEvent> alarmEvents = new CopyOnWriteArrayList<>();

    @Override
    public void writeResult(UnitResult result) {
        results.add(result);
        StoredReconciliation.of(result).ifPresent(reconciliations::add);
    }

    @Override
    public void writeReconciliation(StoredReconciliation reconciliation) {
        separateReconciliations.add(reconciliation);
    }

    @Override
    public void writeAlarmEvent(StoredAlarmEvent event) {
        alarmEvents.add(event);
    }

    @Override
    public void writeReading(StoredReading reading) {
    }

    @Override
    public boolean flush(Duration timeout) {
        return true;
    }

    @Override
    public List<Point> points(Measurement measurement, String site, String unit, Instant from, Instant to) {
        throw new UnsupportedOperationException();
    }

    @Override
    public Map<String, List<Bucket>> series(SeriesRef series, Instant from, Instant to, Duration width) {
        throw new UnsupportedOperationException();
    }

    @Override
    public ShiftSummary shiftSummary(String site, String unit, Shift shift) {
        throw new UnsupportedOperationException();
    }

    @Override
    public List<StoredAlarmEvent> alarmHistory(String site, String unit, Instant from, Instant to) {
        throw new UnsupportedOperationException();
    }

    @Override
    public void close() {
    }
}
