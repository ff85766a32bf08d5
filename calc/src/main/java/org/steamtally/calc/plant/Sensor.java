package org.steamtally.calc.plant;

import java.time.Duration;
import java.util.Objects;
import java.util.Optional;

/**
 * One instrument of a unit, with its uncertainty and plausible range already converted to SI.
 *
 * <p>The plant description declares the uncertainty in the sensor's engineering unit, either as a
 * standard uncertainty (1σ) or as an expanded uncertainty with its coverage factor k; the loader
 * divides by k, so {@code standardUncertaintySi} is always the GUM standard uncertainty u(x).
 *
 * @param id                    tag, unique within the site, e.g. {@code "PT-101"}
 * @param quantity              what it measures
 * @param engineeringUnit       the unit its readings arrive in, as declared, e.g. {@code "MPa"}
 * @param standardUncertaintySi standard uncertainty u(x) in the SI unit of {@code quantity}, &gt; 0
 * @param uncertaintyBasis      how the uncertainty was declared, kept for reports
 * @param rangeMinSi            lowest plausible value, SI
 * @param rangeMaxSi            highest plausible value, SI
 * @param maxAge                a reading older than this is stale
 * @param topic                 the MQTT topic it arrives on, when the plant description gives one
 * @param sameMeasurandAs       the id of another sensor of the unit that measures the same quantity at
 *                              the same point (a duplicate transmitter, a second meter): this sensor is
 *                              then a second measurement of that one's value. The cycle model keeps
 *                              using the primary; the reconciliation checks the pair's difference
 */
public record Sensor(
        String id,
        Quantity quantity,
        String engineeringUnit,
        double standardUncertaintySi,
        UncertaintyBasis uncertaintyBasis,
        double rangeMinSi,
        double rangeMaxSi,
        Duration maxAge,
        Optional<String> topic,
        Optional<String> sameMeasurandAs) {

    /** A sensor that is no other's duplicate. */
    public Sensor(String id, Quantity quantity, String engineeringUnit, double standardUncertaintySi,
                  UncertaintyBasis uncertaintyBasis, double rangeMinSi, double rangeMaxSi, Duration maxAge,
                  Optional<String> topic) {
        this(id, quantity, engineeringUnit, standardUncertaintySi, uncertaintyBasis, rangeMinSi, rangeMaxSi, maxAge,
                topic, Optional.empty());
    }

    public Sensor {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(quantity, "quantity");
        Objects.requireNonNull(engineeringUnit, "engineeringUnit");
        Objects.requireNonNull(uncertaintyBasis, "uncertaintyBasis");
        Objects.requireNonNull(maxAge, "maxAge");
        Objects.requireNonNull(topic, "topic");
        Objects.requireNonNull(sameMeasurandAs, "sameMeasurandAs");
        if (sameMeasurandAs.isPresent() && sameMeasurandAs.get().equals(id)) {
            throw new IllegalArgumentException("sensor " + id + " cannot be a second measurement of itself");
        }
        if (!(standardUncertaintySi > 0.0) || !Double.isFinite(standardUncertaintySi)) {
            throw new IllegalArgumentException("sensor " + id + ": standard uncertainty must be a positive number, was "
                    + standardUncertaintySi + " " + quantity.siUnit());
        }
        if (!(rangeMinSi < rangeMaxSi)) {
            throw new IllegalArgumentException("sensor " + id + ": plausible range min " + rangeMinSi
                    + " must be below max " + rangeMaxSi + " " + quantity.siUnit());
        }
    }

    /** True when this sensor is a second measurement of another sensor's quantity. */
    public boolean isDuplicate() {
        return sameMeasurandAs.isPresent();
    }

    /** The same sensor with another standard uncertainty, SI (e.g. that of a mean of several readings). */
    public Sensor withStandardUncertaintySi(double sigmaSi) {
        return new Sensor(id, quantity, engineeringUnit, sigmaSi, uncertaintyBasis, rangeMinSi, rangeMaxSi, maxAge,
                topic, sameMeasurandAs);
    }

    /** True when an SI value lies within the plausible range, ends included. */
    public boolean isPlausible(double valueSi) {
        return valueSi >= rangeMinSi && valueSi <= rangeMaxSi;
    }
}
