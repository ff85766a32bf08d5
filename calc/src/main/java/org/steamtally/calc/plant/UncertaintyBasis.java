package org.steamtally.calc.plant;

/**
 * How a declared uncertainty is to be read (GUM, ISO/IEC Guide 98-3, sections 2.3 and 6): a standard
 * uncertainty (one standard deviation), or an expanded uncertainty U = k·u with coverage factor k.
 *
 * @param coverageFactor k; 1 for a standard uncertainty
 */
public record UncertaintyBasis(double coverageFactor) {

    public static final UncertaintyBasis STANDARD = new UncertaintyBasis(1.0);

    public UncertaintyBasis {
        if (!(coverageFactor >= 1.0) || !Double.isFinite(coverageFactor)) {
            throw new IllegalArgumentException("coverage factor k must be at least 1, was " + coverageFactor);
        }
    }

    public static UncertaintyBasis expanded(double k) {
        return new UncertaintyBasis(k);
    }

    /** The standard uncertainty u from a declared value in this basis. */
    public double standardUncertainty(double declared) {
        return declared / coverageFactor;
    }
}
