package org.steamtally.dashboard.store;

import java.util.Objects;

/**
 * Statistics of one first-law check over a time range.
 *
 * @param count          number of records with this check
 * @param meanResidualW  mean residual r, W
 * @param meanZ          mean normalised residual z = r / u(r)
 * @param minZ           smallest z
 * @param maxZ           largest z
 * @param countOutside   records with |z| &gt; {@link #Z_LIMIT}
 */
public record ClosureStats(String id, long count, double meanResidualW, double meanZ, double minZ, double maxZ,
        long countOutside) {

    /**
     * |z| above 2 happens in about 5 % of records when the balance holds and the uncertainties are
     * right (normal distribution; common practice in data validation), so a larger share says the
     * balance does not close.
     */
    public static final double Z_LIMIT = 2.0;

    public ClosureStats {
        Objects.requireNonNull(id, "id");
        if (count < 1 || countOutside < 0 || countOutside > count) {
            throw new IllegalArgumentException("closure " + id + ": count " + count + ", outside " + countOutside);
        }
    }

    /** Largest |z|. */
    public double maxAbsZ() {
        return Math.max(Math.abs(minZ), Math.abs(maxZ));
    }

    /** Share of records with |z| &gt; {@link #Z_LIMIT}, 0 to 1. */
    public double fractionOutside() {
        return (double) countOutside / count;
    }
}
