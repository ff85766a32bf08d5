package org.steamtally.calc.plant;

/**
 * A declared constant that enters a balance with an uncertainty of its own: a generator or motor
 * efficiency, a fuel heating value. In SI (efficiencies as fractions).
 *
 * @param value               the value
 * @param standardUncertainty its standard uncertainty u, ≥ 0 (0 for a value taken as exact)
 */
public record UncertainConstant(double value, double standardUncertainty) {

    public UncertainConstant {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("value must be finite, was " + value);
        }
        if (!(standardUncertainty >= 0.0) || !Double.isFinite(standardUncertainty)) {
            throw new IllegalArgumentException("standard uncertainty must be ≥ 0, was " + standardUncertainty);
        }
    }

    public static UncertainConstant exact(double value) {
        return new UncertainConstant(value, 0.0);
    }
}
