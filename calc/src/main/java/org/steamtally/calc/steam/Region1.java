package org.steamtally.calc.steam;

/**
 * Region 1 of IAPWS-IF97, compressed liquid: 273.15 K ≤ T ≤ 623.15 K, ps(T) ≤ p ≤ 100 MPa.
 *
 * <p>Forward properties come from the dimensionless Gibbs free energy γ(π, τ) of IAPWS R7-97(2012),
 * eq. 7 with Table 2, and the relations of Table 3. The backward equations are T(p,h), eq. 11 with
 * Table 6, and T(p,s), eq. 13 with Table 8, of the same release, and p(h,s), eq. 1 with Table 2 of
 * IAPWS SR2-01(2014) (Supp-PHS12). The methods named {@code backward…} return the raw published
 * equations; {@link #temperaturePH}, {@link #temperaturePS} and {@link #pressureHS} start from them
 * and refine with Newton steps on the forward equation, so that the forward properties at the result
 * reproduce the inputs to rounding.
 *
 * <p>No range validation is done here; the caller checks that the state lies in region 1. All
 * quantities are SI: Pa, K, J/kg, J/(kg·K), m³/kg, m/s.
 */
public final class Region1 {

    private static final double R = If97Constants.R;

    // IAPWS R7-97(2012), eq. 7: reducing quantities p* = 16.53 MPa, T* = 1386 K.
    private static final double P_STAR_PA = 16.53e6;
    private static final double T_STAR_K = 1386.0;
    // IAPWS R7-97(2012), eq. 7: the shifts in (7.1 − π) and (τ − 1.222).
    private static final double PI_SHIFT = 7.1;
    private static final double TAU_SHIFT = 1.222;

    // IAPWS R7-97(2012), Table 2: coefficients and exponents of eq. 7, rows {I, J, n} in printed order.
    private static final double[][] TABLE_2 = {
        {0, -2, 0.14632971213167},
        {0, -1, -0.84548187169114},
        {0, 0, -0.37563603672040e1},
        {0, 1, 0.33855169168385e1},
        {0, 2, -0.95791963387872},
        {0, 3, 0.15772038513228},
        {0, 4, -0.16616417199501e-1},
        {0, 5, 0.81214629983568e-3},
        {1, -9, 0.28319080123804e-3},
        {1, -7, -0.60706301565874e-3},
        {1, -1, -0.18990068218419e-1},
        {1, 0, -0.32529748770505e-1},
        {1, 1, -0.21841717175414e-1},
        {1, 3, -0.52838357969930e-4},
        {2, -3, -0.47184321073267e-3},
        {2, 0, -0.30001780793026e-3},
        {2, 1, 0.47661393906987e-4},
        {2, 3, -0.44141845330846e-5},
        {2, 17, -0.72694996297594e-15},
        {3, -4, -0.31679644845054e-4},
        {3, 0, -0.28270797985312e-5},
        {3, 6, -0.85205128120103e-9},
        {4, -5, -0.22425281908000e-5},
        {4, -2, -0.65171222895601e-6},
        {4, 10, -0.14341729937924e-12},
        {5, -8, -0.40516996860117e-6},
        {8, -11, -0.12734301741641e-8},
        {8, -6, -0.17424871230634e-9},
        {21, -29, -0.68762131295531e-18},
        {23, -31, 0.14478307828521e-19},
        {29, -38, 0.26335781662795e-22},
        {30, -39, -0.11947622640071e-22},
        {31, -40, 0.18228094581404e-23},
        {32, -41, -0.93537087292458e-25},
    };

    // IAPWS R7-97(2012), eq. 11: reducing quantities p* = 1 MPa, T* = 1 K, h* = 2500 kJ/kg.
    private static final double PH_P_STAR_PA = 1.0e6;
    private static final double PH_H_STAR = 2500.0e3;

