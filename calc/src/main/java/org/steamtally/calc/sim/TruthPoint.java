package org.steamtally.calc.sim;

import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * Every true value of a unit at one operating point: one per sensor, in the unit's sensor order,
 * the flowing states, the cycle figures, and the residuals that the cycle model should find in a
 * noise-free snapshot because of a modelled loss it does not know of (closure id to W; a closure
 * not named should be zero).
 *
 * <p>{@link #sensorValuesSi()} returns a copy, so a caller may hand it to a snapshot, which owns
 * its arrays.
 */
public record TruthPoint(OperatingConditions conditions, List<String> sensorIds, double[] sensorValuesSi,
                         List<TruthState> states, TruthFigures figures, Map<String, Double> expectedResidualsW) {

    public TruthPoint {
        Objects.requireNonNull(conditions, "conditions");
        sensorIds = List.copyOf(sensorIds);
        Objects.requireNonNull(sensorValuesSi, "sensorValuesSi");
        if (sensorIds.size() != sensorValuesSi.length) {
            throw new IllegalArgumentException(sensorIds.size() + " sensor ids for " + sensorValuesSi.length + " values");
        }
        states = List.copyOf(states);
        Objects.requireNonNull(figures, "figures");
        expectedResidualsW = Map.copyOf(expectedResidualsW);
        sensorValuesSi = sensorValuesSi.clone();
    }

    /** The true value of every sensor, SI, in the unit's sensor order; a fresh copy. */
    @Override
    public double[] sensorValuesSi() {
        return sensorValuesSi.clone();
    }

    /** The true value of one sensor, SI. */
    public double valueSi(String sensorId) {
        int i = sensorIds.indexOf(sensorId);
        if (i < 0) {
            throw new IllegalArgumentException("no sensor \"" + sensorId + "\" in this unit; sensors: " + sensorIds);
        }
        return sensorValuesSi[i];
    }

    /** The true state of one flowing state. */
    public TruthState state(String stateId) {
        return states.stream().filter(s -> s.id().equals(stateId)).findFirst()
                .orElseThrow(() -> new IllegalArgumentException("no flowing state \"" + stateId + "\" in this unit"));
    }
}
