package org.steamtally.dashboard.store;

import java.time.Instant;
import java.util.Objects;

/**
 * One bucket of a downsampled series: the samples with {@code start ≤ t < start + width}.
 *
 * @param mean  arithmetic mean of the samples, in the field's unit
 * @param min   smallest sample
 * @param max   largest sample
 * @param count number of samples, ≥ 1 (buckets without samples are not returned)
 */
public record Bucket(Instant start, double mean, double min, double max, long count) {
    public Bucket {
        Objects.requireNonNull(start, "start");
        if (count < 1 || !Double.isFinite(mean) || !(min <= max)) {
            throw new IllegalArgumentException("bucket at " + start + ": count " + count + ", mean " + mean + ", min "
                    + min + ", max " + max + " is not a bucket of samples");
        }
    }
}
