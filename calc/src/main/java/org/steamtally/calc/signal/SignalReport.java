package org.steamtally.calc.signal;

import java.time.Instant;
import java.util.List;
import java.util.Objects;

import org.steamtally.calc.cycle.Snapshot;

/**
 * The signal tests of every sensor of a unit at one snapshot.
 *
 * @param timestamp the snapshot's instant
 * @param unitId    the unit
 * @param sensors   one entry per sensor, in the unit description's sensor order
 */
public record SignalReport(Instant timestamp, String unitId, List<SensorSignal> sensors) {

    public SignalReport {
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(unitId, "unitId");
        sensors = List.copyOf(sensors);
    }

    /**
     * The snapshot with every sensor that failed a signal test marked {@link Snapshot.SensorStatus#STALE},
     * so that the cycle model and the reconciliation leave it out exactly as they leave out a stale
     * one; the snapshot itself when none failed.
     *
     * @throws IllegalArgumentException when the snapshot is of another unit or size
     */
    public Snapshot excludingFailed(Snapshot snapshot) {
        if (!snapshot.unitId().equals(unitId) || snapshot.status().length != sensors.size()) {
            throw new IllegalArgumentException("signal report of unit " + unitId + " with " + sensors.size()
                    + " sensors cannot mark snapshot of unit " + snapshot.unitId() + " with "
                    + snapshot.status().length + " sensors");
        }
        Snapshot.SensorStatus[] status = null;
        for (int i = 0; i < sensors.size(); i++) {
            if (sensors.get(i).failed() && snapshot.status()[i] == Snapshot.SensorStatus.GOOD) {
                if (status == null) {
                    status = snapshot.status().clone();
                }
                status[i] = Snapshot.SensorStatus.STALE;
            }
        }
        return status == null ? snapshot : new Snapshot(snapshot.timestamp(), snapshot.unitId(), snapshot.valuesSi(), status);
    }
}
