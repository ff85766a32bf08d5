package org.steamtally.calc.steam;

import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Inversions of the region-3 equation checked against the forward equation itself: states are made
 * from (ρ, T) on a seeded random grid inside region 3 with eq. 28, then recovered from (p, T),
 * (p, h), (p, s) and (h, s).
 */
class Region3RoundTripTest {

    /** Points closer than this to the critical point are checked separately: there (p, T) fixes ρ poorly. */
    private static final double NEAR_CRITICAL_T = 1.0;
    private static final double NEAR_CRITICAL_RHO = 40;

    private static final List<double[]> STATES = states(new Random(1997), 400);

    /** IAPWS R7-97(2012), eq. 5 and Table 1: the B23 boundary pressure, Pa. Test-only copy. */
    static double b23Pressure(double T) {
        return (0.34805185628969e3 - 0.11671859879975e1 * T + 0.10192970039326e-2 * T * T) * 1e6;
    }

    /** (ρ, T) pairs inside region 3 and outside the two-phase dome, each with its p from eq. 28. */
    private static List<double[]> states(Random random, int count) {
        List<double[]> states = new ArrayList<>();
        while (states.size() < count) {
            double T = 623.15 + random.nextDouble() * (863.15 - 623.15);
            double rho = 80 + random.nextDouble() * (770 - 80);
            double p = Region3.pressure(rho, T);
            if (p > 100e6 || p < b23Pressure(T)) {
                continue;
            }
            if (T < Region3.T_CRIT - 0.05) {
                double liquid = Region3.saturatedLiquidDensity(T);
                double vapour = Region3.saturatedVapourDensity(T);
                if (rho <= liquid * 1.001 && rho >= vapour * 0.999) {
                    continue;
                }
            }
            states.add(new double[]{rho, T, p});
        }
        return states;
    }

    private static boolean nearCritical(double rho, double T) {
        return Math.abs(T - Region3.T_CRIT) < NEAR_CRITICAL_T && Math.abs(rho - Region3.RHO_CRIT) < NEAR_CRITICAL_RHO;
    }

    /**
     * Away from the critical point the density comes back to 1e-12 relative: ρ·∂p/∂ρ ≥ p/50 there,
     * so a pressure at rounding level leaves ρ within 1e-13, and 1e-12 leaves room. The pressure
     * comes back to 1e-12 relative: in the stiff liquid ρ·∂p/∂ρ reaches some 100·p, so one ulp of ρ
     * moves p by about 2e-14 relative, and rounding inside eq. 28 adds a few more.
     */
    @Test
    void densityFromPressureAndTemperatureRecoversTheForwardState() {
        for (double[] state : STATES) {
            double rho = state[0];
            double T = state[1];
            double p = state[2];
            double recovered = Region3.density(p, T);
            assertEquals(p, Region3.pressure(recovered, T), 1e-12 * p, "p at rho = " + rho + ", T = " + T);
            if (!nearCritical(rho, T)) {
                assertEquals(rho, recovered, 1e-12 * rho, "rho at T = " + T + ", p = " + p);
            }
        }
    }

    /**
     * Within 1 K above and 40 kg/m³ of the critical point p(ρ) is nearly flat, so the density is only
     * defined to the cube root of the rounding error; the pressure still comes back to 1e-13
     * relative and the density to 1e-4 relative. (Below T_c such densities are inside the
     * two-phase dome, where (p, T) names the stable state instead.)
     */
    @Test
    void densityNearTheCriticalPointReproducesThePressure() {
        for (double dT = 0.001; dT <= 0.8; dT += 0.2) {
            for (double dRho = -30; dRho <= 30; dRho += 7.5) {
                double T = Region3.T_CRIT + dT;
                double rho = Region3.RHO_CRIT + dRho;
                double p = Region3.pressure(rho, T);
                double recovered = Region3.density(p, T);
                assertEquals(p, Region3.pressure(recovered, T), 1e-13 * p, "p at rho = " + rho + ", T = " + T);
                assertEquals(rho, recovered, 1e-4 * rho, "rho at T = " + T);
            }
        }
    }

    /** p and h are reproduced to 1e-12 relative, a few hundred ulps; ρ and T to 1e-9. */
    @Test
    void densityAndTemperatureFromPressureAndEnthalpyRecoverTheForwardState() {
        for (double[] state : STATES) {
            double rho = state[0];
            double T = state[1];
            double p = state[2];
            double h = Region3.enthalpy(rho, T);
            double rhoBack = Region3.densityPH(p, h);
            double tBack = Region3.temperaturePH(p, h);
            String where = " at rho = " + rho + ", T = " + T;
            assertEquals(p, Region3.pressure(rhoBack, tBack), 1e-12 * p, "p" + where);
            assertEquals(h, Region3.enthalpy(rhoBack, tBack), 1e-12 * h, "h" + where);
            assertEquals(T, tBack, 1e-9 * T, "T" + where);
            if (!nearCritical(rho, T)) {
                assertEquals(rho, rhoBack, 1e-9 * rho, "rho" + where);
            }
        }
    }

