package org.steamtally.dashboard.store;

import java.time.Instant;
import java.util.Objects;

/**
 * One raw reading as the store keeps it (measurement {@code readings}), after conversion to SI.
 *
 * @param timestamp the reading's source timestamp, stored to the millisecond
 * @param sensorId  the sensor's id from the plant description (the id tag)
 * @param valueSi   the value in the SI unit of the sensor's quantity (Pa, K, kg/s, W, ...), finite
 * @param quality   the collector's quality label, e.g. {@code good}
 */
public record StoredReading(Instant timestamp, String site, String unit, String sensorId, double valueSi,
        String quality) {

    public StoredReading {
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(site, "site");
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(sensorId, "sensorId");
        Objects.requireNonNull(quality, "quality");
        if (sensorId.isEmpty()) {
            throw new IllegalArgumentException("reading at " + timestamp + ": the sensor id must not be empty");
        }
        if (!Double.isFinite(valueSi)) {
            throw new IllegalArgumentException("reading of " + sensorId + " at " + timestamp + ": value " + valueSi
                    + " must be finite");
        }
        timestamp = Instant.ofEpochMilli(timestamp.toEpochMilli());
    }
}