    // IAPWS R7-97(2012), Table 6: coefficients and exponents of the backward equation T(p,h), eq. 11.
    private static final double[][] TABLE_6 = {
        {0, 0, -0.23872489924521e3},
        {0, 1, 0.40421188637945e3},
        {0, 2, 0.11349746881718e3},
        {0, 6, -0.58457616048039e1},
        {0, 22, -0.15285482413140e-3},
        {0, 32, -0.10866707695377e-5},
        {1, 0, -0.13391744872602e2},
        {1, 1, 0.43211039183559e2},
        {1, 2, -0.54010067170506e2},
        {1, 3, 0.30535892203916e2},
        {1, 4, -0.65964749423638e1},
        {1, 10, 0.93965400878363e-2},
        {1, 32, 0.11573647505340e-6},
        {2, 10, -0.25858641282073e-4},
        {2, 32, -0.40644363084799e-8},
        {3, 10, 0.66456186191635e-7},
        {3, 32, 0.80670734103027e-10},
        {4, 32, -0.93477771213947e-12},
        {5, 32, 0.58265442020601e-14},
        {6, 32, -0.15020185953503e-16},
    };

    // IAPWS R7-97(2012), eq. 13: reducing quantities p* = 1 MPa, T* = 1 K, s* = 1 kJ/(kg·K).
    private static final double PS_P_STAR_PA = 1.0e6;
    private static final double PS_S_STAR = 1.0e3;

    // IAPWS R7-97(2012), Table 8: coefficients and exponents of the backward equation T(p,s), eq. 13.
    private static final double[][] TABLE_8 = {
        {0, 0, 0.17478268058307e3},
        {0, 1, 0.34806930892873e2},
        {0, 2, 0.65292584978455e1},
        {0, 3, 0.33039981775489},
        {0, 11, -0.19281382923196e-6},
        {0, 31, -0.24909197244573e-22},
        {1, 0, -0.26107636489332},
        {1, 1, 0.22592965981586},
        {1, 2, -0.64256463395226e-1},
        {1, 3, 0.78876289270526e-2},
        {1, 12, 0.35672110607366e-9},
        {1, 31, 0.17332496994895e-23},
        {2, 0, 0.56608900654837e-3},
        {2, 1, -0.32635483139717e-3},
        {2, 2, 0.44778286690632e-4},
        {2, 9, -0.51322156908507e-9},
        {2, 31, -0.42522657042207e-25},
        {3, 10, 0.26400441360689e-12},
        {3, 32, 0.78124600459723e-28},
        {4, 32, -0.30732199903668e-30},
    };

    // IAPWS SR2-01(2014), eq. 1: reducing quantities p* = 100 MPa, h* = 3400 kJ/kg, s* = 7.6 kJ/(kg·K),
    // and the shifts in (η + 0.05) and (σ + 0.05).
    private static final double HS_P_STAR_PA = 100.0e6;
    private static final double HS_H_STAR = 3400.0e3;
    private static final double HS_S_STAR = 7.6e3;
    private static final double HS_SHIFT = 0.05;

    // IAPWS SR2-01(2014), Table 2: coefficients and exponents of the backward equation p(h,s), eq. 1.
    private static final double[][] SUPP_PHS12_TABLE_2 = {
        {0, 0, -0.691997014660582},
        {0, 1, -0.183612548787560e2},
        {0, 2, -0.928332409297335e1},
        {0, 4, 0.659639569909906e2},
        {0, 5, -0.162060388912024e2},
        {0, 6, 0.450620017338667e3},
        {0, 8, 0.854680678224170e3},
        {0, 14, 0.607523214001162e4},
        {1, 0, 0.326487682621856e2},
        {1, 1, -0.269408844582931e2},
        {1, 4, -0.319947848334300e3},
        {1, 6, -0.928354307043320e3},
        {2, 0, 0.303634537455249e2},
        {2, 1, -0.650540422444146e2},
        {2, 10, -0.430991316516130e4},
        {3, 4, -0.747512324096068e3},
        {4, 1, 0.730000345529245e3},
        {4, 4, 0.114284032569021e4},
        {5, 0, -0.436407041874559e3},
    };

    // γ as a series in x = 7.1 − π and y = τ − 1.222, and its derivatives; ∂/∂π = −∂/∂x.
    static final PowerSeries GAMMA = PowerSeries.ofRows(TABLE_2);
    static final PowerSeries GAMMA_X = GAMMA.derivativeX();
    static final PowerSeries GAMMA_Y = GAMMA.derivativeY();
    static final PowerSeries GAMMA_XX = GAMMA_X.derivativeX();
    static final PowerSeries GAMMA_XY = GAMMA_X.derivativeY();
    static final PowerSeries GAMMA_YY = GAMMA_Y.derivativeY();

