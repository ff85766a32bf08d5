package org.steamtally.calc.steam;

/**
 * Region boundaries and the region-4 temperature as functions of specific enthalpy and entropy,
 * IAPWS SR4-04(2014) ("Revised Supplementary Release on Backward Equations p(h,s) for Region 3,
 * Equations as a Function of h and s for the Region Boundaries, and an Equation T_sat(h,s) for
 * Region 4 of IAPWS-IF97"). With them a caller holding (h, s) can tell which region the state lies
 * in before calling that region's p(h,s) backward equation.
 *
 * <p>All arguments and results are SI (J/kg, J/(kg·K), K). The methods do no range checks; each
 * states the range the release gives it, and the constants below are the entropies at which the
 * boundary equations hand over to each other.
 */
public final class HsBoundaries {

    /** s′(273.15 K), J/(kg·K): lower end of h′1(s). IAPWS SR4-04(2014), section on h′1(s). */
    public static final double S_SAT_LIQUID_273 = -1.545495919e-1;
    /** s′(623.15 K), J/(kg·K): where h′1(s) hands over to h′3(s). IAPWS SR4-04(2014). */
    public static final double S_SAT_LIQUID_623 = 3.778281340e3;
    /** s at the point where the B13 boundary (T = 623.15 K) starts at 100 MPa, J/(kg·K). IAPWS SR4-04(2014). */
    public static final double S_B13_MIN = 3.397782955e3;
    /** Critical entropy s_c, J/(kg·K): where h′3(s) meets h″2c3b(s), and the 3a/3b boundary. IAPWS SR3-03(2014), SR4-04(2014). */
    public static final double S_CRIT = Region3PhPs.S_CRIT * 1e3;
    /** s″(623.15 K), J/(kg·K): lower end of T_sat(h,s). IAPWS SR4-04(2014). */
    public static final double S_SAT_VAPOUR_623 = 5.210887825e3;
    /** s = 5.85 kJ/(kg·K), J/(kg·K): where h″2c3b(s) hands over to h″2ab(s). IAPWS SR4-04(2014). */
    public static final double S_2BC = 5.85e3;
    /** s″(273.15 K), J/(kg·K): upper end of h″2ab(s) and of T_sat(h,s). IAPWS SR4-04(2014). */
    public static final double S_SAT_VAPOUR_273 = 9.155759395e3;
    /**
     * Smallest entropy along the B23 boundary, J/(kg·K): B23 is roughly an isentrope, and T_B23(h,s)
     * is valid for s between this and {@link #S_B23_MAX}. IAPWS SR4-04(2014).
     */
    public static final double S_B23_MIN = 5.048096828e3;
    /** Largest entropy along the B23 boundary, J/(kg·K), reached at 863.15 K and 100 MPa. IAPWS SR4-04(2014). */
    public static final double S_B23_MAX = 5.260578707e3;
    /** Lower enthalpy end of the B23 boundary, J/kg: h″(623.15 K). IAPWS SR4-04(2014). */
    public static final double H_B23_MIN = 2.563592004e6;
    /** Upper enthalpy end of the B23 boundary, J/kg, at 863.15 K and 100 MPa. IAPWS SR4-04(2014). */
    public static final double H_B23_MAX = 2.812942061e6;

    /** IAPWS SR4-04(2014): h′1(s), η = Σ nᵢ (σ − 1.09)^Iᵢ (σ + 0.366e-4)^Jᵢ with h* = 1700 kJ/kg, s* = 3.8 kJ/(kg K). */
    private static final double[] H1_SAT_LIQUID = {
            // I, J, n
            0, 14, 0.332171191705237,
            0, 36, 0.611217706323496e-3,
            1, 3, -0.882092478906822e1,
            1, 16, -0.455628192543250,
            2, 0, -0.263483840850452e-4,
            2, 5, -0.223949661148062e2,
            3, 4, -0.428398660164013e1,
            3, 36, -0.616679338856916,
            4, 4, -0.146823031104040e2,
            4, 16, 0.284523138727299e3,
            4, 24, -0.113398503195444e3,
            5, 18, 0.115671380760859e4,
            5, 24, 0.395551267359325e3,
            7, 1, -0.154891257229285e1,
            8, 4, 0.194486637751291e2,
            12, 2, -0.357915139457043e1,
            12, 4, -0.335369414148819e1,
            14, 1, -0.664426796332460,
            14, 22, 0.323321885383934e5,
            16, 10, 0.331766744667084e4,
            20, 12, -0.223501257931087e5,
            20, 28, 0.573953875852936e7,
            22, 8, 0.173226193407919e3,
            24, 3, -0.363968822121321e-1,
            28, 0, 0.834596332878346e-6,
            32, 6, 0.503611916682674e1,
            32, 8, 0.655444787064505e2,
    };

