package org.steamtally.calc.sim;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Objects;

/**
 * Load over time: an initial load, then linear ramps to new loads, each from its start instant over
 * its duration, the load held between ramps. Loads are fractions of the design main flow.
 *
 * @param initialLoad the load before the first ramp, within (0, 1.1]
 * @param ramps       in time order, not overlapping
 */
public record LoadProgram(double initialLoad, List<Ramp> ramps) {

    public LoadProgram {
        checkLoad(initialLoad, "initial load");
        ramps = List.copyOf(ramps);
        for (int k = 1; k < ramps.size(); k++) {
            Ramp before = ramps.get(k - 1);
            if (ramps.get(k).start().isBefore(before.start().plus(before.duration()))) {
                throw new IllegalArgumentException("load ramp " + k + " starts at " + ramps.get(k).start()
                        + ", before ramp " + (k - 1) + " ends at " + before.start().plus(before.duration()));
            }
        }
    }

    /** A constant load. */
    public static LoadProgram constant(double load) {
        return new LoadProgram(load, List.of());
    }

    /**
     * One linear change of load.
     *
     * @param start      when the ramp begins
     * @param duration   how long it takes, ≥ 0 (0 is a step)
     * @param targetLoad the load at its end, within (0, 1.1]
     */
    public record Ramp(Instant start, Duration duration, double targetLoad) {
        public Ramp {
            Objects.requireNonNull(start, "start");
            Objects.requireNonNull(duration, "duration");
            if (duration.isNegative()) {
                throw new IllegalArgumentException("load ramp duration must not be negative, was " + duration);
            }
            checkLoad(targetLoad, "ramp target load");
        }
    }

    private static void checkLoad(double load, String what) {
        if (!(load > 0.0 && load <= 1.1)) {
            throw new IllegalArgumentException(what + " must lie within 0 (exclusive) and 1.1, was " + load);
        }
    }

    /** The load at an instant. */
    public double loadAt(Instant t) {
        double load = initialLoad;
        for (Ramp r : ramps) {
            if (t.isBefore(r.start())) {
                break;
            }
            Instant end = r.start().plus(r.duration());
            if (!t.isBefore(end)) {
                load = r.targetLoad();
            } else {
                double f = (double) Duration.between(r.start(), t).toNanos() / r.duration().toNanos();
                load += f * (r.targetLoad() - load);
                break;
            }
        }
        return load;
    }
}
