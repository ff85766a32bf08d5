package org.steamtally.calc.signal;

import java.util.HashMap;
import java.util.Map;
import java.util.Objects;

import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.reconcile.ChiSquare;

/**
 * How the signal tests of a unit's sensors are made (docs/DETECTION.md, "The sensor's own signal").
 * The limits themselves (how long a reading may stay unchanged, the factor on the scatter quantile)
 * are the alarm definitions' limits of {@code frozen_sensor} and {@code erratic_sensor}.
 *
 * @param windowReadings       n, the good readings in the scatter window (n − 1 successive
 *                             differences), 3 to 100,000
 * @param warmUpReadings       how many successive differences the expected scatter is averaged over
 *                             before the scatter test decides, when no noise is declared; ≥ 1
 * @param learningReadings     the time constant, in readings, of the slow exponential average that
 *                             keeps the expected scatter up to date once warm; ≥ 1
 * @param falseAlarmProbability the probability, per snapshot and sensor, that healthy white noise
 *                             reaches the scatter limit with the factor 1.0; in (0, 0.5)
 * @param declaredNoiseSi      optional standard deviation of each sensor's reading-to-reading noise,
 *                             by sensor id, SI, &gt; 0: the starting value of the expected scatter
 *                             (2σ²), which ends the warm-up at once
 * @param resolutionSi         optional resolution by sensor id, SI, ≥ 0: a change of at most this
 *                             much does not count as a change for the frozen-value test (0, the
 *                             default, asks for bit-identical readings)
 */
