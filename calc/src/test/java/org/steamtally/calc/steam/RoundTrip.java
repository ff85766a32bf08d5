package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.function.DoubleUnaryOperator;

/** Seeded grids of states over a region's validity range, for round-trip property tests. */
final class RoundTrip {

    /** Round trips must agree to 1e-9 relative; a refined backward method aims for a few ulps. */
    static final double RELATIVE_TOLERANCE = 1e-9;
    /**
     * h and s pass through zero in region 1 (h at the triple point is 0.6 J/kg, s is 0 there by
     * definition), where a relative tolerance means nothing; there the comparison is relative to
     * these magnitudes, 1 kJ/kg and 1 J/(kg·K), small against the region's values.
     */
    static final double ENTHALPY_SCALE = 1e3;
    static final double ENTROPY_SCALE = 1.0;

    /** States per region: enough to reach every corner, few enough for a fast suite. */
    private static final int SAMPLES = 3000;
    private static final long SEED = 0x1F97L;

    private RoundTrip() {
    }

    record State(double p, double t) {
        @Override
        public String toString() {
            return "p = " + p + " Pa, T = " + t + " K";
        }
    }

    /** Region 1: 273.15 K to 623.15 K, ps(T) to 100 MPa (IAPWS R7-97(2012), section 5). */
    static List<State> region1Grid() {
        return grid(273.15, 623.15, Saturation::pressure, t -> 100e6, false);
    }

    /**
     * Region 2 (IAPWS R7-97(2012), section 6): up to ps(T) below 623.15 K, up to the B23 line to
     * 863.15 K and up to 100 MPa to 1073.15 K; down to the triple-point pressure, sampled
     * log-uniformly in p.
     */
    static List<State> region2Grid() {
        DoubleUnaryOperator pMax = t -> t <= 623.15 ? Saturation.pressure(t) : t <= 863.15 ? B23.pressure(t) : 100e6;
        return grid(273.15, 1073.15, t -> 611.213, pMax, true);
    }

    /** Region 5: 1073.15 K to 2273.15 K, up to 50 MPa (IAPWS R7-97(2012), section 8). */
    static List<State> region5Grid() {
        return grid(1073.15, 2273.15, t -> 611.213, t -> 50e6, true);
    }

    private static List<State> grid(double tMin, double tMax, DoubleUnaryOperator pMin, DoubleUnaryOperator pMax,
                                    boolean logPressure) {
        SplittableRandom random = new SplittableRandom(SEED);
        List<State> states = new ArrayList<>(SAMPLES + 4);
        for (int k = 0; k < SAMPLES; k++) {
            double t = tMin + (tMax - tMin) * random.nextDouble();
            states.add(state(t, pMin, pMax, random.nextDouble(), logPressure));
        }
        // The four corners, where the iterations have their hardest starts.
        for (double t : new double[] {tMin, tMax}) {
            states.add(state(t, pMin, pMax, 0.0, logPressure));
            states.add(state(t, pMin, pMax, 1.0, logPressure));
        }
        return states;
    }

    private static State state(double t, DoubleUnaryOperator pMin, DoubleUnaryOperator pMax, double u,
                               boolean logPressure) {
        double lo = pMin.applyAsDouble(t);
        double hi = pMax.applyAsDouble(t);
        double p = logPressure ? lo * Math.pow(hi / lo, u) : lo + (hi - lo) * u;
        return new State(Math.min(Math.max(p, lo), hi), t);
    }

    static void assertSame(double expected, double actual, double scale, String what, State state) {
        assertTrue(Double.isFinite(actual), () -> what + " is not finite at " + state);
        double tolerance = RELATIVE_TOLERANCE * Math.max(Math.abs(expected), scale);
        assertEquals(expected, actual, tolerance, () -> what + " round trip at " + state);
    }
}
