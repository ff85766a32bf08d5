package org.steamtally.calc.signal;

import java.util.Objects;

/**
 * The two tests of one sensor's own signal at one snapshot. Every number is finite; a test that
 * cannot decide has the verdict {@link SignalVerdict#NOT_DECIDED} and a statistic of 0.
 *
 * @param sensorId          the sensor
 * @param frozenS           how long its reading has not changed by more than its resolution, s, ≥ 0
 * @param frozenLimitS      the frozen-value limit, s, &gt; 0
 * @param frozen            the frozen-value verdict
 * @param scatterRatio      the window's mean square successive difference over the expected one
 *                          (1 for healthy white noise), ≥ 0
 * @param scatterLimit      the limit on that ratio, &gt; 0
 * @param scatter           the excess-scatter verdict
 * @param expectedMssdSi2   the learned (or declared) expected mean square successive difference, in
 *                          the square of the sensor's SI unit, ≥ 0; 0 before anything is known
 */
public record SensorSignal(String sensorId, double frozenS, double frozenLimitS, SignalVerdict frozen,
                           double scatterRatio, double scatterLimit, SignalVerdict scatter,
                           double expectedMssdSi2) {

    public SensorSignal {
        Objects.requireNonNull(sensorId, "sensorId");
        Objects.requireNonNull(frozen, "frozen");
        Objects.requireNonNull(scatter, "scatter");
        if (!(frozenS >= 0.0) || !Double.isFinite(frozenS) || !(frozenLimitS > 0.0) || !Double.isFinite(frozenLimitS)
                || !(scatterRatio >= 0.0) || !Double.isFinite(scatterRatio) || !(scatterLimit > 0.0)
                || !Double.isFinite(scatterLimit) || !(expectedMssdSi2 >= 0.0) || !Double.isFinite(expectedMssdSi2)) {
            throw new IllegalArgumentException("sensor " + sensorId + ": signal statistics must be finite and not negative,"
                    + " limits positive: frozen " + frozenS + " s of " + frozenLimitS + " s, scatter ratio "
                    + scatterRatio + " of " + scatterLimit + ", expected MSSD " + expectedMssdSi2);
        }
    }

    /** Whether either test failed, i.e. the sensor's reading is not to be trusted. */
    public boolean failed() {
        return frozen == SignalVerdict.FAIL || scatter == SignalVerdict.FAIL;
    }
}
