package org.steamtally.calc.sim;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;

/**
 * One simulated instrument reading, in SI; conversion to the sensor's engineering unit is the
 * publisher's job.
 *
 * @param sensorId  the sensor
 * @param topic     its topic from the plant description, when it has one
 * @param timestamp when it was taken
 * @param valueSi   the reading, in the SI unit of the sensor's quantity (finite)
 */
public record SimulatedReading(String sensorId, Optional<String> topic, Instant timestamp, double valueSi) {

    public SimulatedReading {
        Objects.requireNonNull(sensorId, "sensorId");
        Objects.requireNonNull(topic, "topic");
        Objects.requireNonNull(timestamp, "timestamp");
        if (!Double.isFinite(valueSi)) {
            throw new IllegalArgumentException("reading of " + sensorId + " must be finite, was " + valueSi);
        }
    }
}
