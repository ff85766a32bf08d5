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

    /**
     * Density, kg/m³, from pressure and temperature: the backward value of
     * {@link #backwardVolumePT} refined by Newton's method on p(ρ, T) = p with the basic equation,
     * to machine precision: the iteration stops when the Newton step is below 1e-15 relative, the
     * pressure residual is at rounding level (2e-15 relative), or the steps stop shrinking in the
     * quadratic range. Away from the critical point ρ is then within 1e-13 relative of the root of
     * eq. 28 (the tests hold it to 1e-12). Within about 1 K and 40 kg/m³ of the critical point
     * p(ρ) is nearly flat and (p, T) fixes ρ only to about the cube root of the rounding error:
     * there the pressure is still reproduced to 1e-13 relative, the density to 1e-4 relative.
     *
     * @param p pressure, Pa
     * @param T temperature, K
     * @throws IllegalStateException if the iteration does not converge within {@value #MAX_ITERATIONS} steps
     */
    public static double density(double p, double T) {
        return solveDensity(p, T, 1 / backwardVolumePT(p, T), 0, "density(p, T)");
    }

    /**
     * Saturated-liquid density ρ′, kg/m³, at T for 623.15 K ≤ T &lt; 647.096 K, given the saturation
     * pressure p_s(T) the caller uses: the solution of p(ρ, T) = p_s on the liquid side, started from
     * the subregion equation IAPWS SR5-05(2016) assigns to the saturated liquid (3c, 3s, 3u or 3y).
     *
     * @param T    temperature, K
     * @param pSat saturation pressure at T, Pa
     * @throws IllegalStateException if the iteration does not converge
     */
    public static double saturatedLiquidDensity(double T, double pSat) {
        double pMPa = pSat / 1e6;
        int subregion = Region3VolumePT.saturatedLiquidSubregion(pMPa);
        double start = 1 / Region3VolumePT.volume(subregion, pMPa, T);
        return T < SINGLE_ROOT_TEMPERATURE
                ? solveDensity(pSat, T, start, 1, "saturatedLiquidDensity")
                : solveDensity(pSat, T, start, 0, "saturatedLiquidDensity");
    }

    /**
     * Saturated-liquid density ρ′, kg/m³, for 623.15 K ≤ T &lt; 647.096 K, with p_s(T) from the
     * saturation-pressure equation of IAPWS R7-97(2012), eq. 30.
     *
     * @param T temperature, K
     */
    public static double saturatedLiquidDensity(double T) {
        return saturatedLiquidDensity(T, Saturation.pressure(T));
    }

    /**
     * Saturated-vapour density ρ″, kg/m³, at T for 623.15 K ≤ T &lt; 647.096 K, given the saturation
     * pressure p_s(T) the caller uses: the solution of p(ρ, T) = p_s on the vapour side, started from
     * the subregion equation IAPWS SR5-05(2016) assigns to the saturated vapour (3t, 3r, 3x or 3z).
     *
     * @param T    temperature, K
     * @param pSat saturation pressure at T, Pa
     * @throws IllegalStateException if the iteration does not converge
     */
    public static double saturatedVapourDensity(double T, double pSat) {
        double pMPa = pSat / 1e6;
        int subregion = Region3VolumePT.saturatedVapourSubregion(pMPa);
        double start = 1 / Region3VolumePT.volume(subregion, pMPa, T);
        return T < SINGLE_ROOT_TEMPERATURE
                ? solveDensity(pSat, T, start, -1, "saturatedVapourDensity")
                : solveDensity(pSat, T, start, 0, "saturatedVapourDensity");
    }

    /**
     * Saturated-vapour density ρ″, kg/m³, for 623.15 K ≤ T &lt; 647.096 K, with p_s(T) from the
     * saturation-pressure equation of IAPWS R7-97(2012), eq. 30.
     *
     * @param T temperature, K
     */
    public static double saturatedVapourDensity(double T) {
        return saturatedVapourDensity(T, Saturation.pressure(T));
    }

    /** Pressure residual, relative, at which p(ρ, T) is as close to p as rounding allows. */
    private static final double PRESSURE_RESIDUAL = 2e-15;
    /**
     * Within a few hundredths of a millikelvin of the critical temperature of the region-4
     * equation, the region-3 isotherm at p_s(T) no longer has a van der Waals loop: eq. 28's own
     * critical point lies a hair below 647.096 K. There p(ρ, T) = p_s has a single root, which is
     * then both the saturated-liquid and the saturated-vapour density (seen by scanning the
     * isotherm at T_c − 1e-5 K: one sign change, at 322.38 kg/m³).
     */
    private static final double SINGLE_ROOT_TEMPERATURE = T_CRIT - 5e-5;
    /** Relative width of a bracket on ρ that leaves nothing to refine. */
    private static final double BRACKET_WIDTH = 1e-14;
    /** Relative Newton step that is a few ulps: the iterate is converged. */
    private static final double CONVERGED_STEP = 1e-15;
    /**
     * Relative step below which Newton is in its quadratic range; if a step from there shrinks by
     * less than half, the iteration has reached the rounding noise of eq. 28 and stops.
     */
    private static final double QUADRATIC_RANGE = 1e-8;

    /**
     * Safeguarded Newton iteration on p(ρ, T) = p. The iterates bracket the root from the sign of
     * the residual (p rises with ρ on every stable branch); a step that leaves the bracket, or is
     * taken where ∂p/∂ρ ≤ 0 (inside the van der Waals loop), becomes a bisection or, before a bracket
     * exists, a 2 % move towards the root along the branch ({@code side} +1 liquid, −1 vapour, 0 either).
     */
    private static double solveDensity(double p, double T, double rhoStart, int side, String what) {
        return solveDensity(p, T, rhoStart, side, what, MAX_ITERATIONS);
    }

    /** As {@link #solveDensity(double, double, double, int, String)} with a given iteration bound. */
    static double solveDensity(double p, double T, double rhoStart, int side, String what, int maxIterations) {
        double rho = rhoStart;
        double lo = 0;
        double hi = Double.POSITIVE_INFINITY;
        double rt = R * T;
        double previousStep = Double.POSITIVE_INFINITY;
        for (int iteration = 1; iteration <= maxIterations; iteration++) {
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
            double residual = rho * rt * dPhiD - p;
            double slope = rt * (2 * dPhiD + ddPhiDD);
            if (residual == 0) {
                return rho;
            }
            if (residual < 0) {
                lo = Math.max(lo, rho);
            } else {
                hi = Math.min(hi, rho);
            }
            double next = rho - residual / slope;
            if (slope > 0) {
                double step = Math.abs(next - rho) / rho;
                if (step <= CONVERGED_STEP || Math.abs(residual) <= PRESSURE_RESIDUAL * p
                        || (previousStep <= QUADRATIC_RANGE && step >= 0.5 * previousStep)) {
                    return next;
                }
                previousStep = step;
            }
            if (hi - lo <= BRACKET_WIDTH * rho) {
                // Near the critical point ∂p/∂ρ vanishes and rounding in p hides the root's last
                // digits from Newton; a bracket this narrow is the answer.
                return 0.5 * (lo + hi);
            }
            if (!(slope > 0) || !(next > lo) || !(next < hi)) {
                if (lo > 0 && hi < Double.POSITIVE_INFINITY) {
                    next = 0.5 * (lo + hi);
                } else {
                    boolean denser = slope > 0 || side == 0 ? residual < 0 : side > 0;
                    next = denser ? rho * 1.02 : rho / 1.02;
                }
                previousStep = Double.POSITIVE_INFINITY;
            }
            rho = next;
        }
        throw new IllegalStateException(what + ": no convergence in " + maxIterations
                + " Newton steps for p = " + p + " Pa, T = " + T + " K (start " + rhoStart + " kg/m3)");
    }

    // ---------------------------------------------------------------------------------------------
    // From (p, h) and (p, s): IAPWS SR3-03(2014)

    /**
     * Enthalpy h3ab(p), J/kg, on the boundary between subregions 3a and 3b of the (p,h) and (p,s)
     * backward equations (it runs close to the critical isentrope), for p_c ≤ p ≤ 100 MPa. IAPWS
     * SR3-03(2014).
     *
     * @param p pressure, Pa
     */
    public static double boundaryEnthalpy3ab(double p) {
        return Region3PhPs.h3ab(p / 1e6) * 1e3;
    }

    /**
     * Temperature, K, from the backward equation T3a(p,h) (h ≤ h3ab(p)) or T3b(p,h) of IAPWS
     * SR3-03(2014) as published. For the value consistent with eq. 28 use {@link #temperaturePH}.
     *
     * @param p pressure, Pa
     * @param h specific enthalpy, J/kg
     */
    public static double backwardTemperaturePH(double p, double h) {
        return Region3PhPs.temperaturePH(p / 1e6, h / 1e3);
    }

    /**
     * Specific volume, m³/kg, from the backward equation v3a(p,h) (h ≤ h3ab(p)) or v3b(p,h) of IAPWS
     * SR3-03(2014) as published. For the value consistent with eq. 28 use {@link #densityPH}.
     *
     * @param p pressure, Pa
     * @param h specific enthalpy, J/kg
     */
    public static double backwardVolumePH(double p, double h) {
        return Region3PhPs.volumePH(p / 1e6, h / 1e3);
    }

    /**
     * Temperature, K, from the backward equation T3a(p,s) (s ≤ s_c = 4.41202148223476 kJ/(kg·K)) or
     * T3b(p,s) of IAPWS SR3-03(2014) as published. For the value consistent with eq. 28 use
     * {@link #temperaturePS}.
     *
     * @param p pressure, Pa
     * @param s specific entropy, J/(kg·K)
     */
    public static double backwardTemperaturePS(double p, double s) {
        return Region3PhPs.temperaturePS(p / 1e6, s / 1e3);
    }

    /**
     * Specific volume, m³/kg, from the backward equation v3a(p,s) (s ≤ s_c) or v3b(p,s) of IAPWS
     * SR3-03(2014) as published. For the value consistent with eq. 28 use {@link #densityPS}.
     *
     * @param p pressure, Pa
     * @param s specific entropy, J/(kg·K)
     */
    public static double backwardVolumePS(double p, double s) {
        return Region3PhPs.volumePS(p / 1e6, s / 1e3);
    }

    /**
     * Density, kg/m³, at (p, h) in region 3: the backward values of SR3-03(2014) refined by Newton's
     * method in (ρ, T) on eq. 28 until p and h are reproduced to rounding level (2e-15 relative) or
     * the step is a few ulps.
     *
     * @param p pressure, Pa
     * @param h specific enthalpy, J/kg
     * @throws IllegalStateException if the iteration does not converge within {@value #MAX_ITERATIONS} steps
     */
    public static double densityPH(double p, double h) {
        return solvePH(p, h, WANT_DENSITY, MAX_ITERATIONS);
    }

    /**
     * Temperature, K, at (p, h) in region 3, refined as in {@link #densityPH}.
     *
     * @param p pressure, Pa
     * @param h specific enthalpy, J/kg
     * @throws IllegalStateException if the iteration does not converge within {@value #MAX_ITERATIONS} steps
     */
    public static double temperaturePH(double p, double h) {
        return solvePH(p, h, WANT_TEMPERATURE, MAX_ITERATIONS);
    }

    /**
     * Density, kg/m³, at (p, s) in region 3: the backward values of SR3-03(2014) refined by Newton's
     * method in (ρ, T) on eq. 28 until p and s are reproduced to rounding level.
     *
     * @param p pressure, Pa
     * @param s specific entropy, J/(kg·K)
     * @throws IllegalStateException if the iteration does not converge within {@value #MAX_ITERATIONS} steps
     */
    public static double densityPS(double p, double s) {
        return solvePS(p, s, WANT_DENSITY, MAX_ITERATIONS);
    }

    /**
     * Temperature, K, at (p, s) in region 3, refined as in {@link #densityPS}.
     *
     * @param p pressure, Pa
     * @param s specific entropy, J/(kg·K)
     * @throws IllegalStateException if the iteration does not converge within {@value #MAX_ITERATIONS} steps
     */
    public static double temperaturePS(double p, double s) {
        return solvePS(p, s, WANT_TEMPERATURE, MAX_ITERATIONS);
    }

    /**
     * Saturation pressure p3sat(h), Pa, on the boundary between regions 3 and 4, for
     * h′(623.15 K) ≤ h ≤ h″(623.15 K) (1.670858218 to 2.563592004 MJ/kg). IAPWS SR3-03(2014).
     *
     * @param h specific enthalpy, J/kg
     */
    public static double saturationPressureH(double h) {
        return Region3PhPs.saturationPressureH(h / 1e3) * 1e6;
    }

    /**
     * Saturation pressure p3sat(s), Pa, on the boundary between regions 3 and 4, for
     * s′(623.15 K) ≤ s ≤ s″(623.15 K) (3.778281340 to 5.210887825 kJ/(kg·K)). IAPWS SR3-03(2014).
     *
     * @param s specific entropy, J/(kg·K)
     */
    public static double saturationPressureS(double s) {
        return Region3PhPs.saturationPressureS(s / 1e3) * 1e6;
    }

    // ---------------------------------------------------------------------------------------------
    // From (h, s): IAPWS SR4-04(2014)

    /**
     * Pressure, Pa, from the backward equation p3a(h,s) (s ≤ s_c = 4.41202148223476 kJ/(kg·K)) or
     * p3b(h,s) of IAPWS SR4-04(2014) as published. For the value consistent with eq. 28 use
     * {@link #pressureHS}.
     *
     * @param h specific enthalpy, J/kg
     * @param s specific entropy, J/(kg·K)
     */
    public static double backwardPressureHS(double h, double s) {
        return Region3Hs.pressure(h / 1e3, s / 1e3) * 1e6;
    }

    /**
     * Pressure, Pa, at (h, s) in region 3: starting from p3(h,s) of SR4-04(2014) and T, v from the
     * (p,h) equations of SR3-03(2014) at that pressure, Newton's method in (ρ, T) on eq. 28 until h
     * and s are reproduced to rounding level; the pressure of eq. 28 at the converged (ρ, T).
     *
     * @param h specific enthalpy, J/kg
     * @param s specific entropy, J/(kg·K)
     * @throws IllegalStateException if the iteration does not converge within {@value #MAX_ITERATIONS} steps
     */
    public static double pressureHS(double h, double s) {
        return solveHS(h, s, MAX_ITERATIONS);
    }

    static final int WANT_DENSITY = 0;
    static final int WANT_TEMPERATURE = 1;
    private static final int WANT_PRESSURE = 2;

    private static final int MODE_PH = 0;
    private static final int MODE_PS = 1;
    private static final int MODE_HS = 2;

    static double solvePH(double p, double h, int want, int maxIterations) {
        double pMPa = p / 1e6;
        double hKJ = h / 1e3;
        return solve2d(MODE_PH, p, h, 1 / Region3PhPs.volumePH(pMPa, hKJ), Region3PhPs.temperaturePH(pMPa, hKJ),
                want, maxIterations);
    }

    static double solvePS(double p, double s, int want, int maxIterations) {
        double pMPa = p / 1e6;
        double sKJ = s / 1e3;
        return solve2d(MODE_PS, p, s, 1 / Region3PhPs.volumePS(pMPa, sKJ), Region3PhPs.temperaturePS(pMPa, sKJ),
                want, maxIterations);
    }

    static double solveHS(double h, double s, int maxIterations) {
        double hKJ = h / 1e3;
        double pMPa = Region3Hs.pressure(hKJ, s / 1e3);
        return solve2d(MODE_HS, h, s, 1 / Region3PhPs.volumePH(pMPa, hKJ), Region3PhPs.temperaturePH(pMPa, hKJ),
                WANT_PRESSURE, maxIterations);
    }

    /** Largest relative density change and temperature change, K, of one Newton step. */
    private static final double MAX_DENSITY_STEP = 0.3;
    private static final double MAX_TEMPERATURE_STEP = 20;

    /**
     * Newton's method in (ρ, T) for two of p, h, s given as {@code a}, {@code b}: (p, h), (p, s) or
     * (h, s) by {@code mode}. The Jacobian comes from the same pass over Table 30 as the residuals,
     * using ∂p/∂ρ = RT(2δφ_δ + δ²φ_δδ), ∂p/∂T = ρR(δφ_δ − δτφ_δτ), ∂h/∂ρ = (RT/ρ)(δτφ_δτ + δφ_δ + δ²φ_δδ),
     * ∂h/∂T = R(δφ_δ − τ²φ_ττ − δτφ_δτ), ∂s/∂ρ = (R/ρ)(δτφ_δτ − δφ_δ), ∂s/∂T = −Rτ²φ_ττ/T. A step is
     * shortened to at most 30 % in ρ and 20 K in T, which only the first step from a poor start needs.
     */
    private static double solve2d(int mode, double a, double b, double rhoStart, double tStart, int want,
                                  int maxIterations) {
        double rho = rhoStart;
        double T = tStart;
        double previousStep = Double.POSITIVE_INFINITY;
        for (int iteration = 1; iteration <= maxIterations; iteration++) {
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
            double rt = R * T;
            double f1;
            double f2;
            double j11;
            double j12;
            double j21;
            double j22;
            if (mode == MODE_HS) {
                f1 = rt * (tPhiT + dPhiD) - a;
                j11 = rt / rho * (dtPhiDT + dPhiD + ddPhiDD);
                j12 = R * (dPhiD - ttPhiTT - dtPhiDT);
            } else {
                f1 = rho * rt * dPhiD - a;
                j11 = rt * (2 * dPhiD + ddPhiDD);
                j12 = rho * R * (dPhiD - dtPhiDT);
            }
            if (mode == MODE_PH) {
                f2 = rt * (tPhiT + dPhiD) - b;
                j21 = rt / rho * (dtPhiDT + dPhiD + ddPhiDD);
                j22 = R * (dPhiD - ttPhiTT - dtPhiDT);
            } else {
                f2 = R * (tPhiT - phi) - b;
                j21 = R / rho * (dtPhiDT - dPhiD);
                j22 = -R * ttPhiTT / T;
            }
            double det = j11 * j22 - j12 * j21;
            double dRho = (f1 * j22 - f2 * j12) / det;
            double dT = (j11 * f2 - j21 * f1) / det;
            double shorten = 1;
            if (Math.abs(dRho) > MAX_DENSITY_STEP * rho) {
                shorten = MAX_DENSITY_STEP * rho / Math.abs(dRho);
            }
            if (Math.abs(dT) * shorten > MAX_TEMPERATURE_STEP) {
                shorten = MAX_TEMPERATURE_STEP / Math.abs(dT);
            }
            double rhoNext = rho - shorten * dRho;
            double tNext = T - shorten * dT;
            double step = Math.max(Math.abs(rhoNext - rho) / rho, Math.abs(tNext - T) / T);
            boolean residualAtRounding = Math.abs(f1) <= PRESSURE_RESIDUAL * Math.abs(a)
                    && Math.abs(f2) <= PRESSURE_RESIDUAL * Math.abs(b);
            boolean converged = step <= CONVERGED_STEP || residualAtRounding
                    || (previousStep <= QUADRATIC_RANGE && step >= 0.5 * previousStep);
            previousStep = step;
            if (Double.isFinite(rhoNext) && Double.isFinite(tNext) && rhoNext > 0 && tNext > 0) {
                rho = rhoNext;
                T = tNext;
            }
            if (converged) {
                if (want == WANT_DENSITY) {
                    return rho;
                }
                return want == WANT_TEMPERATURE ? T : pressure(rho, T);
            }
        }
        String[] names = {"(p, h)", "(p, s)", "(h, s)"};
        throw new IllegalStateException("region 3 from " + names[mode] + ": no convergence in " + maxIterations
                + " Newton steps for " + a + ", " + b + " (start rho = " + rhoStart + " kg/m3, T = " + tStart + " K)");
    }
}