    /** IAPWS SR4-04(2014): h′3(s), η = Σ nᵢ (σ − 1.09)^Iᵢ (σ + 0.366e-4)^Jᵢ with h* = 1700 kJ/kg, s* = 3.8 kJ/(kg K). */
    private static final double[] H3_SAT_LIQUID = {
            // I, J, n
            0, 1, 0.822673364673336,
            0, 4, 0.181977213534479,
            0, 10, -0.112000260313624e-1,
            0, 16, -0.746778287048033e-3,
            2, 1, -0.179046263257381,
            3, 36, 0.424220110836657e-1,
            4, 3, -0.341355823438768,
            4, 16, -0.209881740853565e1,
            5, 20, -0.822477343323596e1,
            5, 36, -0.499684082076008e1,
            6, 4, 0.191413958471069,
            7, 2, 0.581062241093136e-1,
            7, 28, -0.165505498701029e4,
            7, 32, 0.158870443421201e4,
            10, 14, -0.850623535172818e2,
            10, 32, -0.317714386511207e5,
            10, 36, -0.945890406632871e5,
            32, 0, -0.139273847088690e-5,
            32, 6, 0.631052532240980,
    };

    /** IAPWS SR4-04(2014): h″2ab(s), ln η = Σ nᵢ (1/σ₁ − 0.513)^Iᵢ (σ₂ − 0.524)^Jᵢ with h* = 2800 kJ/kg, s₁* = 5.21 kJ/(kg K), s₂* = 9.2 kJ/(kg K). */
    private static final double[] H2AB_SAT_VAPOUR = {
            // I, J, n
            1, 8, -0.524581170928788e3,
            1, 24, -0.926947218142218e7,
            2, 4, -0.237385107491666e3,
            2, 32, 0.210770155812776e11,
            4, 1, -0.239494562010986e2,
            4, 2, 0.221802480294197e3,
            7, 7, -0.510472533393438e7,
            8, 5, 0.124981396109147e7,
            8, 12, 0.200008436996201e10,
            10, 1, -0.815158509791035e3,
            12, 0, -0.157612685637523e3,
            12, 7, -0.114200422332791e11,
            18, 10, 0.662364680776872e16,
            20, 12, -0.227622818296144e19,
            24, 32, -0.171048081348406e32,
            28, 8, 0.660788766938091e16,
            28, 12, 0.166320055886021e23,
            28, 20, -0.218003784381501e30,
            28, 22, -0.787276140295618e30,
            28, 24, 0.151062329700346e32,
            32, 2, 0.795732170300541e7,
            32, 7, 0.131957647355347e16,
            32, 12, -0.325097068299140e24,
            32, 14, -0.418600611419248e26,
            32, 24, 0.297478906557467e35,
            36, 10, -0.953588761745473e20,
            36, 12, 0.166957699620939e25,
            36, 20, -0.175407764869978e33,
            36, 22, 0.347581490626396e35,
            36, 28, -0.710971318427851e39,
    };

    /** IAPWS SR4-04(2014): h″2c3b(s), η = [Σ nᵢ (σ − 1.02)^Iᵢ (σ − 0.726)^Jᵢ]⁴ with h* = 2800 kJ/kg, s* = 5.9 kJ/(kg K). */
    private static final double[] H2C3B_SAT_VAPOUR = {
            // I, J, n
            0, 0, 0.104351280732769e1,
            0, 3, -0.227807912708513e1,
            0, 4, 0.180535256723202e1,
            1, 0, 0.420440834792042,
            1, 12, -0.105721244834660e6,
            5, 36, 0.436911607493884e25,
            6, 12, -0.328032702839753e12,
            7, 16, -0.678686760804270e16,
            8, 2, 0.743957464645363e4,
            8, 20, -0.356896445355761e20,
            12, 32, 0.167590585186801e32,
            16, 36, -0.355028625419105e38,
            22, 2, 0.396611982166538e12,
            22, 32, -0.414716268484468e41,
            24, 7, 0.359080103867382e19,
            36, 20, -0.116994334851995e41,
    };

