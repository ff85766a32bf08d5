package org.steamtally.dashboard.store;

import java.util.Objects;

/**
 * A sensor that reconciliation flagged as suspect in a time range.
 *
 * @param suspectCount  records in which it was flagged
 * @param maxTestValue  its largest individual test value among those records
 */
public record SuspectSensor(String sensorId, long suspectCount, double maxTestValue) {
    public SuspectSensor {
        Objects.requireNonNull(sensorId, "sensorId");
    }
}
