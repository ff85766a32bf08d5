package org.steamtally.calc.steam;

/**
 * IF97 region 3: the basic equation, the dimensionless Helmholtz free energy
 * φ(δ, τ) = f/(RT) = n₁ ln δ + Σ nᵢ δᴵⁱ τᴶⁱ with δ = ρ/ρ* and τ = T* / T (IAPWS R7-97(2012), eq. 28,
 * Tables 30 and 31), and the backward and iterative inversions of it from (p, T), (p, h), (p, s) and
 * (h, s) defined by the IAPWS supplementary releases SR5-05(2016), SR3-03(2014) and SR4-04(2014).
 *
 * <p>Range: 623.15 K ≤ T ≤ T_B23(p), p_B23(T) ≤ p ≤ 100 MPa (R7-97(2012), section 5); the equation
 * also gives reasonable values in the metastable states next to the saturation line. Methods here do
 * no range checks (the caller selects the region); inside the range they return finite values.
 *
 * <p>All arguments and results are SI: Pa, K, kg/m³, m³/kg, J/kg, J/(kg·K), m/s. Every method is
 * static, allocation-free and safe to call from any thread.
 */
public final class Region3 {

    /** Specific gas constant of water, J/(kg·K). IAPWS R7-97(2012), eq. 1. */
    static final double R = 461.526;
    /** Critical temperature, K; the reducing temperature T* of eq. 28. IAPWS R7-97(2012), eq. 3. */
    static final double T_CRIT = 647.096;
    /** Critical pressure, Pa. IAPWS R7-97(2012), eq. 4. */
    static final double P_CRIT = 22.064e6;
    /** Critical density, kg/m³; the reducing density ρ* of eq. 28. IAPWS R7-97(2012), eq. 5. */
    static final double RHO_CRIT = 322.0;
    /** Coefficient n₁ of the logarithmic term of eq. 28. IAPWS R7-97(2012), Table 30. */
    private static final double N1 = 0.10658070028513e1;

    /** IAPWS R7-97(2012), Table 30: coefficients and exponents of eq. 28, terms i = 2 to 40 (n₁ is {@link #N1}). */
    private static final double[] FORWARD = {
            // I, J, n
            0, 0, -0.15732845290239e2,
            0, 1, 0.20944396974307e2,
            0, 2, -0.76867707878716e1,
            0, 7, 0.26185947787954e1,
            0, 10, -0.28080781148620e1,
            0, 12, 0.12053369696517e1,
            0, 23, -0.84566812812502e-2,
            1, 2, -0.12654315477714e1,
            1, 6, -0.11524407806681e1,
            1, 15, 0.88521043984318,
            1, 17, -0.64207765181607,
            2, 0, 0.38493460186671,
            2, 2, -0.85214708824206,
            2, 6, 0.48972281541877e1,
            2, 7, -0.30502617256965e1,
            2, 22, 0.39420536879154e-1,
            2, 26, 0.12558408424308,
            3, 0, -0.27999329698710,
            3, 2, 0.13899799569460e1,
            3, 4, -0.20189915023570e1,
            3, 16, -0.82147637173963e-2,
            3, 26, -0.47596035734923,
            4, 0, 0.43984074473500e-1,
            4, 2, -0.44476435428739,
            4, 4, 0.90572070719733,
            4, 26, 0.70522450087967,
            5, 1, 0.10770512626332,
            5, 3, -0.32913623258954,
            5, 26, -0.50871062041158,
            6, 0, -0.22175400873096e-1,
            6, 2, 0.94260751665092e-1,
            6, 26, 0.16436278447961,
            7, 2, -0.13503372241348e-1,
            8, 26, -0.14834345352472e-1,
            9, 2, 0.57922953628084e-3,
            9, 26, 0.32308904703711e-2,
            10, 0, 0.80964802996215e-4,
            10, 1, -0.16557679795037e-3,
            11, 26, -0.44923899061815e-4,
    };

    private static final int TERMS = FORWARD.length / 3;
    private static final int[] I = new int[TERMS];
    private static final int[] J = new int[TERMS];
    private static final double[] N = new double[TERMS];
    /** J steps from one term to the next inside a run of equal I; the sums raise τ by these. */
    private static final int[] J_STEP = new int[TERMS];
    /** True where I rises by one from the previous term; then δᴵ is one multiplication away. */
    private static final boolean[] I_STEP = new boolean[TERMS];

    static {
        for (int k = 0; k < TERMS; k++) {
            I[k] = (int) FORWARD[3 * k];
            J[k] = (int) FORWARD[3 * k + 1];
            N[k] = FORWARD[3 * k + 2];
            boolean newRun = k == 0 || I[k] != I[k - 1];
            if (k > 0 && newRun && I[k] != I[k - 1] + 1) {
                throw new ExceptionInInitializerError("Table 30 rows must rise in I by one, row " + (k + 2));
            }
            if (k == 0 && I[k] != 0) {
                throw new ExceptionInInitializerError("Table 30 must start at I = 0");
            }
            I_STEP[k] = k > 0 && newRun;
            J_STEP[k] = newRun ? J[k] : J[k] - J[k - 1];
            if (J_STEP[k] < 0) {
                throw new ExceptionInInitializerError("Table 30 rows must rise in J inside a run of equal I, row " + (k + 2));
            }
        }
    }

