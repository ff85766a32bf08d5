package org.steamtally.calc.steam;

/**
 * The state at a given (h, s), the pair of a Mollier chart and of an expansion line.
 *
 * <p>Single-phase states come from the regions' own (h, s) backward equations (IAPWS SR2-01(2014)
 * for regions 1 and 2, SR4-04(2014) for region 3), refined on the forward equations; region 5 has
 * none and is solved on its forward equation. A candidate is accepted only when the state found lies
 * inside that region's domain, so the answer near a boundary never depends on the accuracy of a
 * boundary approximation. Whether (h, s) lies under the saturation dome is decided exactly, by
 * finding the saturation temperature at which the dome has entropy s.
 */
final class HsSolver {

    private static final double T_MIN = Steam.MIN_TEMPERATURE_K;
    private static final double T_13 = Steam.REGION_13_TEMPERATURE_K;
    private static final double T_C = If97Constants.CRITICAL_TEMPERATURE_K;
    private static final double P_C = If97Constants.CRITICAL_PRESSURE_PA;
    private static final double P_MIN_SAT = Saturation.pressure(T_MIN);

    /** Saturated-liquid entropy at 273.15 K, the lowest entropy of the dome, J/(kg·K). */
    private static final double S_DOME_MIN = Region1.entropy(P_MIN_SAT, T_MIN);
    /** Saturated-vapour entropy at 273.15 K, the highest entropy of the dome, J/(kg·K). */
    private static final double S_DOME_MAX = Region2.entropy(P_MIN_SAT, T_MIN);
    /** Entropy at the critical point, where the two sides of the dome meet, J/(kg·K). */
    private static final double S_CRITICAL = Region3.entropy(If97Constants.CRITICAL_DENSITY_KG_PER_M3, T_C);
    /** Entropy where region 1 meets region 3 at 100 MPa: below it, region 3 cannot occur, J/(kg·K). */
    private static final double S_13_AT_MAX_PRESSURE = Region1.entropy(Steam.MAX_PRESSURE_PA, T_13);
    /** Saturated-vapour entropy at 623.15 K, where regions 2, 3 and 4 meet, J/(kg·K). */
    private static final double S_VAPOUR_AT_T13 = Region2.entropy(Saturation.pressure(T_13), T_13);

    /** Saturation-temperature solve: stop when a step moves the estimate less than this, K. */
    private static final double T_TOLERANCE_K = 1e-12 * T_C;
    private static final int MAX_ITERATIONS = 100;
    /** Region 5 solve: relative steps of T and p at which the state counts as converged. */
    private static final double P_TOLERANCE = 1e-14;
    private static final int MAX_ITERATIONS_REGION_5 = 50;

    private HsSolver() {
    }

    static SteamState state(double h, double s) {
        if (s >= S_DOME_MIN && s <= S_DOME_MAX) {
            double tDome = domeTemperature(s);
            double pDome = Saturation.pressure(tDome);
            double hDome = s <= S_CRITICAL
                    ? SaturationLine.liquidEnthalpy(pDome, tDome)
                    : SaturationLine.vapourEnthalpy(pDome, tDome);
            if (h <= hDome) {
                return wetState(h, s, tDome);
            }
        }
        for (Region candidate : candidates(s)) {
            SteamState state = trySinglePhase(candidate, h, s);
            if (state != null) {
                return state;
            }
        }
        throw noState(h, s);
    }

    /** Regions to try, most likely first; the domain check after each decides. */
    private static Region[] candidates(double s) {
        if (s < S_13_AT_MAX_PRESSURE) {
            return new Region[] {Region.REGION_1};
        }
        if (s <= S_CRITICAL) {
            return new Region[] {Region.REGION_1, Region.REGION_3};
        }
        if (s <= S_VAPOUR_AT_T13) {
            return new Region[] {Region.REGION_3, Region.REGION_2, Region.REGION_5};
        }
        return new Region[] {Region.REGION_2, Region.REGION_5, Region.REGION_3};
    }

