package org.steamtally.calc.sim;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import org.steamtally.calc.cycle.Snapshot;

/**
 * One step of the simulator: the truth, the aligned snapshot of what the instruments read (a
 * sensor in dropout is {@link Snapshot.SensorStatus#MISSING}), and the same readings as records,
 * one per sensor that sent one, in sensor order.
 */
public record SimulatedSample(Instant timestamp, TruthPoint truth, Snapshot snapshot, List<SimulatedReading> readings) {

    public SimulatedSample {
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(truth, "truth");
        Objects.requireNonNull(snapshot, "snapshot");
        readings = List.copyOf(readings);
    }
}
