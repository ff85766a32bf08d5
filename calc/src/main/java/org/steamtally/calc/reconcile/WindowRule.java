package org.steamtally.calc.reconcile;

import java.time.Duration;
import java.util.Objects;

/**
 * When a window's mean is a fair estimate of the plant over the window, so that its reconciliation
 * may run ({@link WindowMeanEvaluator#evaluate(org.steamtally.calc.cycle.Snapshot, WindowRule)}).
 *
 * <p>The window spans P snapshot periods, from its oldest held snapshot to its newest (P is the
 * count of snapshots it holds when they are consecutive, more when snapshots are missing between
 * them). It is representative when
 * <ul>
 *   <li>it holds at least ⌈share · P⌉ snapshots: no more than (1 − share) of its periods are missing
 *       (snapshots replaced before they were taken in, a stall of the data), and</li>
 *   <li>every sensor the balances use has a good value in at least ⌈share · P⌉ of them, or in none:
 *       a sensor good over only part of the window would be averaged over another sub-period than
 *       the rest, and the balances would compare means of different plant states. A sensor out for
 *       the whole window is left out of the mean's balances, as a stale sensor is from one
 *       snapshot's.</li>
 * </ul>
 * VDI 2048-1 reconciles mean values of steady, complete periods; this is that condition in counts a
 * snapshot stream can check. Timestamps that do not increase are not read as a gap (P is never
 * taken below the count held).
 *
 * @param minGoodShare   the share of the window's periods that must be held and must have good
 *                       values of every balance sensor, in (0, 1]; 1 requires a complete window
 * @param snapshotPeriod the time between snapshots, positive; turns the span of the held snapshots'
 *                       timestamps into a count of periods
 */
public record WindowRule(double minGoodShare, Duration snapshotPeriod) {

    /**
     * 90 %: at 1 Hz and 50 s, up to 5 periods missing or stale per sensor. A few lost snapshots
     * barely change a steady mean; the false suspects seen after a cold start came from sensors
     * stale for half the window and more (docs/DETECTION.md). Common practice, not a standard value.
     */
    public static final double MIN_GOOD_SHARE_DEFAULT = 0.9;

    public WindowRule {
        Objects.requireNonNull(snapshotPeriod, "snapshotPeriod");
        if (!(minGoodShare > 0.0 && minGoodShare <= 1.0)) {
            throw new IllegalArgumentException("the window's minimum good share must be above 0 and at most 1, was "
                    + minGoodShare);
        }
        if (snapshotPeriod.isZero() || snapshotPeriod.isNegative()) {
            throw new IllegalArgumentException("snapshot period must be positive, was " + snapshotPeriod);
        }
    }

    /** The default share with the given snapshot period. */
    public static WindowRule of(Duration snapshotPeriod) {
        return new WindowRule(MIN_GOOD_SHARE_DEFAULT, snapshotPeriod);
    }

    /** ⌈share · periods⌉: the held snapshots, and good values per balance sensor, a span of {@code periods} needs. */
    public int needed(int periods) {
        // the small allowance keeps 0.9 · 50 = 45.000000000000004 from asking for 46
        return (int) Math.ceil(minGoodShare * periods - 1e-9);
    }
}