    static final PowerSeries THETA_PH = PowerSeries.ofRows(TABLE_6);
    static final PowerSeries THETA_PS = PowerSeries.ofRows(TABLE_8);
    private static final PowerSeries PI_HS = PowerSeries.ofRows(SUPP_PHS12_TABLE_2);

    /** Start for p(h,s) where the backward equation is not positive: the triple-point pressure. */
    private static final double FALLBACK_START_PRESSURE_PA = 611.213;

    /** Newton iterations allowed before a refined backward method gives up. */
    static final int MAX_NEWTON_ITERATIONS = 8;
    /**
     * A Newton step below this fraction of the variable ends the iteration. Newton converges
     * quadratically, so the error left after such a step is of order (1e-9)², below one ulp.
     */
    static final double NEWTON_TOLERANCE = 1e-9;

    private Region1() {
    }

    /**
     * Specific volume v(p,T) = (RT/p)·π·γπ, IAPWS R7-97(2012), Table 3.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return v, m³/kg
     */
    public static double specificVolume(double pressurePa, double temperatureK) {
        double x = PI_SHIFT - pressurePa / P_STAR_PA;
        double y = T_STAR_K / temperatureK - TAU_SHIFT;
        return -R * temperatureK * Region1Sums.gammaX(x, y) / P_STAR_PA;
    }

    /**
     * Specific enthalpy h(p,T) = RT·τ·γτ, IAPWS R7-97(2012), Table 3.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return h, J/kg
     */
    public static double enthalpy(double pressurePa, double temperatureK) {
        double x = PI_SHIFT - pressurePa / P_STAR_PA;
        double y = T_STAR_K / temperatureK - TAU_SHIFT;
        // RT·τ = R·T*, so h needs no division by T.
        return R * T_STAR_K * Region1Sums.gammaY(x, y);
    }

    /**
     * Specific entropy s(p,T) = R·(τ·γτ − γ), IAPWS R7-97(2012), Table 3.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return s, J/(kg·K)
     */
    public static double entropy(double pressurePa, double temperatureK) {
        double x = PI_SHIFT - pressurePa / P_STAR_PA;
        double tau = T_STAR_K / temperatureK;
        double y = tau - TAU_SHIFT;
        return R * (tau * Region1Sums.gammaY(x, y) - Region1Sums.gamma(x, y));
    }

    /**
     * Specific internal energy u(p,T) = RT·(τ·γτ − π·γπ), IAPWS R7-97(2012), Table 3.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return u, J/kg
     */
    public static double internalEnergy(double pressurePa, double temperatureK) {
        double pi = pressurePa / P_STAR_PA;
        double x = PI_SHIFT - pi;
        double tau = T_STAR_K / temperatureK;
        double y = tau - TAU_SHIFT;
        return R * temperatureK * (tau * Region1Sums.gammaY(x, y) + pi * Region1Sums.gammaX(x, y));
    }

    /**
     * Specific isobaric heat capacity cp(p,T) = −R·τ²·γττ, IAPWS R7-97(2012), Table 3.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return cp, J/(kg·K)
     */
    public static double isobaricHeatCapacity(double pressurePa, double temperatureK) {
        double x = PI_SHIFT - pressurePa / P_STAR_PA;
        double tau = T_STAR_K / temperatureK;
        double y = tau - TAU_SHIFT;
        return -R * tau * tau * Region1Sums.gammaYY(x, y);
    }

    /**
     * Specific isochoric heat capacity cv(p,T) = R·(−τ²γττ + (γπ − τγπτ)²/γππ),
     * IAPWS R7-97(2012), Table 3.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return cv, J/(kg·K)
     */
    public static double isochoricHeatCapacity(double pressurePa, double temperatureK) {
        double x = PI_SHIFT - pressurePa / P_STAR_PA;
        double tau = T_STAR_K / temperatureK;
        double y = tau - TAU_SHIFT;
        double gPi = -Region1Sums.gammaX(x, y);
        double gPiPi = Region1Sums.gammaXX(x, y);
        double gPiTau = -Region1Sums.gammaXY(x, y);
        double gTauTau = Region1Sums.gammaYY(x, y);
        double a = gPi - tau * gPiTau;
        return R * (-tau * tau * gTauTau + a * a / gPiPi);
    }