    /** p and s are reproduced to 1e-12 relative; ρ and T to 1e-9. */
    @Test
    void densityAndTemperatureFromPressureAndEntropyRecoverTheForwardState() {
        for (double[] state : STATES) {
            double rho = state[0];
            double T = state[1];
            double p = state[2];
            double s = Region3.entropy(rho, T);
            double rhoBack = Region3.densityPS(p, s);
            double tBack = Region3.temperaturePS(p, s);
            String where = " at rho = " + rho + ", T = " + T;
            assertEquals(p, Region3.pressure(rhoBack, tBack), 1e-12 * p, "p" + where);
            assertEquals(s, Region3.entropy(rhoBack, tBack), 1e-12 * s, "s" + where);
            assertEquals(T, tBack, 1e-9 * T, "T" + where);
            if (!nearCritical(rho, T)) {
                assertEquals(rho, rhoBack, 1e-9 * rho, "rho" + where);
            }
        }
    }

    /** The pressure comes back to 1e-9 relative wherever h and s pin the state down. */
    @Test
    void pressureFromEnthalpyAndEntropyRecoversTheForwardState() {
        for (double[] state : STATES) {
            double rho = state[0];
            double T = state[1];
            double p = state[2];
            double h = Region3.enthalpy(rho, T);
            double s = Region3.entropy(rho, T);
            assertEquals(p, Region3.pressureHS(h, s), 1e-9 * p, "p at rho = " + rho + ", T = " + T);
        }
    }

    /**
     * From the release's backward values Newton needs few steps: at most 8 for (p, T) and 10 for the
     * two-variable inversions over the whole grid, well inside the bound of {@link Region3#MAX_ITERATIONS}.
     */
    @Test
    void newtonIterationsStayWithinASmallBound() {
        for (double[] state : STATES) {
            double rho = state[0];
            double T = state[1];
            double p = state[2];
            double h = Region3.enthalpy(rho, T);
            double s = Region3.entropy(rho, T);
            assertDoesNotThrow(() -> Region3.solveDensity(p, T, 1 / Region3.backwardVolumePT(p, T), 0, "test", 8));
            assertDoesNotThrow(() -> Region3.solvePH(p, h, Region3.WANT_DENSITY, 10));
            assertDoesNotThrow(() -> Region3.solvePS(p, s, Region3.WANT_DENSITY, 10));
            assertDoesNotThrow(() -> Region3.solveHS(h, s, 10));
        }
    }

    /**
     * On the saturation line the liquid and vapour roots reproduce p_s to 1e-12 relative (see the
     * (p, T) round trip for why not closer on the stiff liquid side), lie on
     * their own sides of the critical density, and stay close to the release's subregion equations:
     * within 1e-3 below 645 K, and within 3e-2 in the last two kelvins, where the auxiliary equations
     * 3y and 3z are looser and p_s of eq. 30 differs most from the saturation pressure eq. 28 implies.
     */
    @Test
    void saturatedDensitiesSolveTheSaturationPressureOnTheirOwnSide() {
        for (double T = 623.15; T < 647.09; T += 0.47) {
            double pSat = Saturation.pressure(T);
            double liquid = Region3.saturatedLiquidDensity(T, pSat);
            double vapour = Region3.saturatedVapourDensity(T, pSat);
            assertEquals(pSat, Region3.pressure(liquid, T), 1e-12 * pSat, "liquid at " + T);
            assertEquals(pSat, Region3.pressure(vapour, T), 1e-12 * pSat, "vapour at " + T);
            assertTrue(liquid > Region3.RHO_CRIT && vapour < Region3.RHO_CRIT, "sides at " + T);
            double pMPa = pSat / 1e6;
            double liquidStart = 1 / Region3VolumePT.volume(Region3VolumePT.saturatedLiquidSubregion(pMPa), pMPa, T);
            double vapourStart = 1 / Region3VolumePT.volume(Region3VolumePT.saturatedVapourSubregion(pMPa), pMPa, T);
            double closeness = T < 645 ? 1e-3 : 3e-2;
            assertEquals(liquidStart, liquid, closeness * liquid, "liquid start at " + T);
            assertEquals(vapourStart, vapour, closeness * vapour, "vapour start at " + T);
        }
    }
}
