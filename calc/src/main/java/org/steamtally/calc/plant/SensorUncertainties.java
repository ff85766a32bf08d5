package org.steamtally.calc.plant;

import java.util.List;
import java.util.Objects;

/**
 * The standard uncertainties of a unit's sensors as one array, in the order of
 * {@link UnitDescription#sensors()}, each in the SI unit of its sensor's quantity: what the cycle
 * model's closure and the reconciliation can take at evaluation time in place of the declared
 * ones, so that one compiled model serves readings of other precision (the mean of n readings has
 * u/√n, GUM, JCGM 100:2008, 4.2.3) without being compiled again.
 */
public final class SensorUncertainties {

    private SensorUncertainties() {
    }

    /** The declared standard uncertainties u(x), SI, one per sensor. */
    public static double[] declared(List<Sensor> sensors) {
        double[] u = new double[sensors.size()];
        for (int i = 0; i < u.length; i++) {
            u[i] = sensors.get(i).standardUncertaintySi();
        }
        return u;
    }

    /**
     * The declared standard uncertainties each multiplied by {@code scale}, computed as
     * {@link Sensor#withStandardUncertaintySi} of {@code u * scale} would hold them, so that a
     * result from these equals, bit for bit, one from a unit compiled with the scaled sensors.
     *
     * @param scale a positive finite factor, e.g. 1/√n for the mean of n readings
     * @throws IllegalArgumentException when the scale is not positive and finite
     */
    public static double[] scaled(List<Sensor> sensors, double scale) {
        if (!(scale > 0.0) || !Double.isFinite(scale)) {
            throw new IllegalArgumentException("uncertainty scale must be a positive finite number, was " + scale);
        }
        double[] u = new double[sensors.size()];
        for (int i = 0; i < u.length; i++) {
            u[i] = sensors.get(i).standardUncertaintySi() * scale;
        }
        return u;
    }

    /**
     * Checks one standard uncertainty per sensor, each positive and finite, and returns a copy the
     * caller cannot change afterwards.
     *
     * @param unitId the unit, for the message
     * @throws IllegalArgumentException naming the unit, the sensor and the value when the count or a value is wrong
     */
    public static double[] checked(String unitId, Sensor[] sensors, double[] standardUncertaintySi) {
        check(unitId, sensors, standardUncertaintySi);
        return standardUncertaintySi.clone();
    }

    /**
     * Checks as {@link #checked} does, without the copy: for a caller that copies the values into
     * arrays of its own before it returns.
     *
     * @throws IllegalArgumentException as {@link #checked}
     */
    public static void check(String unitId, Sensor[] sensors, double[] standardUncertaintySi) {
        Objects.requireNonNull(standardUncertaintySi, "standardUncertaintySi");
        if (standardUncertaintySi.length != sensors.length) {
            throw new IllegalArgumentException("unit \"" + unitId + "\" has " + sensors.length
                    + " sensors; was given " + standardUncertaintySi.length + " standard uncertainties");
        }
        for (int i = 0; i < sensors.length; i++) {
            double u = standardUncertaintySi[i];
            if (!(u > 0.0) || !Double.isFinite(u)) {
                throw new IllegalArgumentException("unit \"" + unitId + "\", sensor " + sensors[i].id()
                        + ": standard uncertainty must be a positive finite number, was " + u + " "
                        + sensors[i].quantity().siUnit());
            }
        }
    }
}
