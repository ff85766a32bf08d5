package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.steam.Steam;
import org.steamtally.calc.steam.SteamState;

/**
 * The allocation-free state holder gives the same states as the {@link Steam} facade, including
 * on the shortcut it takes below the region-1/3 saturation pressure, and derivatives that match
 * central differences of the facade.
 */
class StatePointTest {

    private static final long SEED = 97L;
    /** Both paths call the same region equations; only the iteration end points may differ by rounding. */
    private static final double RELATIVE_TOLERANCE = 1e-11;

    @Test
    void pressureEntropyAndPressureEnthalpyStatesMatchTheFacadeOnASeededGrid() {
        SplittableRandom random = new SplittableRandom(SEED);
        StatePoint point = new StatePoint();
        for (int k = 0; k < 2_000; k++) {
            double p = Math.exp(random.nextDouble(Math.log(1e3), Math.log(30e6)));
            double t = random.nextDouble(280.0, 1070.0);
            SteamState reference = Steam.statePT(p, t);
            String where = "seed " + SEED + ", p = " + p + " Pa, T = " + t + " K";
            point.setPS(p, reference.entropyJPerKgK());
            SteamState ps = Steam.statePS(p, reference.entropyJPerKgK());
            assertClose(ps.temperatureK(), point.T, "T(p,s) at " + where);
            assertClose(ps.enthalpyJPerKg(), point.h, "h(p,s) at " + where);
            assertClose(ps.specificVolumeM3PerKg(), point.v, "v(p,s) at " + where);
            point.setPH(p, reference.enthalpyJPerKg());
            SteamState ph = Steam.statePH(p, reference.enthalpyJPerKg());
            assertClose(ph.temperatureK(), point.T, "T(p,h) at " + where);
            assertClose(ph.entropyJPerKgK(), point.s, "s(p,h) at " + where);
            assertClose(ph.specificVolumeM3PerKg(), point.v, "v(p,h) at " + where);
        }
    }

    @Test
    void wetStatesFromEnthalpyAndEntropyMatchTheFacade() {
        StatePoint point = new StatePoint();
        for (double p : new double[] {5e3, 0.1e6, 2e6, 12e6, 20e6}) {
            for (double x : new double[] {0.0, 0.3, 0.9, 1.0}) {
                SteamState wet = Steam.statePX(p, x);
                point.setPH(p, wet.enthalpyJPerKg());
                assertEquals(x, point.x, 1e-9, "x(p,h) at p = " + p);
                assertClose(wet.entropyJPerKgK(), point.s, "s(p,h) at p = " + p + ", x = " + x);
                point.setPS(p, wet.entropyJPerKgK());
                assertClose(wet.enthalpyJPerKg(), point.h, "h(p,s) at p = " + p + ", x = " + x);
                point.setPX(p, x);
                assertClose(wet.enthalpyJPerKg(), point.h, "h(p,x) at p = " + p + ", x = " + x);
                assertClose(wet.entropyJPerKgK(), point.s, "s(p,x) at p = " + p + ", x = " + x);
                assertClose(wet.specificVolumeM3PerKg(), point.v, "v(p,x) at p = " + p + ", x = " + x);
            }
        }
    }

    @Test
    void derivativesMatchCentralDifferencesOfTheFacade() {
        StatePoint point = new StatePoint();
        double[][] states = {{1e6, 312.0}, {16.5e6, 811.0}, {3.6e6, 811.0}, {25e6, 680.0}, {0.2e6, 300.0}};
        for (double[] st : states) {
            double p = st[0];
            double t = st[1];
            point.setPT(p, t);
            double dp = 1e-4 * p;
            double dhdp = (Steam.enthalpyPT(p + dp, t) - Steam.enthalpyPT(p - dp, t)) / (2 * dp);
            double dhdT = (Steam.enthalpyPT(p, t + 1e-3) - Steam.enthalpyPT(p, t - 1e-3)) / 2e-3;
            // A sensitivity coefficient needs two digits; 1e-4 checks far more than that.
            assertEquals(dhdp, point.dhdp, 1e-4 * Math.abs(dhdp), "dh/dp at " + p + " Pa, " + t + " K");
            assertEquals(dhdT, point.dhdT, 1e-4 * Math.abs(dhdT), "cp at " + p + " Pa, " + t + " K");
        }
        point.setPX(2e6, 0.0);
        double dp = 1e3;
        double dhdp = (Steam.statePX(2e6 + dp, 0.0).enthalpyJPerKg() - Steam.statePX(2e6 - dp, 0.0).enthalpyJPerKg())
                / (2 * dp);
        assertEquals(dhdp, point.dhdp, 1e-4 * Math.abs(dhdp), "dh'/dp along the saturation line");
    }

    private static void assertClose(double expected, double actual, String what) {
        assertEquals(expected, actual, RELATIVE_TOLERANCE * Math.abs(expected) + 1e-12, what);
    }
}