    /** IAPWS SR4-04(2014): T_B23(h,s), θ = Σ nᵢ (η − 0.727)^Iᵢ (σ − 0.864)^Jᵢ with T* = 900 K, h* = 3000 kJ/kg, s* = 5.3 kJ/(kg K). */
    private static final double[] T_B23_HS = {
            // I, J, n
            -12, 10, 0.629096260829810e-3,
            -10, 8, -0.823453502583165e-3,
            -8, 3, 0.515446951519474e-7,
            -4, 4, -0.117565945784945e1,
            -3, 3, 0.348519684726192e1,
            -2, -6, -0.507837382408313e-11,
            -2, 2, -0.284637670005479e1,
            -2, 3, -0.236092263939673e1,
            -2, 4, 0.601492324973779e1,
            0, 0, 0.148039650824546e1,
            1, -3, 0.360075182221907e-3,
            1, -2, -0.126700045009952e-1,
            1, 10, -0.122184332521413e7,
            3, -2, 0.149276502463272,
            3, -1, 0.698733471798484,
            5, -5, -0.252207040114321e-1,
            6, -6, 0.147151930985213e-1,
            6, -3, -0.108618917681849e1,
            8, -8, -0.936875039816322e-3,
            8, -2, 0.819877897570217e2,
            8, -1, -0.182041861521835e3,
            12, -12, 0.261907376402688e-5,
            12, -1, -0.291626417025961e5,
            14, -12, 0.140660774926165e-4,
            14, 1, 0.783237062349385e7,
    };

    /** IAPWS SR4-04(2014): T_sat(h,s), θ = Σ nᵢ (η − 0.119)^Iᵢ (σ − 1.07)^Jᵢ with T* = 550 K, h* = 2800 kJ/kg, s* = 9.2 kJ/(kg K). */
    private static final double[] T_SAT_HS = {
            // I, J, n
            0, 0, 0.179882673606601,
            0, 3, -0.267507455199603,
            0, 12, 0.116276722612600e1,
            1, 0, 0.147545428713616,
            1, 1, -0.512871635973248,
            1, 2, 0.421333567697984,
            1, 5, 0.563749522189870,
            2, 0, 0.429274443819153,
            2, 5, -0.335704552142140e1,
            2, 8, 0.108890916499278e2,
            3, 0, -0.248483390456012,
            3, 2, 0.304153221906390,
            3, 3, -0.494819763939905,
            3, 4, 0.107551674933261e1,
            4, 0, 0.733888415457688e-1,
            4, 1, 0.140170545411085e-1,
            5, 1, -0.106110975998808,
            5, 2, 0.168324361811875e-1,
            5, 4, 0.125028363714877e1,
            5, 16, 0.101316840309509e4,
            6, 6, -0.151791558000712e1,
            6, 8, 0.524277865990866e2,
            6, 22, 0.230495545563912e5,
            8, 1, 0.249459806365456e-1,
            10, 20, 0.210796467412137e7,
            10, 36, 0.366836848613065e9,
            12, 24, -0.144814105365163e9,
            14, 1, -0.179276373003590e-2,
            14, 28, 0.489955602100459e10,
            16, 12, 0.471262212070518e3,
            16, 32, -0.829294390198652e11,
            18, 14, -0.171545662263191e4,
            18, 22, 0.355777682973575e7,
            18, 36, 0.586062760258436e12,
            20, 24, -0.129887635078195e8,
            28, 36, 0.317247449371057e11,
    };

    /** IAPWS SR4-04(2014): h_B13(s), η = Σ nᵢ (σ − 0.884)^Iᵢ (σ − 0.864)^Jᵢ with h* = 1700 kJ/kg, s* = 3.8 kJ/(kg K). */
    private static final double[] H_B13 = {
            // I, J, n
            0, 0, 0.913965547600543,
            1, -2, -0.430944856041991e-4,
            1, 2, 0.603235694765419e2,
            3, -12, 0.117518273082168e-17,
            5, -4, 0.220000904781292,
            6, -3, -0.690815545851641e2,
    };

    private static final PowerSeries H1 = PowerSeries.ofTriples(H1_SAT_LIQUID);
    private static final PowerSeries H3 = PowerSeries.ofTriples(H3_SAT_LIQUID);
    private static final PowerSeries H2AB = PowerSeries.ofTriples(H2AB_SAT_VAPOUR);
    private static final PowerSeries H2C3B = PowerSeries.ofTriples(H2C3B_SAT_VAPOUR);
    private static final PowerSeries TB23 = PowerSeries.ofTriples(T_B23_HS);
    private static final PowerSeries TSAT = PowerSeries.ofTriples(T_SAT_HS);
    private static final PowerSeries HB13 = PowerSeries.ofTriples(H_B13);

