package org.steamtally.calc.signal;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.function.ToDoubleFunction;

import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Tests each sensor's own signal, independent of the balances, so that it works for every sensor,
 * redundant or not (docs/DETECTION.md, "The sensor's own signal"):
 * <ul>
 * <li><b>frozen value</b>: how long the reading has not changed by more than the sensor's resolution
 *     (bit-identical by default), against a limit in seconds. A live transmitter's last digits always
 *     move (common practice).</li>
 * <li><b>excess scatter</b>: the mean square successive difference δ² = Σ(x_{i+1} − x_i)²/(n − 1)
 *     over a window of the last n good readings (von Neumann 1941), over the expected one, which is
 *     learned from the sensor's own healthy history. Differences cancel a slow load change, so the
 *     ratio rises with noise and spikes, not with the plant moving. Each squared difference counts at
 *     most {@link #CLIP} times the expected one, so that one glitch alone cannot raise the test.</li>
 * </ul>
 *
 * <p>The expected scatter starts from a declared noise σ (as 2σ²) when the settings give one, else
 * from the plain mean of the first {@code warmUpReadings} squared differences, during which the test
 * does not decide; afterwards it follows an exponential average with time constant
 * {@code learningReadings}, updated only while neither test fails, so a fault is not learned.
 *
 * <p>Time is the snapshots' own timestamps. Pure logic, not thread-safe: one check per unit, called
 * from the unit's thread.
 */
public final class SignalCheck {

    /** The most one squared difference counts, in multiples of the expected one: |d| up to 5 σ_d. */
    public static final double CLIP = 25.0;

    private final String unitId;
    private final SignalSettings settings;
    private final Track[] tracks;

    /**
     * @param unit          the unit: its sensors, in snapshot order
     * @param settings      window, warm-up, learning and per-sensor declarations
     * @param frozenLimitS  each sensor's frozen-value limit, s, &gt; 0, by sensor id
     * @param scatterFactor each sensor's factor on {@link SignalSettings#scatterQuantile()}, &gt; 0, by sensor id
     * @throws IllegalArgumentException naming the sensor and the value, for a limit that is not a
     *                                  positive number or a declaration of a sensor the unit lacks
     */
    public SignalCheck(UnitDescription unit, SignalSettings settings, ToDoubleFunction<String> frozenLimitS,
                       ToDoubleFunction<String> scatterFactor) {
        this.unitId = unit.id();
        this.settings = Objects.requireNonNull(settings, "settings");
        List<Sensor> sensors = unit.sensors();
        for (String id : settings.declaredNoiseSi().keySet()) {
            requireSensor(unit, id, "declared noise");
        }
        for (String id : settings.resolutionSi().keySet()) {
            requireSensor(unit, id, "resolution");
        }
        double quantile = settings.scatterQuantile();
        tracks = new Track[sensors.size()];
        for (int i = 0; i < tracks.length; i++) {
            String id = sensors.get(i).id();
            double frozen = frozenLimitS.applyAsDouble(id);
            double factor = scatterFactor.applyAsDouble(id);
            if (!(frozen > 0.0) || !Double.isFinite(frozen)) {
                throw new IllegalArgumentException("sensor " + id + ": the frozen-value limit must be a positive number of"
                        + " seconds, was " + frozen);
            }
            if (!(factor > 0.0) || !Double.isFinite(factor)) {
                throw new IllegalArgumentException("sensor " + id + ": the factor on the scatter limit must be a positive"
                        + " number, was " + factor);
            }
            Double noise = settings.declaredNoiseSi().get(id);
            tracks[i] = new Track(id, settings.windowReadings() - 1, frozen, factor * quantile,
                    settings.resolutionSi().getOrDefault(id, 0.0), noise == null ? 0.0 : 2.0 * noise * noise);
        }
    }

    /** A check with one frozen limit and one scatter factor for every sensor. */
    public SignalCheck(UnitDescription unit, SignalSettings settings, double frozenLimitS, double scatterFactor) {
        this(unit, settings, id -> frozenLimitS, id -> scatterFactor);
    }

    private static void requireSensor(UnitDescription unit, String id, String what) {
        if (unit.sensor(id).isEmpty()) {
            throw new IllegalArgumentException("a " + what + " is declared for sensor \"" + id + "\", which unit "
                    + unit.id() + " does not have");
        }
    }

    /** The settings in force. */
    public SignalSettings settings() {
        return settings;
    }

    /**
     * Takes one snapshot's readings and tests every sensor.
     *
     * @throws IllegalArgumentException when the snapshot is of another unit or has not one value per
     *                                  sensor; nothing is changed
     */
    public SignalReport check(Snapshot snapshot) {
        if (!snapshot.unitId().equals(unitId) || snapshot.valuesSi().length != tracks.length) {
            throw new IllegalArgumentException("signal check of unit " + unitId + " with " + tracks.length
                    + " sensors was given a snapshot of unit " + snapshot.unitId() + " with "
                    + snapshot.valuesSi().length + " values");
        }
        long nowMs = snapshot.timestamp().toEpochMilli();
        double[] values = snapshot.valuesSi();
        Snapshot.SensorStatus[] status = snapshot.status();
        List<SensorSignal> out = new ArrayList<>(tracks.length);
        for (int i = 0; i < tracks.length; i++) {
            double v = values[i];
            boolean good = status[i] == Snapshot.SensorStatus.GOOD && Double.isFinite(v);
            out.add(tracks[i].take(nowMs, good, v, settings));
        }
        return new SignalReport(snapshot.timestamp(), unitId, out);
    }

    /** One sensor's state: primitives only. */
    private static final class Track {
        final String id;
        final double frozenLimitS;
        final double scatterLimit;
        final double resolution;
        /** Squared successive differences, clipped, newest at {@code pos − 1}. */
        final double[] ring;
        int count;
        int pos;
        double sum;
        int sinceResum;

        boolean hasLast;
        double last;
        boolean inRun;
        double runValue;
        long runSinceMs;

        /** The expected squared successive difference; during warm-up the running mean. */
        double expected;
        long learned;
        boolean warm;

        Track(String id, int differences, double frozenLimitS, double scatterLimit, double resolution,
              double declaredExpected) {
            this.id = id;
            this.ring = new double[differences];
            this.frozenLimitS = frozenLimitS;
            this.scatterLimit = scatterLimit;
            this.resolution = resolution;
            if (declaredExpected > 0.0) {
                expected = declaredExpected;
                warm = true;
            }
        }

        SensorSignal take(long nowMs, boolean good, double v, SignalSettings settings) {
            if (!good) {
                // A gap: neither a run of equal readings nor a difference spans it.
                inRun = false;
                hasLast = false;
                return new SensorSignal(id, 0.0, frozenLimitS, SignalVerdict.NOT_DECIDED, 0.0, scatterLimit,
                        SignalVerdict.NOT_DECIDED, expected);
            }
            // Frozen: a deliberate exact comparison when the resolution is 0 (bit-identical readings).
            if (!inRun || Math.abs(v - runValue) > resolution) {
                inRun = true;
                runValue = v;
                runSinceMs = nowMs;
            }
            double frozenS = Math.max(0L, nowMs - runSinceMs) / 1000.0;
            SignalVerdict frozen = frozenS >= frozenLimitS ? SignalVerdict.FAIL : SignalVerdict.PASS;

            // The squared step from the last good reading; none right after a start or a gap.
            boolean stepped = hasLast;
            double d2 = 0.0;
            if (stepped) {
                double d = v - last;
                d2 = d * d;
                push(warm && expected > 0.0 ? Math.min(d2, CLIP * expected) : d2);
            }
            hasLast = true;
            last = v;

            double ratio = 0.0;
            SignalVerdict scatter = SignalVerdict.NOT_DECIDED;
            if (warm && expected > 0.0 && count == ring.length) {
                ratio = Math.max(0.0, sum / count / expected);
                scatter = ratio >= scatterLimit ? SignalVerdict.FAIL : SignalVerdict.PASS;
            }
            if (frozen == SignalVerdict.FAIL && !warm) {
                // Held readings are no history of the sensor's scatter: warm up afresh once it moves.
                learned = 0;
                expected = 0.0;
            } else if (stepped && frozen != SignalVerdict.FAIL && scatter != SignalVerdict.FAIL) {
                learn(d2, settings);
            }
            return new SensorSignal(id, frozenS, frozenLimitS, frozen, ratio, scatterLimit, scatter, expected);
        }

        private void push(double x) {
            if (count == ring.length) {
                sum -= ring[pos];
            } else {
                count++;
            }
            ring[pos] = x;
            sum += x;
            pos = (pos + 1) % ring.length;
            // The running sum loses what it subtracts to rounding; start it afresh once per window.
            if (++sinceResum >= ring.length) {
                sinceResum = 0;
                double s = 0.0;
                for (int k = 0; k < count; k++) {
                    s += ring[k];
                }
                sum = s;
            }
        }

        private void learn(double d2, SignalSettings settings) {
            if (warm && !(expected > 0.0)) {
                // Nothing learned (a sensor that has not moved since it started): one difference
                // would be a poor expected value, so the warm-up starts afresh.
                warm = false;
                learned = 0;
                expected = 0.0;
            }
            if (!warm) {
                learned++;
                expected += (d2 - expected) / learned;
                if (learned >= settings.warmUpReadings()) {
                    warm = true;
                }
                return;
            }
            expected += (Math.min(d2, CLIP * expected) - expected) / settings.learningReadings();
        }
    }
}
