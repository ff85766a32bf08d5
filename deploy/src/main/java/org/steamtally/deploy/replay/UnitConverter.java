package org.steamtally.deploy.replay;

import org.steamtally.calc.plant.Quantity;

/** Converts a reading from the engineering unit it arrived in to the SI unit of its quantity. */
@FunctionalInterface
public interface UnitConverter {

    /**
     * @param quantity what the sensor measures
     * @param unit     the reading's unit as written, e.g. {@code "MPa"}, {@code "degC"}, {@code "t/h"}
     * @param value    the value in {@code unit}
     * @param atmosphericPa the site's atmospheric pressure, Pa, for gauge-pressure units
     * @return the value in {@link Quantity#siUnit()}
     * @throws IllegalArgumentException when the unit is unknown or not a unit of {@code quantity}; the
     *                                  message names the unit
     */
    double toSi(Quantity quantity, String unit, double value, double atmosphericPa);
}
