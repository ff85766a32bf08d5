package org.steamtally.collector.payload;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;

/**
 * One reading as it arrived, before any unit conversion.
 *
 * @param value       the value as given, in the engineering unit of the reading (finite)
 * @param unit        the unit string the payload gave, when it gave one; otherwise the sensor's
 *                    declared engineering unit applies
 * @param timestamp   the instant the payload gives, or the arrival instant when it gives none
 * @param quality     the quality the payload gives, {@link Quality#GOOD} when it gives none
 * @param arrivalTime true when {@code timestamp} is the arrival instant because the payload had none
 */
public record Reading(double value, Optional<String> unit, Instant timestamp, Quality quality, boolean arrivalTime) {

    public Reading {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("reading value must be finite, was " + value);
        }
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(quality, "quality");
    }
}