    private HsBoundaries() {
    }

    /**
     * Saturated-liquid enthalpy h′1(s), J/kg, on the boundary between regions 1 and 4, for
     * s′(273.15 K) ≤ s ≤ s′(623.15 K), i.e. {@link #S_SAT_LIQUID_273} to {@link #S_SAT_LIQUID_623}.
     *
     * @param s specific entropy, J/(kg·K)
     */
    public static double saturatedLiquidEnthalpy1(double s) {
        double sigma = s / 3.8e3;
        return 1700e3 * H1.sum(sigma - 1.09, sigma + 0.366e-4);
    }

    /**
     * Saturated-liquid enthalpy h′3(s), J/kg, on the boundary between regions 3 and 4, for
     * s′(623.15 K) ≤ s ≤ s_c, i.e. {@link #S_SAT_LIQUID_623} to {@link #S_CRIT}.
     *
     * @param s specific entropy, J/(kg·K)
     */
    public static double saturatedLiquidEnthalpy3(double s) {
        double sigma = s / 3.8e3;
        return 1700e3 * H3.sum(sigma - 1.09, sigma + 0.366e-4);
    }

    /**
     * Saturated-vapour enthalpy h″2ab(s), J/kg, on the boundary between regions 2a/2b and 4, for
     * 5.85 kJ/(kg·K) ≤ s ≤ s″(273.15 K), i.e. {@link #S_2BC} to {@link #S_SAT_VAPOUR_273}.
     *
     * @param s specific entropy, J/(kg·K)
     */
    public static double saturatedVapourEnthalpy2ab(double s) {
        double sigma1 = s / 5.21e3;
        double sigma2 = s / 9.2e3;
        return 2800e3 * Math.exp(H2AB.sum(1 / sigma1 - 0.513, sigma2 - 0.524));
    }

    /**
     * Saturated-vapour enthalpy h″2c3b(s), J/kg, on the boundary between regions 2c/3b and 4, for
     * s_c ≤ s ≤ 5.85 kJ/(kg·K), i.e. {@link #S_CRIT} to {@link #S_2BC}.
     *
     * @param s specific entropy, J/(kg·K)
     */
    public static double saturatedVapourEnthalpy2c3b(double s) {
        double sigma = s / 5.9e3;
        double eta = H2C3B.sum(sigma - 1.02, sigma - 0.726);
        double eta2 = eta * eta;
        return 2800e3 * eta2 * eta2;
    }

    /**
     * Enthalpy h_B13(s), J/kg, on the boundary between regions 1 and 3 (the 623.15 K isotherm), for
     * {@link #S_B13_MIN} ≤ s ≤ s′(623.15 K) ({@link #S_SAT_LIQUID_623}). IAPWS SR4-04(2014).
     *
     * @param s specific entropy, J/(kg·K)
     */
    public static double b13Enthalpy(double s) {
        double sigma = s / 3.8e3;
        return 1700e3 * HB13.sum(sigma - 0.884, sigma - 0.864);
    }

    /**
     * Temperature T_B23(h,s), K, on the boundary between regions 2 and 3, for
     * {@link #H_B23_MIN} ≤ h ≤ {@link #H_B23_MAX} and {@link #S_B23_MIN} ≤ s ≤ {@link #S_B23_MAX}.
     * Compared with T_B23(p) of IAPWS R7-97(2012) at the state's pressure it tells the two regions
     * apart.
     *
     * @param h specific enthalpy, J/kg
     * @param s specific entropy, J/(kg·K)
     */
    public static double b23Temperature(double h, double s) {
        return 900 * TB23.sum(h / 3000e3 - 0.727, s / 5.3e3 - 0.864);
    }

    /**
     * Saturation temperature T_sat(h,s), K, of a wet-steam state in region 4, for
     * s″(623.15 K) ≤ s ≤ s″(273.15 K), i.e. {@link #S_SAT_VAPOUR_623} to {@link #S_SAT_VAPOUR_273},
     * and h between the saturated-liquid and saturated-vapour enthalpies at that s.
     *
     * @param h specific enthalpy, J/kg
     * @param s specific entropy, J/(kg·K)
     */
    public static double backwardSaturationTemperatureHS(double h, double s) {
        return 550 * TSAT.sum(h / 2800e3 - 0.119, s / 9.2e3 - 1.07);
    }
}
