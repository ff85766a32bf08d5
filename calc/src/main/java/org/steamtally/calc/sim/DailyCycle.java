package org.steamtally.calc.sim;

import java.time.Duration;
import java.time.Instant;
import java.util.Objects;

/**
 * The cooling-water inlet temperature's daily swing about its design value: a cosine of one day's
 * period, warmest at a fixed time of day (UTC), ΔT(t) = A · cos(2π (t − t_warmest) / 1 d).
 *
 * @param amplitudeK      A, K, within 0 to 15
 * @param warmestAfterMidnightUtc time of day of the maximum, within one day
 */
public record DailyCycle(double amplitudeK, Duration warmestAfterMidnightUtc) {

    /** No daily swing. */
    public static final DailyCycle NONE = new DailyCycle(0.0, Duration.ZERO);

    private static final long SECONDS_PER_DAY = 86_400L;

    public DailyCycle {
        if (!(amplitudeK >= 0.0 && amplitudeK <= 15.0)) {
            throw new IllegalArgumentException("daily cooling-water amplitude must lie within 0 K to 15 K, was "
                    + amplitudeK + " K");
        }
        Objects.requireNonNull(warmestAfterMidnightUtc, "warmestAfterMidnightUtc");
        if (warmestAfterMidnightUtc.isNegative() || warmestAfterMidnightUtc.getSeconds() >= SECONDS_PER_DAY) {
            throw new IllegalArgumentException("time of the warmest water must lie within one day, was "
                    + warmestAfterMidnightUtc);
        }
    }

    /** The shift of the inlet temperature from its design value at an instant, K. */
    public double shiftK(Instant t) {
        if (amplitudeK == 0.0) {
            return 0.0;
        }
        double secondOfDay = Math.floorMod(t.getEpochSecond(), SECONDS_PER_DAY) + t.getNano() * 1e-9;
        double phase = (secondOfDay - warmestAfterMidnightUtc.toNanos() * 1e-9) / SECONDS_PER_DAY;
        return amplitudeK * Math.cos(2.0 * Math.PI * phase);
    }
}