    /** The state in one region, or null when the solution lies outside that region's domain. */
    private static SteamState trySinglePhase(Region region, double h, double s) {
        try {
            switch (region) {
                case REGION_1: {
                    double p = Region1.pressureHS(h, s);
                    if (!(p > 0.0 && p <= Steam.MAX_PRESSURE_PA)) {
                        return null;
                    }
                    double T = Region1.temperaturePH(p, h);
                    boolean inside = T >= T_MIN && T <= T_13 && p >= Saturation.pressure(T);
                    return inside ? Steam.statePT(p, T) : null;
                }
                case REGION_2: {
                    double p = Region2.pressureHS(h, s);
                    if (!(p > 0.0 && p <= Steam.MAX_PRESSURE_PA)) {
                        return null;
                    }
                    double T = Region2.temperaturePH(p, h);
                    boolean inside = T >= T_MIN && T <= Steam.MAX_TEMPERATURE_REGION_2_K
                            && (T > T_13 || p <= Saturation.pressure(T))
                            && (T <= T_13 || T > 863.15 || p <= B23.pressure(T));
                    return inside ? Steam.statePT(p, T) : null;
                }
                case REGION_3: {
                    double p = Region3.pressureHS(h, s);
                    if (!(p > 0.0 && p <= Steam.MAX_PRESSURE_PA)) {
                        return null;
                    }
                    double T = Region3.temperaturePH(p, h);
                    boolean inside = T >= T_13 && T <= 863.15 && p >= B23.pressure(T);
                    if (!inside) {
                        return null;
                    }
                    double rho = Region3.densityPH(p, h);
                    return SteamState.singlePhase(p, T, Region3.enthalpy(rho, T), Region3.entropy(rho, T),
                            1.0 / rho, Region3.internalEnergy(rho, T), Region3.isobaricHeatCapacity(rho, T),
                            Region3.isochoricHeatCapacity(rho, T), Region3.speedOfSound(rho, T), Region.REGION_3);
                }
                case REGION_5: {
                    double p = region5Pressure(h, s);
                    if (p > Steam.MAX_PRESSURE_REGION_5_PA) {
                        return null;
                    }
                    double T = Region5.temperaturePS(p, s);
                    boolean inside = T > Steam.MAX_TEMPERATURE_REGION_2_K && T <= Steam.MAX_TEMPERATURE_K;
                    return inside ? Steam.statePT(p, T) : null;
                }
                default:
                    return null;
            }
        } catch (IllegalStateException | IllegalArgumentException notInThisRegion) {
            // A backward start far outside its region can fail to converge, or land outside the
            // formulation; either way the state does not belong to this candidate.
            return null;
        }
    }

    /**
     * Region 5 has no (h, s) backward equation. Its vapour is nearly an ideal gas, for which
     * dh = cp dT and ds = cp dT / T − R d(ln p); iterating with that Jacobian on the real residuals
     * converges from any start in the region, the factor per step being the small departure from
     * ideality.
     *
     * @return the pressure, Pa (possibly outside region 5; the caller checks)
     */
    private static double region5Pressure(double h, double s) {
        double T = 1600.0;
        double lnP = Math.log(1e6);
        for (int i = 0; i < MAX_ITERATIONS_REGION_5; i++) {
            double p = Math.exp(lnP);
            double cp = Region5.isobaricHeatCapacity(p, T);
            double dT = (h - Region5.enthalpy(p, T)) / cp;
            double dLnP = (Region5.entropy(p, T) + cp * dT / T - s) / If97Constants.R;
            T = Math.max(Steam.MAX_TEMPERATURE_REGION_2_K * 0.9, T + dT);
            lnP += Math.max(-3.0, Math.min(3.0, dLnP));
            if (Math.abs(dT) < P_TOLERANCE * T && Math.abs(dLnP) < P_TOLERANCE) {
                return Math.exp(lnP);
            }
        }
        throw new IllegalStateException("region 5 pressure from (h, s) = (" + h + " J/kg, " + s
                + " J/(kg·K)) did not converge");
    }

