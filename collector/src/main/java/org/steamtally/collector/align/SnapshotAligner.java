package org.steamtally.collector.align;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;
import java.util.OptionalLong;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.Snapshot.SensorStatus;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Turns a unit's readings, arriving in any order, repeated and late, into {@link Snapshot}s on a
 * fixed time grid: one snapshot every {@code period}, at whole multiples of the period since
 * 1970-01-01T00:00Z. For each sensor a snapshot at time t carries the newest reading with a timestamp
 * at or before t; it is {@link SensorStatus#GOOD} when that reading is at most the sensor's
 * {@link Sensor#maxAge()} older than t, {@link SensorStatus#STALE} when older (its value is still
 * carried, for display), and {@link SensorStatus#MISSING} when there is none (value 0).
 *
 * <p>Time is passed in: the aligner has no clock of its own, so the same calls give the same
 * snapshots. {@link #advanceTo} moves the clock and emits every snapshot whose time is more than
 * {@code allowedLateness} in the past; until then a snapshot is open and a late reading for it is
 * still taken in. With release when complete (live ingestion; a replay of a recording keeps to the
 * lateness, so that every reading of a period is weighed) a snapshot is emitted sooner, as soon as
 * the clock has reached its time, when it is complete: every sensor that is expected has a reading in its interval (after the previous grid time,
 * at or before its own). A sensor is expected unless it would be {@link SensorStatus#STALE} in that
 * snapshot (its latest reading is older than its max age) or is known to be missing (no reading yet,
 * though the grid has run for its max age), so one silent sensor makes its unit wait the whole
 * lateness only until it turns stale. Waiting for the lateness when every reading is already in
 * would only delay the result; a reading arriving after its snapshot was emitted is treated as
 * before, as the base for later snapshots. The grid starts with the first reading taken in: the first snapshot is the first
 * grid time at or after that reading's timestamp, or after the clock less the allowed lateness if
 * the reading is older; readings from before the first snapshot still serve as each sensor's latest
 * value.
 *
 * <p>Memory is bounded: per sensor the latest reading before the open snapshots and, for each grid
 * interval of the open window, the newest reading in it (at most (2·lateness + period)/period + 2
 * entries, since readings further ahead of the clock than the lateness are refused).
 *
 * <p>Readings must be in SI and checked by the caller for quality; one aligner serves one unit and
 * is not safe for use by several threads at once.
 */
public final class SnapshotAligner {

    /** The snapshot period when none is given. */
    public static final Duration DEFAULT_PERIOD = Duration.ofSeconds(1);

    /** The allowed lateness when none is given: no waiting. */
    public static final Duration DEFAULT_ALLOWED_LATENESS = Duration.ZERO;

    private final UnitDescription unit;
    private final long periodMillis;
    private final long latenessMillis;
    private final long[] maxAgeMillis;
    private final Sensor[] sensors;
    private final SensorTrack[] tracks;
    private final boolean releaseWhenComplete;

    private boolean clockSet;
    private long clockMillis;
    /** Whether the first reading has fixed the grid's start. */
    private boolean started;
    /** The next snapshot to emit; meaningful once {@link #started}. */
    private long nextSnapshotMillis;
    /** The grid's first snapshot, from when a sensor with no reading counts as known missing. */
    private long firstSnapshotMillis;
    /** Whether a reading came into the open window since the next snapshot was last found incomplete. */
    private boolean completenessToCheck;

    /** An aligner with {@link #DEFAULT_PERIOD} and {@link #DEFAULT_ALLOWED_LATENESS}. */
    public SnapshotAligner(UnitDescription unit) {
        this(unit, DEFAULT_PERIOD, DEFAULT_ALLOWED_LATENESS);
    }

    /**
     * @param unit            the unit; its sensor list fixes the sensor indexes and snapshot layout
     * @param period          time between snapshots, whole milliseconds, at least 1 ms
     * @param allowedLateness how long a snapshot stays open for late readings, whole milliseconds, ≥ 0
     */
    public SnapshotAligner(UnitDescription unit, Duration period, Duration allowedLateness) {
        this(unit, period, allowedLateness, false);
    }

    /**
     * @param unit                the unit; its sensor list fixes the sensor indexes and snapshot layout
     * @param period              time between snapshots, whole milliseconds, at least 1 ms
     * @param allowedLateness     how long a snapshot stays open for late readings, whole milliseconds,
     *                            ≥ 0; with {@code releaseWhenComplete} the bound for incomplete ones
     * @param releaseWhenComplete whether a complete snapshot is emitted as soon as the clock reaches
     *                            its time (see the class description)
     */
    public SnapshotAligner(UnitDescription unit, Duration period, Duration allowedLateness,
            boolean releaseWhenComplete) {
        this.releaseWhenComplete = releaseWhenComplete;
        this.unit = Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(period, "period");
        Objects.requireNonNull(allowedLateness, "allowedLateness");
        if (period.toMillis() < 1 || !period.equals(Duration.ofMillis(period.toMillis()))) {
            throw new IllegalArgumentException("snapshot period must be whole milliseconds, at least 1 ms, was " + period);
        }
        if (allowedLateness.isNegative() || !allowedLateness.equals(Duration.ofMillis(allowedLateness.toMillis()))) {
            throw new IllegalArgumentException("allowed lateness must be whole milliseconds, at least 0, was "
                    + allowedLateness);
        }
        this.periodMillis = period.toMillis();
        this.latenessMillis = allowedLateness.toMillis();
        this.sensors = unit.sensors().toArray(new Sensor[0]);
        this.maxAgeMillis = new long[sensors.length];
        this.tracks = new SensorTrack[sensors.length];
        int capacity = (int) Math.min(1 << 16, (2 * latenessMillis + periodMillis) / periodMillis + 2);
        for (int i = 0; i < sensors.length; i++) {
            maxAgeMillis[i] = sensors[i].maxAge().toMillis();
            tracks[i] = new SensorTrack(capacity);
        }
    }

    /** The unit this aligner serves. */
    public UnitDescription unit() {
        return unit;
    }

    /** The time of the next snapshot to be emitted, once the first reading has fixed the grid's start. */
    public OptionalLong nextSnapshotMillis() {
        return started ? OptionalLong.of(nextSnapshotMillis) : OptionalLong.empty();
    }

    /**
     * Offers one reading. The clock must have been set by {@link #advanceTo} first.
     *
     * @param sensorIndex the sensor's index in the unit's sensor list
     * @param tsMillis    the reading's timestamp, ms since 1970-01-01T00:00Z
     * @param valueSi     the value in the SI unit of the sensor's quantity
     * @return what was done with it
     * @throws IndexOutOfBoundsException if there is no sensor of that index
     * @throws IllegalStateException     if the clock has not been set
     */
    public Offer offer(int sensorIndex, long tsMillis, double valueSi) {
        Objects.checkIndex(sensorIndex, sensors.length);
        if (!clockSet) {
            throw new IllegalStateException("unit " + unit.id() + ": advance the clock before offering readings");
        }
        if (!Double.isFinite(valueSi)) {
            return Offer.NOT_FINITE;
        }
        if (!sensors[sensorIndex].isPlausible(valueSi)) {
            return Offer.IMPLAUSIBLE;
        }
        if (tsMillis > clockMillis + latenessMillis) {
            return Offer.AHEAD;
        }
        if (!started) {
            started = true;
            nextSnapshotMillis = slotOf(Math.max(tsMillis, clockMillis - latenessMillis));
            firstSnapshotMillis = nextSnapshotMillis;
        }
        SensorTrack track = tracks[sensorIndex];
        // Every snapshot such a reading could enter has been emitted; it can only be a later one's base.
        if (tsMillis <= nextSnapshotMillis - periodMillis) {
            return track.offerBase(tsMillis, valueSi);
        }
        Offer result = track.offerPending(slotOf(tsMillis), tsMillis, valueSi);
        if (result == Offer.ACCEPTED) {
            completenessToCheck = true;
        }
        return result;
    }

    /**
     * Moves the clock to {@code nowMillis} (a clock never runs back: an earlier time is ignored) and
     * emits, in time order, every snapshot before {@code nowMillis − allowedLateness}, then every
     * following one at or before {@code nowMillis} that is complete (see the class description). A
     * snapshot at exactly {@code nowMillis − allowedLateness} stays open, so that with no lateness a
     * reading stamped with the current time still enters the current snapshot.
     */
    public List<Snapshot> advanceTo(long nowMillis) {
        if (!clockSet || nowMillis > clockMillis) {
            clockMillis = nowMillis;
            clockSet = true;
        }
        List<Snapshot> due = emitThrough(clockMillis - latenessMillis - 1);
        if (!due.isEmpty()) {
            // The snapshot now next may have been complete already behind an incomplete one.
            completenessToCheck = true;
        }
        if (!releaseWhenComplete || !completenessToCheck || !started || nextSnapshotMillis > clockMillis) {
            // Nothing new came in, or the next snapshot's time has not come: checked once it has.
            return due;
        }
        List<Snapshot> out = null;
        while (nextSnapshotMillis <= clockMillis && isComplete(nextSnapshotMillis)) {
            if (out == null) {
                out = new ArrayList<>(due);
            }
            out.add(snapshotAt(nextSnapshotMillis));
            nextSnapshotMillis += periodMillis;
        }
        // Readings for the snapshot now next may all be in already; else the next accepted one re-checks.
        completenessToCheck = nextSnapshotMillis > clockMillis;
        return out == null ? due : out;
    }

    /**
     * Whether every expected sensor has a reading for the snapshot at {@code t}, the next to emit (so
     * every reading held pending is for {@code t} or later).
     */
    private boolean isComplete(long t) {
        for (int i = 0; i < sensors.length; i++) {
            SensorTrack track = tracks[i];
            if (track.size > 0 && track.slots[0] == t) {
                continue;
            }
            boolean expected = track.hasBase
                    ? t - track.baseMillis <= maxAgeMillis[i]
                    : t - firstSnapshotMillis < maxAgeMillis[i];
            if (expected) {
                return false;
            }
        }
        return true;
    }

    /**
     * Emits every snapshot at or before the clock without waiting for late readings, e.g. at the end
     * of a recording. Readings offered afterwards serve later snapshots only.
     */
    public List<Snapshot> drain() {
        return clockSet ? emitThrough(clockMillis) : List.of();
    }

    private List<Snapshot> emitThrough(long lastMillis) {
        if (!started || nextSnapshotMillis > lastMillis) {
            return List.of();
        }
        List<Snapshot> out = new ArrayList<>((int) Math.min(1024, (lastMillis - nextSnapshotMillis) / periodMillis + 1));
        while (nextSnapshotMillis <= lastMillis) {
            out.add(snapshotAt(nextSnapshotMillis));
            nextSnapshotMillis += periodMillis;
        }
        return out;
    }

    private Snapshot snapshotAt(long t) {
        double[] values = new double[sensors.length];
        SensorStatus[] status = new SensorStatus[sensors.length];
        for (int i = 0; i < sensors.length; i++) {
            SensorTrack track = tracks[i];
            track.settleThrough(t);
            if (!track.hasBase) {
                status[i] = SensorStatus.MISSING;
            } else {
                values[i] = track.baseValue;
                status[i] = t - track.baseMillis > maxAgeMillis[i] ? SensorStatus.STALE : SensorStatus.GOOD;
            }
        }
        return new Snapshot(Instant.ofEpochMilli(t), unit.id(), values, status);
    }

    /** Readings held for the open window of one sensor, for tests of the memory bound. */
    int heldForWindow(int sensorIndex) {
        return tracks[sensorIndex].size;
    }

    /** The first grid time at or after {@code tsMillis}: the first snapshot a reading can enter. */
    private long slotOf(long tsMillis) {
        return Math.floorDiv(tsMillis + periodMillis - 1, periodMillis) * periodMillis;
    }

    /**
     * One sensor's readings: the newest before the open window ("base") and, per grid interval of
     * the window, the newest reading in it, kept sorted by time.
     */
    private static final class SensorTrack {
        boolean hasBase;
        long baseMillis;
        double baseValue;

        long[] slots;
        long[] millis;
        double[] values;
        int size;

        SensorTrack(int capacity) {
            slots = new long[capacity];
            millis = new long[capacity];
            values = new double[capacity];
        }

        Offer offerBase(long ts, double value) {
            if (hasBase) {
                if (ts < baseMillis) {
                    return Offer.SUPERSEDED;
                }
                if (ts == baseMillis) {
                    return sameValue(baseValue, value) ? Offer.DUPLICATE : Offer.CONFLICT;
                }
            }
            hasBase = true;
            baseMillis = ts;
            baseValue = value;
            return Offer.ACCEPTED;
        }

        Offer offerPending(long slot, long ts, double value) {
            if (hasBase && ts == baseMillis) {
                return sameValue(baseValue, value) ? Offer.DUPLICATE : Offer.CONFLICT;
            }
            if (hasBase && ts < baseMillis) {
                return Offer.SUPERSEDED;
            }
            int i = 0;
            while (i < size && slots[i] < slot) {
                i++;
            }
            if (i < size && slots[i] == slot) {
                if (ts < millis[i]) {
                    return Offer.SUPERSEDED;
                }
                if (ts == millis[i]) {
                    return sameValue(values[i], value) ? Offer.DUPLICATE : Offer.CONFLICT;
                }
                millis[i] = ts;
                values[i] = value;
                return Offer.ACCEPTED;
            }
            if (size == slots.length) {
                grow();
            }
            System.arraycopy(slots, i, slots, i + 1, size - i);
            System.arraycopy(millis, i, millis, i + 1, size - i);
            System.arraycopy(values, i, values, i + 1, size - i);
            slots[i] = slot;
            millis[i] = ts;
            values[i] = value;
            size++;
            return Offer.ACCEPTED;
        }

        /** Folds every pending reading at or before {@code t} into the base, keeping the newest. */
        void settleThrough(long t) {
            int n = 0;
            while (n < size && millis[n] <= t) {
                if (!hasBase || millis[n] > baseMillis) {
                    hasBase = true;
                    baseMillis = millis[n];
                    baseValue = values[n];
                }
                n++;
            }
            if (n > 0) {
                System.arraycopy(slots, n, slots, 0, size - n);
                System.arraycopy(millis, n, millis, 0, size - n);
                System.arraycopy(values, n, values, 0, size - n);
                size -= n;
            }
        }

        /**
         * The window's bound on entries holds while the clock only moves forward; growing instead
         * of failing keeps a reading from being lost should a caller's clock misbehave.
         */
        private void grow() {
            int capacity = slots.length * 2;
            slots = Arrays.copyOf(slots, capacity);
            millis = Arrays.copyOf(millis, capacity);
            values = Arrays.copyOf(values, capacity);
        }

        private static boolean sameValue(double a, double b) {
            return Double.compare(a, b) == 0;
        }
    }
}
