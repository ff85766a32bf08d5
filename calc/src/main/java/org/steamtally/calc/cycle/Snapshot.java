package org.steamtally.calc.cycle;

import java.time.Instant;
import java.util.Arrays;
import java.util.Objects;

/**
 * One aligned set of sensor values of a unit: for each sensor of the unit description, in its
 * declaration order, the latest good value in SI and whether it is usable.
 *
 * <p>The arrays are owned by the snapshot once given; a producer that reuses buffers passes copies.
 *
 * @param timestamp the instant the snapshot stands for
 * @param unitId    the unit's id
 * @param valuesSi  one value per sensor, SI; ignored where {@code status} is not {@link SensorStatus#GOOD}
 * @param status    one status per sensor
 */
public record Snapshot(Instant timestamp, String unitId, double[] valuesSi, SensorStatus[] status) {

    public Snapshot {
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(unitId, "unitId");
        Objects.requireNonNull(valuesSi, "valuesSi");
        Objects.requireNonNull(status, "status");
        if (valuesSi.length != status.length) {
            throw new IllegalArgumentException("one status per value: " + valuesSi.length + " values, "
                    + status.length + " statuses");
        }
    }

    /** A snapshot in which every sensor has a good value. */
    public static Snapshot allGood(Instant timestamp, String unitId, double[] valuesSi) {
        SensorStatus[] status = new SensorStatus[valuesSi.length];
        Arrays.fill(status, SensorStatus.GOOD);
        return new Snapshot(timestamp, unitId, valuesSi, status);
    }

    /** Whether a sensor of the snapshot has a usable value. */
    public enum SensorStatus {
        GOOD,
        /** Its latest value is older than the sensor's max age. */
        STALE,
        /** No value has arrived yet. */
        MISSING
    }
}
