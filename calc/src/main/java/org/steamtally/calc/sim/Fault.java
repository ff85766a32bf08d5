package org.steamtally.calc.sim;

import java.time.Duration;
import java.time.Instant;
import java.util.Objects;
import java.util.OptionalDouble;

/**
 * A fault of one sensor, active from {@code start} (inclusive) for {@code duration} (exclusive end).
 * Magnitudes are SI, in the sensor's SI unit; {@link Simulator#sigmaOf} gives a sensor's standard
 * uncertainty for faults sized in multiples of it.
 */
public sealed interface Fault {

    String sensorId();

    Instant start();

    Duration duration();

    /** Whether the fault is active at t: start ≤ t &lt; start + duration. */
    default boolean activeAt(Instant t) {
        return !t.isBefore(start()) && t.isBefore(start().plus(duration()));
    }

    /** The fault's kind as written in a scenario, e.g. {@code "bias"}. */
    String kind();

    /** A constant offset added to the reading. */
    record Bias(String sensorId, Instant start, Duration duration, double offsetSi) implements Fault {
        public Bias {
            check(sensorId, start, duration);
            finite(offsetSi, "bias offset");
        }

        public String kind() {
            return "bias";
        }
    }

    /** An offset growing linearly from zero at the start: rate · (t − start). */
    record Drift(String sensorId, Instant start, Duration duration, double ratePerSecondSi) implements Fault {
        public Drift {
            check(sensorId, start, duration);
            finite(ratePerSecondSi, "drift rate");
        }

        public String kind() {
            return "drift";
        }
    }

    /**
     * The reading freezes: at the given value, or, when none is given, at the first reading the
     * sensor gives while the fault is active.
     */
    record Stuck(String sensorId, Instant start, Duration duration, OptionalDouble valueSi) implements Fault {
        public Stuck {
            check(sensorId, start, duration);
            Objects.requireNonNull(valueSi, "valueSi");
            if (valueSi.isPresent()) {
                finite(valueSi.getAsDouble(), "stuck value");
            }
        }

        public String kind() {
            return "stuck";
        }
    }

    /**
     * Each reading, with the given probability, jumps by ± the amplitude (sign at random, equally likely).
     */
    record Spikes(String sensorId, Instant start, Duration duration, double amplitudeSi, double probability)
            implements Fault {
        public Spikes {
            check(sensorId, start, duration);
            finite(amplitudeSi, "spike amplitude");
            if (!(probability > 0.0 && probability <= 1.0)) {
                throw new IllegalArgumentException("spike probability must lie within 0 (exclusive) and 1, was " + probability);
            }
        }

        public String kind() {
            return "spikes";
        }
    }

    /** The sensor's noise is multiplied by a factor. */
    record NoiseIncrease(String sensorId, Instant start, Duration duration, double factor) implements Fault {
        public NoiseIncrease {
            check(sensorId, start, duration);
            if (!(factor >= 0.0) || !Double.isFinite(factor)) {
                throw new IllegalArgumentException("noise factor must be a finite number ≥ 0, was " + factor);
            }
        }

        public String kind() {
            return "noise";
        }
    }

    /** The sensor sends nothing. */
    record Dropout(String sensorId, Instant start, Duration duration) implements Fault {
        public Dropout {
            check(sensorId, start, duration);
        }

        public String kind() {
            return "dropout";
        }
    }

    private static void check(String sensorId, Instant start, Duration duration) {
        Objects.requireNonNull(sensorId, "sensorId");
        Objects.requireNonNull(start, "start");
        Objects.requireNonNull(duration, "duration");
        if (duration.isNegative() || duration.isZero()) {
            throw new IllegalArgumentException("fault on " + sensorId + ": duration must be positive, was " + duration);
        }
    }

    private static void finite(double v, String what) {
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException(what + " must be finite, was " + v);
        }
    }
}
