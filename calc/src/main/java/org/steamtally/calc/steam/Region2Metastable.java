package org.steamtally.calc.steam;

/**
 * Metastable vapour (supercooled vapour) next to region 2 of IAPWS-IF97, IAPWS R7-97(2012),
 * eq. 18 and 19 with Tables 16 and 17 and the relations of Table 12.
 *
 * <p>Valid in the metastable-vapour region from the saturated-vapour line to the 5 %
 * equilibrium-moisture line (determined from the equilibrium h' and h'' at the given pressure), for
 * pressures from the triple point up to 10 MPa. No range validation is done here. All quantities
 * are SI: Pa, K, J/kg, J/(kg·K), m³/kg, m/s.
 */
public final class Region2Metastable {

    // IAPWS R7-97(2012), eq. 18: reducing quantities p* = 1 MPa, T* = 540 K; residual in (τ − 0.5).
    private static final double P_STAR_PA = 1.0e6;
    private static final double T_STAR_K = 540.0;
    private static final double TAU_SHIFT = 0.5;

    // IAPWS R7-97(2012), Table 16: the ideal-gas part of eq. 18 is that of eq. 16 (Table 10) with
    // n⁰1 and n⁰2 replaced by these two values.
    private static final double N0_1 = -0.96937268393049e1;
    private static final double N0_2 = 0.10087275970006e2;

    // IAPWS R7-97(2012), Table 17: residual part of eq. 19, rows {I, J, n} in printed order.
    private static final double[][] TABLE_17 = {
        {1, 0, -0.73362260186506e-2},
        {1, 2, -0.88223831943146e-1},
        {1, 5, -0.72334555213245e-1},
        {1, 11, -0.40813178534455e-2},
        {2, 1, 0.20097803380207e-2},
        {2, 7, -0.53045921898642e-1},
        {2, 16, -0.76190409086970e-2},
        {3, 4, -0.63498037657313e-2},
        {3, 16, -0.86043093028588e-1},
        {4, 7, 0.75321581522770e-2},
        {4, 10, -0.79238375446139e-2},
        {5, 9, -0.22888160778447e-3},
        {5, 10, -0.26456501482810e-2},
    };

    private static final VapourGibbs GIBBS =
            new VapourGibbs("Metastable region 2", P_STAR_PA, T_STAR_K, idealPart(), TABLE_17, TAU_SHIFT);

    private Region2Metastable() {
    }

    private static double[][] idealPart() {
        double[][] rows = new double[Region2.TABLE_10.length][];
        for (int k = 0; k < rows.length; k++) {
            rows[k] = Region2.TABLE_10[k].clone();
        }
        rows[0][1] = N0_1;
        rows[1][1] = N0_2;
        return rows;
    }

    /**
     * Specific volume v(p,T), IAPWS R7-97(2012), eq. 18 and 19 with Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return v, m³/kg
     */
    public static double specificVolume(double pressurePa, double temperatureK) {
        return GIBBS.specificVolume(pressurePa, temperatureK);
    }

    /**
     * Specific enthalpy h(p,T), IAPWS R7-97(2012), eq. 18 and 19 with Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return h, J/kg
     */
    public static double enthalpy(double pressurePa, double temperatureK) {
        return GIBBS.enthalpy(pressurePa, temperatureK);
    }

    /**
     * Specific entropy s(p,T), IAPWS R7-97(2012), eq. 18 and 19 with Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return s, J/(kg·K)
     */
    public static double entropy(double pressurePa, double temperatureK) {
        return GIBBS.entropy(pressurePa, temperatureK);
    }

    /**
     * Specific internal energy u(p,T), IAPWS R7-97(2012), eq. 18 and 19 with Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return u, J/kg
     */
    public static double internalEnergy(double pressurePa, double temperatureK) {
        return GIBBS.internalEnergy(pressurePa, temperatureK);
    }

    /**
     * Specific isobaric heat capacity cp(p,T), IAPWS R7-97(2012), eq. 18 and 19 with Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return cp, J/(kg·K)
     */
    public static double isobaricHeatCapacity(double pressurePa, double temperatureK) {
        return GIBBS.isobaricHeatCapacity(pressurePa, temperatureK);
    }

    /**
     * Specific isochoric heat capacity cv(p,T), IAPWS R7-97(2012), eq. 18 and 19 with Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return cv, J/(kg·K)
     */
    public static double isochoricHeatCapacity(double pressurePa, double temperatureK) {
        return GIBBS.isochoricHeatCapacity(pressurePa, temperatureK);
    }

    /**
     * Speed of sound w(p,T), IAPWS R7-97(2012), eq. 18 and 19 with Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return w, m/s
     */
    public static double speedOfSound(double pressurePa, double temperatureK) {
        return GIBBS.speedOfSound(pressurePa, temperatureK);
    }
}