public record SignalSettings(int windowReadings, int warmUpReadings, int learningReadings,
                             double falseAlarmProbability, Map<String, Double> declaredNoiseSi,
                             Map<String, Double> resolutionSi) {

    /**
     * One minute of readings at 1 Hz: short enough that a noise increase is found within the 60 s
     * an operator would call prompt, long enough that the ratio's standard deviation
     * (√(3m − 1)/m, m = n − 1) is 0.22.
     */
    public static final int WINDOW_DEFAULT = 60;
    /** 15 min at 1 Hz: the learned expected scatter then has a relative standard deviation of √(3/900) ≈ 6 %. */
    public static final int WARM_UP_DEFAULT = 900;
    /** 1 h at 1 Hz: slow enough that a fault of a few minutes hardly moves what was learned. */
    public static final int LEARNING_DEFAULT = 3600;
    /**
     * 1e-7 per snapshot and sensor. A unit of 36 sensors at 1 Hz makes 3.1e6 (snapshot, sensor)
     * pairs a day, so about 0.31 of them reach the limit by chance; every alarm needs at least one
     * (the deadband applies only once the limit was reached), so healthy noise raises at most 0.31
     * alarms a day, however the sliding window groups them. docs/DETECTION.md measures 0.10.
     */
    public static final double FALSE_ALARM_PROBABILITY_DEFAULT = 1e-7;

    /** The defaults, with nothing declared per sensor. */
    public static final SignalSettings DEFAULTS = new SignalSettings(WINDOW_DEFAULT, WARM_UP_DEFAULT,
            LEARNING_DEFAULT, FALSE_ALARM_PROBABILITY_DEFAULT, Map.of(), Map.of());

    public SignalSettings {
        if (windowReadings < 3 || windowReadings > 100_000) {
            throw new IllegalArgumentException("the scatter window must hold 3 to 100000 readings, was " + windowReadings);
        }
        if (warmUpReadings < 1) {
            throw new IllegalArgumentException("the warm-up must be at least 1 reading, was " + warmUpReadings);
        }
        if (learningReadings < 1) {
            throw new IllegalArgumentException("the learning time constant must be at least 1 reading, was "
                    + learningReadings);
        }
        if (!(falseAlarmProbability > 0.0 && falseAlarmProbability < 0.5)) {
            throw new IllegalArgumentException("the false-alarm probability must lie within 0 and 0.5, was "
                    + falseAlarmProbability);
        }
        declaredNoiseSi = Map.copyOf(Objects.requireNonNull(declaredNoiseSi, "declaredNoiseSi"));
        resolutionSi = Map.copyOf(Objects.requireNonNull(resolutionSi, "resolutionSi"));
        declaredNoiseSi.forEach((id, v) -> {
            if (!(v > 0.0) || !Double.isFinite(v)) {
                throw new IllegalArgumentException("sensor " + id + ": declared noise must be a positive number, was " + v);
            }
        });
        resolutionSi.forEach((id, v) -> {
            if (!(v >= 0.0) || !Double.isFinite(v)) {
                throw new IllegalArgumentException("sensor " + id + ": resolution must be a number ≥ 0, was " + v);
            }
        });
    }

    /**
     * The same settings with only the declarations of the unit's own sensors: a site's settings
     * declare sensors of all its units, a check is made per unit.
     */
    public SignalSettings forUnit(UnitDescription unit) {
        Map<String, Double> noise = new HashMap<>();
        declaredNoiseSi.forEach((id, v) -> {
            if (unit.sensor(id).isPresent()) {
                noise.put(id, v);
            }
        });
        Map<String, Double> resolution = new HashMap<>();
        resolutionSi.forEach((id, v) -> {
            if (unit.sensor(id).isPresent()) {
                resolution.put(id, v);
            }
        });
        return new SignalSettings(windowReadings, warmUpReadings, learningReadings, falseAlarmProbability, noise,
                resolution);
    }

    /** The same settings with another window. */
    public SignalSettings withWindow(int readings) {
        return new SignalSettings(readings, warmUpReadings, learningReadings, falseAlarmProbability, declaredNoiseSi,
                resolutionSi);
    }

    /** The same settings with another warm-up. */
    public SignalSettings withWarmUp(int readings) {
        return new SignalSettings(windowReadings, readings, learningReadings, falseAlarmProbability, declaredNoiseSi,
                resolutionSi);
    }

    /** The same settings with another learning time constant. */
    public SignalSettings withLearning(int readings) {
        return new SignalSettings(windowReadings, warmUpReadings, readings, falseAlarmProbability, declaredNoiseSi,
                resolutionSi);
    }

    /** The same settings with these declared noises, by sensor id, SI. */
    public SignalSettings withDeclaredNoise(Map<String, Double> noiseSi) {
        return new SignalSettings(windowReadings, warmUpReadings, learningReadings, falseAlarmProbability, noiseSi,
                resolutionSi);
    }

    /** The same settings with these resolutions, by sensor id, SI. */
    public SignalSettings withResolution(Map<String, Double> resolution) {
        return new SignalSettings(windowReadings, warmUpReadings, learningReadings, falseAlarmProbability,
                declaredNoiseSi, resolution);
    }

    /**
     * The variance of the scatter ratio R = δ²/E[δ²] of white normal noise over a window of n
     * readings, m = n − 1 differences d_i = x_{i+1} − x_i: Var(d²) = 2(2σ²)² = 8σ⁴, neighbouring
     * differences share one reading, Cov(d_i, d_{i+1}) = −σ², so Cov(d_i², d_{i+1}²) = 2σ⁴ (Isserlis),
     * all others 0; Var(Σd²) = 8mσ⁴ + 2(m − 1)·2σ⁴ = (12m − 4)σ⁴, and with E[Σd²] = 2mσ²,
     * Var(R) = (3m − 1)/m². This is von Neumann's variance of the mean square successive difference
     * (J. von Neumann, Ann. Math. Stat. 12, 1941; recalled from memory), 4σ⁴(3n − 4)/(n − 1)².
     */
    public static double ratioVariance(int windowReadings) {
        double m = windowReadings - 1.0;
        return (3.0 * m - 1.0) / (m * m);
    }

    /**
     * The scatter ratio that healthy white noise reaches with the settings' false-alarm
     * probability: R approximated as χ²_ν/ν with ν = 2/Var(R) degrees of freedom (the moment match
     * of a positive quadratic form, after Satterthwaite), so its upper quantile is
     * χ²_ν(1 − p)/ν. For n = 60 and p = 1e-7: ν = 39.6, 2.634. docs/DETECTION.md checks it by
     * simulation.
     */
    public double scatterQuantile() {
        double nu = 2.0 / ratioVariance(windowReadings);
        return ChiSquare.quantile(1.0 - falseAlarmProbability, nu) / nu;
    }
}