    /**
     * Speed of sound w(p,T) = √(RT·γπ² / ((γπ − τγπτ)²/(τ²γττ) − γππ)), IAPWS R7-97(2012), Table 3.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return w, m/s
     */
    public static double speedOfSound(double pressurePa, double temperatureK) {
        double x = PI_SHIFT - pressurePa / P_STAR_PA;
        double tau = T_STAR_K / temperatureK;
        double y = tau - TAU_SHIFT;
        double gPi = -Region1Sums.gammaX(x, y);
        double gPiPi = Region1Sums.gammaXX(x, y);
        double gPiTau = -Region1Sums.gammaXY(x, y);
        double gTauTau = Region1Sums.gammaYY(x, y);
        double a = gPi - tau * gPiTau;
        return Math.sqrt(R * temperatureK * gPi * gPi / (a * a / (tau * tau * gTauTau) - gPiPi));
    }

    /**
     * The published backward equation T(p,h), IAPWS R7-97(2012), eq. 11 with Table 6; its deviation
     * from the forward equation is within ±25 mK (Table 4 of the release).
     *
     * @param pressurePa p, Pa
     * @param enthalpy   h, J/kg
     * @return T, K
     */
    public static double backwardTemperaturePH(double pressurePa, double enthalpy) {
        return Region1Sums.thetaPH(pressurePa / PH_P_STAR_PA, enthalpy / PH_H_STAR + 1.0);
    }

    /**
     * The published backward equation T(p,s), IAPWS R7-97(2012), eq. 13 with Table 8.
     *
     * @param pressurePa p, Pa
     * @param entropy    s, J/(kg·K)
     * @return T, K
     */
    public static double backwardTemperaturePS(double pressurePa, double entropy) {
        return Region1Sums.thetaPS(pressurePa / PS_P_STAR_PA, entropy / PS_S_STAR + 2.0);
    }

    /**
     * The published backward equation p(h,s), IAPWS SR2-01(2014) (Supp-PHS12), eq. 1 with Table 2.
     *
     * @param enthalpy h, J/kg
     * @param entropy  s, J/(kg·K)
     * @return p, Pa
     */
    public static double backwardPressureHS(double enthalpy, double entropy) {
        return PI_HS.sum(enthalpy / HS_H_STAR + HS_SHIFT, entropy / HS_S_STAR + HS_SHIFT) * HS_P_STAR_PA;
    }

    /**
     * Temperature from pressure and enthalpy, consistent with the forward equation: starts from
     * eq. 11 and takes Newton steps on eq. 7 until {@link #enthalpy} at the result equals h to
     * rounding (typically two or three steps).
     *
     * @param pressurePa p, Pa
     * @param enthalpy   h, J/kg
     * @return T, K
     * @throws IllegalStateException if the iteration does not converge, naming p and h
     */
    public static double temperaturePH(double pressurePa, double enthalpy) {
        return temperaturePH(pressurePa, enthalpy, MAX_NEWTON_ITERATIONS);
    }

    static double temperaturePH(double pressurePa, double enthalpy, int maxIterations) {
        double t = backwardTemperaturePH(pressurePa, enthalpy);
        double x = PI_SHIFT - pressurePa / P_STAR_PA;
        for (int iteration = 0; iteration < maxIterations; iteration++) {
            double tau = T_STAR_K / t;
            double y = tau - TAU_SHIFT;
            double h = R * T_STAR_K * Region1Sums.gammaY(x, y);
            double cp = -R * tau * tau * Region1Sums.gammaYY(x, y);
            double step = (enthalpy - h) / cp;
            t += step;
            if (Math.abs(step) <= NEWTON_TOLERANCE * t) {
                return t;
            }
        }
        throw notConverged("T(p,h)", "p = " + pressurePa + " Pa, h = " + enthalpy + " J/kg", maxIterations);
    }

