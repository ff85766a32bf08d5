package org.steamtally.dashboard.store;

import java.nio.file.Path;
import java.time.Duration;
import java.util.Objects;

/**
 * How the store queues, batches and spools points.
 *
 * @param spoolDir       directory of the on-disk journal
 * @param queueCapacity  points held in memory before further points go straight to the journal
 * @param batchSize      points per write to the store
 * @param spoolMaxBytes  bound on the journal; when an append exceeds it the oldest points are dropped
 * @param segmentBytes   journal segment size; at most a quarter of {@code spoolMaxBytes}
 * @param syncInterval   how often appended journal bytes are forced to disk, 1 ms to 1 s
 * @param retryMin       first wait after a failed write before the store is tried again
 * @param retryMax       longest such wait (the wait doubles after each failure up to this)
 * @param linger         how long the writer may hold a batch that is not full, from its first point, for more
 *                       points to come, 0 to 10 s; 0 writes whatever is queued at once. The batch is written
 *                       sooner when it is full or when no point has come for {@code lingerGap}
 * @param lingerGap      a pause in the points this long ends a lingering batch early, (0, {@code linger}]
 *                       when {@code linger} is not 0
 */
public record SpoolSettings(Path spoolDir, int queueCapacity, int batchSize, long spoolMaxBytes, long segmentBytes,
        Duration syncInterval, Duration retryMin, Duration retryMax, Duration linger, Duration lingerGap) {

    /**
     * The pause that ends a lingering batch by default. The results of a fleet come in a burst at each
     * snapshot time, one unit after another a few milliseconds apart, so a pause this long means the
     * burst is over: the batch is written then, once, rather than in many small writes while the
     * burst's evaluations still need the CPU.
     */
    public static final Duration LINGER_GAP = Duration.ofMillis(50);

    /** Seconds in a day: the default journal holds 24 h of points at the nominal rate. */
    private static final long DAY_S = 86_400;

    public SpoolSettings {
        Objects.requireNonNull(spoolDir, "spoolDir");
        if (queueCapacity < 1 || batchSize < 1) {
            throw new IllegalArgumentException("queue capacity " + queueCapacity + " and batch size " + batchSize
                    + " must be ≥ 1");
        }
        if (segmentBytes < 1024 || spoolMaxBytes < 4 * segmentBytes) {
            throw new IllegalArgumentException("spool max " + spoolMaxBytes + " B must be at least four segments of "
                    + segmentBytes + " B (≥ 1024 B)");
        }
        if (syncInterval.isNegative() || syncInterval.isZero() || syncInterval.compareTo(Duration.ofSeconds(1)) > 0) {
            throw new IllegalArgumentException("spool sync interval " + syncInterval + " must be in (0, 1 s]");
        }
        if (retryMin.isNegative() || retryMin.isZero() || retryMax.compareTo(retryMin) < 0) {
            throw new IllegalArgumentException("retry waits " + retryMin + " to " + retryMax
                    + " must be positive and ordered");
        }
        Objects.requireNonNull(linger, "linger");
        Objects.requireNonNull(lingerGap, "lingerGap");
        if (linger.isNegative() || linger.compareTo(Duration.ofSeconds(10)) > 0) {
            throw new IllegalArgumentException("batch linger " + linger + " must be in [0, 10 s]");
        }
        if (!linger.isZero() && (lingerGap.isNegative() || lingerGap.isZero() || lingerGap.compareTo(linger) > 0)) {
            throw new IllegalArgumentException("batch linger gap " + lingerGap + " must be in (0, " + linger + "]");
        }
    }

    /**
     * Defaults for a given nominal load: a journal that holds 24 hours of it, sync every second,
     * batches of 1000 points written as soon as they are queued, retries from 0.5 s backing off to 30 s.
     *
     * @param pointsPerSecond nominal points per second (e.g. {@link ResultPoints#of} of a record times
     *                        records per second), &gt; 0
     * @param bytesPerPoint   journal bytes per point (a record's encoded size plus 8 bytes framing)
     */
    public static SpoolSettings forNominalRate(Path spoolDir, double pointsPerSecond, double bytesPerPoint) {
        if (!(pointsPerSecond > 0.0) || !(bytesPerPoint > 0.0)) {
            throw new IllegalArgumentException("nominal rate " + pointsPerSecond + " points/s and " + bytesPerPoint
                    + " B/point must be positive");
        }
        long max = (long) Math.ceil(pointsPerSecond * bytesPerPoint * DAY_S);
        long segment = Math.max(1024, Math.min(64L << 20, max / 16));
        max = Math.max(max, 4 * segment);
        return new SpoolSettings(spoolDir, 65_536, 1000, max, segment, Duration.ofSeconds(1),
                Duration.ofMillis(500), Duration.ofSeconds(30), Duration.ZERO, LINGER_GAP);
    }

    /** Journal bytes of one point: its encoding plus the record framing. */
    public static int journalBytes(Point p) {
        return PointCodec.encode(p).length + Journal.HEADER_BYTES;
    }

    /** The same settings with other retry waits (tests and impatient deployments). */
    public SpoolSettings withRetry(Duration min, Duration max) {
        return new SpoolSettings(spoolDir, queueCapacity, batchSize, spoolMaxBytes, segmentBytes, syncInterval, min,
                max, linger, lingerGap);
    }

    /** The same settings with another number of points per write to the store. */
    public SpoolSettings withBatchSize(int points) {
        return new SpoolSettings(spoolDir, queueCapacity, points, spoolMaxBytes, segmentBytes, syncInterval, retryMin,
                retryMax, linger, lingerGap);
    }

    /** The same settings with room for another number of points in memory. */
    public SpoolSettings withQueueCapacity(int points) {
        return new SpoolSettings(spoolDir, points, batchSize, spoolMaxBytes, segmentBytes, syncInterval, retryMin,
                retryMax, linger, lingerGap);
    }

    /** The same settings with another journal bound and segment size. */
    public SpoolSettings withSpoolBytes(long maxBytes, long segment) {
        return new SpoolSettings(spoolDir, queueCapacity, batchSize, maxBytes, segment, syncInterval, retryMin,
                retryMax, linger, lingerGap);
    }

    /**
     * The same settings with another {@code linger} and {@code lingerGap}: how long a batch that is not
     * full may wait for more points, and the pause in them that ends the wait.
     */
    public SpoolSettings withLinger(Duration linger, Duration lingerGap) {
        return new SpoolSettings(spoolDir, queueCapacity, batchSize, spoolMaxBytes, segmentBytes, syncInterval,
                retryMin, retryMax, linger, lingerGap);
    }
}