    /** Upper bound on Newton iterations; from the release's backward values two to five are typical. */
    static final int MAX_ITERATIONS = 40;

    private static final int P = 0;
    private static final int H = 1;
    private static final int S = 2;
    private static final int U = 3;
    private static final int CP = 4;
    private static final int CV = 5;
    private static final int W = 6;

    private Region3() {
    }

    // ---------------------------------------------------------------------------------------------
    // Forward equation, IAPWS R7-97(2012), eq. 28 and Table 31

    /**
     * Pressure p = ρRT·δφ_δ, Pa. IAPWS R7-97(2012), Table 31.
     *
     * @param rho density, kg/m³
     * @param T   temperature, K
     */
    public static double pressure(double rho, double T) {
        return property(P, rho, T);
    }

    /** Specific enthalpy h = RT(τφ_τ + δφ_δ), J/kg, from density (kg/m³) and temperature (K). IAPWS R7-97(2012), Table 31. */
    public static double enthalpy(double rho, double T) {
        return property(H, rho, T);
    }

    /** Specific entropy s = R(τφ_τ − φ), J/(kg·K), from density (kg/m³) and temperature (K). IAPWS R7-97(2012), Table 31. */
    public static double entropy(double rho, double T) {
        return property(S, rho, T);
    }

    /** Specific internal energy u = RTτφ_τ, J/kg, from density (kg/m³) and temperature (K). IAPWS R7-97(2012), Table 31. */
    public static double internalEnergy(double rho, double T) {
        return property(U, rho, T);
    }

    /**
     * Specific isobaric heat capacity c_p = R(−τ²φ_ττ + (δφ_δ − δτφ_δτ)²/(2δφ_δ + δ²φ_δδ)), J/(kg·K),
     * from density (kg/m³) and temperature (K). IAPWS R7-97(2012), Table 31. It grows without bound
     * towards the critical point.
     */
    public static double isobaricHeatCapacity(double rho, double T) {
        return property(CP, rho, T);
    }

    /** Specific isochoric heat capacity c_v = −Rτ²φ_ττ, J/(kg·K), from density (kg/m³) and temperature (K). IAPWS R7-97(2012), Table 31. */
    public static double isochoricHeatCapacity(double rho, double T) {
        return property(CV, rho, T);
    }

    /**
     * Speed of sound w = √(RT(2δφ_δ + δ²φ_δδ − (δφ_δ − δτφ_δτ)²/(τ²φ_ττ))), m/s, from density (kg/m³)
     * and temperature (K). IAPWS R7-97(2012), Table 31.
     */
    public static double speedOfSound(double rho, double T) {
        return property(W, rho, T);
    }

    /**
     * One pass over Table 30 for all derivatives, then the Table 31 relation asked for. The sums are
     * kept in the scaled forms δφ_δ, δ²φ_δδ, τφ_τ, τ²φ_ττ, δτφ_δτ, which is what Table 31 uses and
     * which avoids dividing by δ or τ term by term.
     */
    private static double property(int which, double rho, double T) {
        double delta = rho / RHO_CRIT;
        double tau = T_CRIT / T;
        double phi = 0;
        double dPhiD = 0;
        double ddPhiDD = 0;
        double tPhiT = 0;
        double ttPhiTT = 0;
        double dtPhiDT = 0;
        double deltaPower = 1;
        double tauPower = 1;
        for (int k = 0; k < TERMS; k++) {
            if (I_STEP[k]) {
                deltaPower *= delta;
                tauPower = 1;
            }
            tauPower *= PowerSeries.ipow(tau, J_STEP[k]);
            double term = N[k] * deltaPower * tauPower;
            int i = I[k];
            int j = J[k];
            phi += term;
            dPhiD += i * term;
            ddPhiDD += i * (i - 1) * term;
            tPhiT += j * term;
            ttPhiTT += j * (j - 1) * term;
            dtPhiDT += i * j * term;
        }
        phi += N1 * Math.log(delta);
        dPhiD += N1;
        ddPhiDD -= N1;
        switch (which) {
            case P:
                return rho * R * T * dPhiD;
            case H:
                return R * T * (tPhiT + dPhiD);
            case S:
                return R * (tPhiT - phi);
            case U:
                return R * T * tPhiT;
            case CV:
                return -R * ttPhiTT;
            case CP: {
                double x = dPhiD - dtPhiDT;
                return R * (-ttPhiTT + x * x / (2 * dPhiD + ddPhiDD));
            }
            case W: {
                double x = dPhiD - dtPhiDT;
                return Math.sqrt(R * T * (2 * dPhiD + ddPhiDD - x * x / ttPhiTT));
            }
            default:
                throw new IllegalArgumentException("unknown property " + which);
        }
    }

    // ---------------------------------------------------------------------------------------------
    // From (p, T): IAPWS SR5-05(2016)

    /**
     * Specific volume, m³/kg, from the backward equation v(p,T) of IAPWS SR5-05(2016) as published,
     * in the subregion 3a to 3t, or auxiliary subregion 3u to 3z near the critical point, that the
     * release prescribes for (p, T). Its deviation from the basic equation is within the release's
     * tolerances (about 1e-6 relative away from the critical point); use {@link #density} for the
     * value consistent with eq. 28.
     *
     * @param p pressure, Pa
     * @param T temperature, K
     */
    public static double backwardVolumePT(double p, double T) {
        return Region3VolumePT.volume(p / 1e6, T);
    }
}