    /**
     * The saturation temperature at which the dome has entropy s: on the liquid side below the
     * critical entropy, on the vapour side above it. Saturated-liquid entropy rises and
     * saturated-vapour entropy falls with temperature, so each side has one root; it is bracketed
     * between 273.15 K and the critical temperature and found by regula falsi (Illinois variant).
     */
    private static double domeTemperature(double s) {
        boolean liquidSide = s <= S_CRITICAL;
        double a = T_MIN;
        double b = T_C;
        double fa = domeEntropy(a, liquidSide) - s;
        double fb = domeEntropy(b, liquidSide) - s;
        return illinois(a, fa, b, fb, T -> domeEntropy(T, liquidSide) - s);
    }

    private static double domeEntropy(double T, boolean liquidSide) {
        if (T >= T_C) {
            return S_CRITICAL;
        }
        double p = Saturation.pressure(T);
        return liquidSide ? SaturationLine.liquidEntropy(p, T) : SaturationLine.vapourEntropy(p, T);
    }

    /**
     * The wet state under the dome. At a trial saturation temperature T, the quality follows from h,
     * and the entropy of that mixture is compared with s; the residual changes sign between
     * 273.15 K (where a point above the triple line has too much entropy) and the dome temperature.
     */
    private static SteamState wetState(double h, double s, double tDome) {
        double fLow = wetEntropyResidual(T_MIN, h, s);
        if (fLow < 0.0) {
            throw noState(h, s);
        }
        double fHigh = wetEntropyResidual(tDome, h, s);
        double T = fHigh >= 0.0 ? tDome : illinois(T_MIN, fLow, tDome, fHigh, t -> wetEntropyResidual(t, h, s));
        double p = Saturation.pressure(T);
        double hL = SaturationLine.liquidEnthalpy(p, T);
        double hV = SaturationLine.vapourEnthalpy(p, T);
        double x = SaturationLine.quality(h, hL, hV);
        return Steam.wetState(p, T, x);
    }

    private static double wetEntropyResidual(double T, double h, double s) {
        double p = Saturation.pressure(T);
        double hL = SaturationLine.liquidEnthalpy(p, T);
        double hV = SaturationLine.vapourEnthalpy(p, T);
        double sL = SaturationLine.liquidEntropy(p, T);
        double sV = SaturationLine.vapourEntropy(p, T);
        if (hV <= hL) {
            return sL - s;
        }
        double x = (h - hL) / (hV - hL);
        return sL + x * (sV - sL) - s;
    }

    private interface Residual {
        double at(double T);
    }

    /** Regula falsi with the Illinois modification on a bracket [a, b] whose ends differ in sign. */
    private static double illinois(double a, double fa, double b, double fb, Residual f) {
        if (fa == 0.0) {
            return a;
        }
        if (fb == 0.0) {
            return b;
        }
        if (Math.signum(fa) == Math.signum(fb)) {
            throw new IllegalStateException("saturation temperature not bracketed in [" + a + ", " + b + "] K");
        }
        int side = 0;
        double previous = a;
        for (int i = 0; i < MAX_ITERATIONS; i++) {
            double c = (a * fb - b * fa) / (fb - fa);
            double fc = f.at(c);
            if (fc == 0.0 || Math.abs(c - previous) < T_TOLERANCE_K) {
                return c;
            }
            previous = c;
            if (Math.signum(fc) == Math.signum(fb)) {
                b = c;
                fb = fc;
                if (side == -1) {
                    fa /= 2.0;
                }
                side = -1;
            } else {
                a = c;
                fa = fc;
                if (side == 1) {
                    fb /= 2.0;
                }
                side = 1;
            }
        }
        return (a * fb - b * fa) / (fb - fa);
    }

    private static SteamRangeException noState(double h, double s) {
        return new SteamRangeException("h,s", "h", h, "J/kg",
                "an enthalpy that some IF97 state has at s = " + s + " J/(kg·K)");
    }
}
