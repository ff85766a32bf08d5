package org.steamtally.calc.steam;

/**
 * Region 5 of IAPWS-IF97, high-temperature vapour: 1073.15 K ≤ T ≤ 2273.15 K, 0 &lt; p ≤ 50 MPa
 * (the range extended in IAPWS R7-97(2012)).
 *
 * <p>Forward properties come from the Gibbs free energy of IAPWS R7-97(2012), eq. 32 to 34 with
 * Tables 37 and 38 and the relations of Table 39. The release gives no backward equations for this
 * region; {@link #temperaturePH} and {@link #temperaturePS} solve the forward equation by Newton's
 * method from a fixed start inside the region.
 *
 * <p>No range validation is done here. All quantities are SI: Pa, K, J/kg, J/(kg·K), m³/kg, m/s.
 */
public final class Region5 {

    // IAPWS R7-97(2012), eq. 32: reducing quantities p* = 1 MPa, T* = 1000 K; residual in τ itself.
    private static final double P_STAR_PA = 1.0e6;
    private static final double T_STAR_K = 1000.0;

    // IAPWS R7-97(2012), Table 37: ideal-gas part γ⁰, eq. 33, rows {J⁰, n⁰} in printed order.
    private static final double[][] TABLE_37 = {
        {0, -0.13179983674201e2},
        {1, 0.68540841634434e1},
        {-3, -0.24805148933466e-1},
        {-2, 0.36901534980333},
        {-1, -0.31161318213925e1},
        {2, -0.32961626538917},
    };

    // IAPWS R7-97(2012), Table 38: residual part γʳ, eq. 34, rows {I, J, n} in printed order.
    private static final double[][] TABLE_38 = {
        {1, 1, 0.15736404855259e-2},
        {1, 2, 0.90153761673944e-3},
        {1, 3, -0.50270077677648e-2},
        {2, 3, 0.22440037409485e-5},
        {2, 9, -0.41163275453471e-5},
        {3, 7, 0.37919454822955e-7},
    };

    static final VapourGibbs GIBBS =
            new VapourGibbs("Region 5", P_STAR_PA, T_STAR_K, TABLE_37, TABLE_38, 0.0) {
                @Override
                double idealSum(double tau) {
                    return Region5Sums.ideal(tau);
                }

                @Override
                double idealTauSum(double tau) {
                    return Region5Sums.idealTau(tau);
                }

                @Override
                double idealTauTauSum(double tau) {
                    return Region5Sums.idealTauTau(tau);
                }

                @Override
                double residualSum(double pi, double y) {
                    return Region5Sums.residual(pi, y);
                }

                @Override
                double residualPiSum(double pi, double y) {
                    return Region5Sums.residualPi(pi, y);
                }

                @Override
                double residualTauSum(double pi, double y) {
                    return Region5Sums.residualTau(pi, y);
                }

                @Override
                double residualPiPiSum(double pi, double y) {
                    return Region5Sums.residualPiPi(pi, y);
                }

                @Override
                double residualPiTauSum(double pi, double y) {
                    return Region5Sums.residualPiTau(pi, y);
                }

                @Override
                double residualTauTauSum(double pi, double y) {
                    return Region5Sums.residualTauTau(pi, y);
                }
            };

    /**
     * Start of the Newton iterations, the middle of the region's temperature range. h and s are
     * smooth and nearly linear in T (respectively ln T) here, so Newton from the middle reaches
     * either end in a few steps.
     */
    private static final double START_TEMPERATURE_K = 1673.15;

    /** Newton iterations allowed before {@link #temperaturePH} or {@link #temperaturePS} give up. */
    static final int MAX_NEWTON_ITERATIONS = 12;
    /** As in regions 1 and 2: after a step below 1e-9·T the quadratic error left is below one ulp. */
    static final double NEWTON_TOLERANCE = 1e-9;

    private Region5() {
    }

    /**
     * Specific volume v(p,T), IAPWS R7-97(2012), eq. 32 with Table 39.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return v, m³/kg
     */
    public static double specificVolume(double pressurePa, double temperatureK) {
        return GIBBS.specificVolume(pressurePa, temperatureK);
    }

    /**
     * Specific enthalpy h(p,T), IAPWS R7-97(2012), eq. 32 with Table 39.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return h, J/kg
     */
    public static double enthalpy(double pressurePa, double temperatureK) {
        return GIBBS.enthalpy(pressurePa, temperatureK);
    }

    /**
     * Specific entropy s(p,T), IAPWS R7-97(2012), eq. 32 with Table 39.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return s, J/(kg·K)
     */
    public static double entropy(double pressurePa, double temperatureK) {
        return GIBBS.entropy(pressurePa, temperatureK);
    }

    /**
     * Specific internal energy u(p,T), IAPWS R7-97(2012), eq. 32 with Table 39.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return u, J/kg
     */
    public static double internalEnergy(double pressurePa, double temperatureK) {
        return GIBBS.internalEnergy(pressurePa, temperatureK);
    }

    /**
     * Specific isobaric heat capacity cp(p,T), IAPWS R7-97(2012), eq. 32 with Table 39.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return cp, J/(kg·K)
     */
    public static double isobaricHeatCapacity(double pressurePa, double temperatureK) {
        return GIBBS.isobaricHeatCapacity(pressurePa, temperatureK);
    }

    /**
     * Specific isochoric heat capacity cv(p,T), IAPWS R7-97(2012), eq. 32 with Table 39.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return cv, J/(kg·K)
     */
    public static double isochoricHeatCapacity(double pressurePa, double temperatureK) {
        return GIBBS.isochoricHeatCapacity(pressurePa, temperatureK);
    }

    /**
     * Speed of sound w(p,T), IAPWS R7-97(2012), eq. 32 with Table 39.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return w, m/s
     */
    public static double speedOfSound(double pressurePa, double temperatureK) {
        return GIBBS.speedOfSound(pressurePa, temperatureK);
    }

    /**
     * Temperature from pressure and enthalpy by Newton's method on eq. 32, so that
     * {@link #enthalpy} at the result equals h to rounding.
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
        return GIBBS.temperaturePH(pressurePa, enthalpy, START_TEMPERATURE_K, maxIterations, NEWTON_TOLERANCE);
    }

    /**
     * Temperature from pressure and entropy by Newton's method in ln T on eq. 32, so that
     * {@link #entropy} at the result equals s to rounding.
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
        return GIBBS.temperaturePS(pressurePa, entropy, START_TEMPERATURE_K, maxIterations, NEWTON_TOLERANCE, true);
    }
}
