package org.steamtally.calc.alarm;

import java.util.List;
import java.util.Objects;

/**
 * One sensor the reconciliation names as a likely gross error, as the alarm engine needs it.
 *
 * @param sensorId       the sensor, e.g. {@code "FT-101"}
 * @param biasSi         its estimated bias (measured less reconciled value), in the sensor's SI unit
 * @param sigmaSi        the standard uncertainty of that estimate, same unit, &gt; 0
 * @param testValue      its individual test value (adjustment over the standard deviation of the
 *                       adjustment); the alarm compares |testValue| with its limit
 * @param equivalenceSet the other sensors the balances cannot tell apart from this one; empty when
 *                       this one is singled out
 */
public record SuspectInput(String sensorId, double biasSi, double sigmaSi, double testValue,
                           List<String> equivalenceSet) {

    public SuspectInput {
        AlarmText.requireGiven(sensorId, "sensorId");
        equivalenceSet = List.copyOf(equivalenceSet);
        if (!Double.isFinite(biasSi) || !(sigmaSi > 0.0) || !Double.isFinite(sigmaSi) || !Double.isFinite(testValue)) {
            throw new IllegalArgumentException("suspect " + sensorId + ": bias " + biasSi + ", sigma " + sigmaSi
                    + " and test value " + testValue + " must be finite with sigma > 0");
        }
        Objects.requireNonNull(equivalenceSet, "equivalenceSet");
    }
}