    /**
     * Temperature from pressure and entropy, consistent with the forward equation: starts from
     * eq. 13 and takes Newton steps on eq. 7 until {@link #entropy} at the result equals s to
     * rounding.
     *
     * @param pressurePa p, Pa
     * @param entropy    s, J/(kg·K)
     * @return T, K
     * @throws IllegalStateException if the iteration does not converge, naming p and s
     */
    public static double temperaturePS(double pressurePa, double entropy) {
        return temperaturePS(pressurePa, entropy, MAX_NEWTON_ITERATIONS);
    }

    static double temperaturePS(double pressurePa, double entropy, int maxIterations) {
        double t = backwardTemperaturePS(pressurePa, entropy);
        double x = PI_SHIFT - pressurePa / P_STAR_PA;
        for (int iteration = 0; iteration < maxIterations; iteration++) {
            double tau = T_STAR_K / t;
            double y = tau - TAU_SHIFT;
            double s = R * (tau * Region1Sums.gammaY(x, y) - Region1Sums.gamma(x, y));
            double cp = -R * tau * tau * Region1Sums.gammaYY(x, y);
            // ds/dT at constant p is cp/T.
            double step = (entropy - s) * t / cp;
            t += step;
            if (Math.abs(step) <= NEWTON_TOLERANCE * t) {
                return t;
            }
        }
        throw notConverged("T(p,s)", "p = " + pressurePa + " Pa, s = " + entropy + " J/(kg·K)", maxIterations);
    }

    /**
     * Pressure from enthalpy and entropy, consistent with the forward equation: starts from
     * Supp-PHS12 eq. 1 (and eq. 11 for the temperature) and takes two-dimensional Newton steps in
     * (p, T) on eq. 7 until {@link #enthalpy} and {@link #entropy} at the result equal h and s to
     * rounding.
     *
     * @param enthalpy h, J/kg
     * @param entropy  s, J/(kg·K)
     * @return p, Pa
     * @throws IllegalStateException if the iteration does not converge, naming h and s
     */
    public static double pressureHS(double enthalpy, double entropy) {
        return pressureHS(enthalpy, entropy, MAX_NEWTON_ITERATIONS);
    }

    static double pressureHS(double enthalpy, double entropy, int maxIterations) {
        double p = backwardPressureHS(enthalpy, entropy);
        if (!(p > 0.0)) {
            // Near h = s = 0 the backward equation may undershoot zero; any small positive start
            // converges, since h and s of the liquid are nearly linear in p.
            p = FALLBACK_START_PRESSURE_PA;
        }
        double t = backwardTemperaturePH(p, enthalpy);
        for (int iteration = 0; iteration < maxIterations; iteration++) {
            double x = PI_SHIFT - p / P_STAR_PA;
            double tau = T_STAR_K / t;
            double y = tau - TAU_SHIFT;
            double gTau = Region1Sums.gammaY(x, y);
            double gPi = -Region1Sums.gammaX(x, y);
            double gPiTau = -Region1Sums.gammaXY(x, y);
            double h = R * T_STAR_K * gTau;
            double s = R * (tau * gTau - Region1Sums.gamma(x, y));
            double cp = -R * tau * tau * Region1Sums.gammaYY(x, y);
            double v = R * t * gPi / P_STAR_PA;
            double dvdT = R * (gPi - tau * gPiTau) / P_STAR_PA;
            double dhdp = v - t * dvdT;
            double dhdT = cp;
            double dsdp = -dvdT;
            double dsdT = cp / t;
            double rh = enthalpy - h;
            double rs = entropy - s;
            double det = dhdp * dsdT - dhdT * dsdp;
            double stepP = (rh * dsdT - dhdT * rs) / det;
            double stepT = (dhdp * rs - dsdp * rh) / det;
            double pNext = p + stepP;
            // A step through zero pressure is halved towards zero instead; the next step corrects it.
            p = pNext > 0.0 ? pNext : 0.5 * p;
            t += stepT;
            if (Math.abs(stepP) <= NEWTON_TOLERANCE * p && Math.abs(stepT) <= NEWTON_TOLERANCE * t) {
                return p;
            }
        }
        throw notConverged("p(h,s)", "h = " + enthalpy + " J/kg, s = " + entropy + " J/(kg·K)", maxIterations);
    }

    private static IllegalStateException notConverged(String equation, String inputs, int maxIterations) {
        return new IllegalStateException("Region 1 " + equation + " did not converge in " + maxIterations
                + " Newton steps for " + inputs);
    }
}
