package org.steamtally.calc.steam;

/**
 * The water/steam property facade: IAPWS-IF97 (IAPWS R7-97(2012)) with its supplementary releases,
 * in SI base units (Pa, K, J/kg, J/(kg·K), m³/kg).
 *
 * <p>Each {@code stateXY} method validates its input pair against the range of the formulation,
 * chooses the region, and returns the full state; a two-phase state lies on the saturation line and
 * carries its vapour quality. Backward pairs start from the published backward equations and are
 * refined on the forward equations, so that a round trip such as {@code statePT(p, statePH(p, h).T)}
 * reproduces {@code h} to about 1e-12 relative, far inside the permitted inconsistency of the
 * backward equations; the closure check of the plant model depends on that.
 *
 * <p>Range of validity (R7-97(2012), section 4): 273.15 K ≤ T ≤ 1073.15 K for 0 &lt; p ≤ 100 MPa,
 * and 1073.15 K &lt; T ≤ 2273.15 K for 0 &lt; p ≤ 50 MPa. Outside it, or for a pair that has no
 * state, a {@link SteamRangeException} names the pair, the value and the valid range.
 *
 * <p>The primitive methods ({@link #enthalpyPT}, {@link #temperaturePH}, ...) allocate nothing and are
 * meant for hot loops; the record methods build a {@link SteamState} on top of them.
 */
public final class Steam {

    /** Lowest temperature of the formulation, K (R7-97(2012), section 4). */
    public static final double MIN_TEMPERATURE_K = 273.15;
    /** Upper temperature of regions 1 to 3 and of region 2, K. */
    public static final double MAX_TEMPERATURE_REGION_2_K = 1073.15;
    /** Upper temperature of region 5, K. */
    public static final double MAX_TEMPERATURE_K = 2273.15;
    /** Upper pressure of regions 1 to 3, Pa. */
    public static final double MAX_PRESSURE_PA = 100e6;
    /** Upper pressure of region 5, Pa (extended to 50 MPa in the 2007 revision). */
    public static final double MAX_PRESSURE_REGION_5_PA = 50e6;
    /** The isotherm that bounds region 1 and, below B23, region 3 from below, K. */
    public static final double REGION_13_TEMPERATURE_K = 623.15;
    /** Upper temperature of the B23 boundary equation's range, K (above it region 3 cannot occur). */
    private static final double B23_MAX_TEMPERATURE_K = 863.15;
    /** Triple-point pressure, the lowest pressure of the saturation line, Pa (R7-97(2012), Table 34 range). */
    public static final double TRIPLE_POINT_PRESSURE_PA = 611.213;

    /** p_s(623.15 K), Pa: below it the region-4 line separates regions 1 and 2 (eq. 30). */
    static final double REGION_13_SATURATION_PRESSURE_PA = Saturation.pressure(REGION_13_TEMPERATURE_K);

    // Bounds that let the region selection from (p, h) and (p, s) skip a forward evaluation when the
    // input is clearly on one side of a boundary. Each lies outside the boundary's range over the
    // pressures where it is used, by a margin far above the boundary's variation between the points
    // of the scan that FacadeShortcutBoundsTest checks it with.
    /** Above every h(p, 273.15 K), p ≤ 100 MPa (the largest, at 100 MPa, is about 95.4 kJ/kg), J/kg. */
    static final double ENTHALPY_ABOVE_MIN_TEMPERATURE = 1.0e5;
    /** Below every h(p, 623.15 K) of region 1, p_s(623.15 K) ≤ p ≤ 100 MPa (least about 1553.9 kJ/kg), J/kg. */
    static final double ENTHALPY_BELOW_REGION_13 = 1.55e6;
    /** Above every saturated-vapour h'' from 611.213 Pa to p_s(623.15 K) (largest about 2803.3 kJ/kg), J/kg. */
    static final double ENTHALPY_ABOVE_SATURATED_VAPOUR = 2.81e6;
    /** Below every h(p, 1073.15 K) of region 2, p ≤ 100 MPa (least about 3715.2 kJ/kg), J/kg. */
    static final double ENTHALPY_BELOW_REGION_25 = 3.7e6;
    /** Above every s(p, 273.15 K), p ≤ 100 MPa (largest about 0.48 J/(kg·K)), J/(kg·K). */
    static final double ENTROPY_ABOVE_MIN_TEMPERATURE = 1.0;
    /** Below every s(p, 623.15 K) of region 1, p_s(623.15 K) ≤ p ≤ 100 MPa (least about 3397.8 J/(kg·K)). */
    static final double ENTROPY_BELOW_REGION_13 = 3.39e3;
    /** Above every saturated-vapour s'' from 611.213 Pa to p_s(623.15 K) (largest about 9155.8 J/(kg·K)). */
    static final double ENTROPY_ABOVE_SATURATED_VAPOUR = 9.2e3;
    /** Below every s(p, 1073.15 K) of region 2, p ≤ 100 MPa (least about 6040.5 J/(kg·K)). */
    static final double ENTROPY_BELOW_REGION_25 = 6.0e3;

    private Steam() {
    }

    // ---------------------------------------------------------------- region selection

    /**
     * The region of a (p, T) state. A state exactly on the saturation line is taken as liquid
     * (region 1 or 3), since (p, T) cannot tell the phases apart there.
     */
    public static Region regionPT(double p, double T) {
        checkPT("p,T", p, T);
        return regionOfValidPT(p, T);
    }

    private static Region regionOfValidPT(double p, double T) {
        if (T > MAX_TEMPERATURE_REGION_2_K) {
            return Region.REGION_5;
        }
        if (T <= REGION_13_TEMPERATURE_K) {
            return p >= Saturation.pressure(T) ? Region.REGION_1 : Region.REGION_2;
        }
        if (T <= B23_MAX_TEMPERATURE_K && p > B23.pressure(T)) {
            return Region.REGION_3;
        }
        return Region.REGION_2;
    }

    // ---------------------------------------------------------------- (p, T)

    /** Specific enthalpy h(p, T), J/kg. Allocation-free. */
    public static double enthalpyPT(double p, double T) {
        checkPT("p,T", p, T);
        switch (regionOfValidPT(p, T)) {
            case REGION_1: return Region1.enthalpy(p, T);
            case REGION_2: return Region2.enthalpy(p, T);
            case REGION_3: return Region3.enthalpy(Region3.density(p, T), T);
            default: return Region5.enthalpy(p, T);
        }
    }

    /** Specific entropy s(p, T), J/(kg·K). Allocation-free. */
    public static double entropyPT(double p, double T) {
        checkPT("p,T", p, T);
        switch (regionOfValidPT(p, T)) {
            case REGION_1: return Region1.entropy(p, T);
            case REGION_2: return Region2.entropy(p, T);
            case REGION_3: return Region3.entropy(Region3.density(p, T), T);
            default: return Region5.entropy(p, T);
        }
    }

    /** Specific volume v(p, T), m³/kg. Allocation-free. */
    public static double specificVolumePT(double p, double T) {
        checkPT("p,T", p, T);
        switch (regionOfValidPT(p, T)) {
            case REGION_1: return Region1.specificVolume(p, T);
            case REGION_2: return Region2.specificVolume(p, T);
            case REGION_3: return 1.0 / Region3.density(p, T);
            default: return Region5.specificVolume(p, T);
        }
    }

    /** The full single-phase state at (p, T). */
    public static SteamState statePT(double p, double T) {
        checkPT("p,T", p, T);
        return singlePhase(regionOfValidPT(p, T), p, T);
    }

    private static SteamState singlePhase(Region region, double p, double T) {
        switch (region) {
            case REGION_1:
                return SteamState.singlePhase(p, T, Region1.enthalpy(p, T), Region1.entropy(p, T),
                        Region1.specificVolume(p, T), Region1.internalEnergy(p, T),
                        Region1.isobaricHeatCapacity(p, T), Region1.isochoricHeatCapacity(p, T),
                        Region1.speedOfSound(p, T), region);
            case REGION_2:
                return SteamState.singlePhase(p, T, Region2.enthalpy(p, T), Region2.entropy(p, T),
                        Region2.specificVolume(p, T), Region2.internalEnergy(p, T),
                        Region2.isobaricHeatCapacity(p, T), Region2.isochoricHeatCapacity(p, T),
                        Region2.speedOfSound(p, T), region);
            case REGION_3:
                return region3State(Region3.density(p, T), T);
            case REGION_5:
                return SteamState.singlePhase(p, T, Region5.enthalpy(p, T), Region5.entropy(p, T),
                        Region5.specificVolume(p, T), Region5.internalEnergy(p, T),
                        Region5.isobaricHeatCapacity(p, T), Region5.isochoricHeatCapacity(p, T),
                        Region5.speedOfSound(p, T), region);
            default:
                throw new IllegalArgumentException("not a single-phase region: " + region);
        }
    }

    private static SteamState region3State(double rho, double T) {
        return SteamState.singlePhase(Region3.pressure(rho, T), T, Region3.enthalpy(rho, T),
                Region3.entropy(rho, T), 1.0 / rho, Region3.internalEnergy(rho, T),
                Region3.isobaricHeatCapacity(rho, T), Region3.isochoricHeatCapacity(rho, T),
                Region3.speedOfSound(rho, T), Region.REGION_3);
    }

    // ---------------------------------------------------------------- saturation

    /** Saturation pressure p_s(T), Pa, for 273.15 K ≤ T ≤ 647.096 K (R7-97(2012), eq. 30). */
    public static double saturationPressure(double T) {
        checkSaturationTemperature("T,x", T);
        return Saturation.pressure(T);
    }

    /** Saturation temperature T_s(p), K, for 611.213 Pa ≤ p ≤ 22.064 MPa (R7-97(2012), eq. 31). */
    public static double saturationTemperature(double p) {
        checkSaturationPressure("p,x", p);
        return Saturation.temperature(p);
    }

    /** The wet state at pressure p and vapour quality x (0 saturated liquid, 1 saturated vapour). */
    public static SteamState statePX(double p, double x) {
        checkSaturationPressure("p,x", p);
        checkQuality("p,x", x);
        return wetState(p, Saturation.temperature(p), x);
    }

    /** The wet state at temperature T and vapour quality x (0 saturated liquid, 1 saturated vapour). */
    public static SteamState stateTX(double T, double x) {
        checkSaturationTemperature("T,x", T);
        checkQuality("T,x", x);
        return wetState(Saturation.pressure(T), T, x);
    }

    /**
     * The two-phase state at (p, T) on the saturation line with quality x. Below 623.15 K the phases
     * come from regions 1 and 2; above it from region 3 at the region-4 saturation pressure, as
     * R7-97(2012) prescribes.
     */
    static SteamState wetState(double p, double T, double x) {
        return wetState(p, T, x, SaturationLine.liquidEnthalpy(p, T), SaturationLine.vapourEnthalpy(p, T),
                SaturationLine.liquidEntropy(p, T), SaturationLine.vapourEntropy(p, T));
    }

    /** As {@link #wetState(double, double, double)}, with h', h'', s' and s'' at (p, T) already known. */
    private static SteamState wetState(double p, double T, double x, double hL, double hV, double sL, double sV) {
        double vL = SaturationLine.liquidVolume(p, T);
        double vV = SaturationLine.vapourVolume(p, T);
        double h = hL + x * (hV - hL);
        double v = vL + x * (vV - vL);
        return SteamState.twoPhase(p, T, h, sL + x * (sV - sL), v, h - p * v, x);
    }

    // ---------------------------------------------------------------- (p, h)

    /**
     * The region of the state at (p, h); {@link Region#REGION_4} for a saturated or wet state.
     * Allocation-free.
     */
    public static Region regionPH(double p, double h) {
        checkPressure("p,h", p);
        checkFinite("p,h", "h", h, "J/kg");
        return regionOfValidPH(p, h);
    }

    private static Region regionOfValidPH(double p, double h) {
        if (p <= REGION_13_SATURATION_PRESSURE_PA) {
            if (p >= TRIPLE_POINT_PRESSURE_PA) {
                if (h > ENTHALPY_ABOVE_SATURATED_VAPOUR) {
                    return vapourRegionPH(p, h);
                }
                double Ts = Saturation.temperature(p);
                if (h < Region1.enthalpy(p, Ts)) {
                    checkLowerEnthalpyRegion1(p, h);
                    return Region.REGION_1;
                }
                if (h <= Region2.enthalpy(p, Ts)) {
                    return Region.REGION_4;
                }
            } else {
                checkLowerEnthalpy(p, h, Region2.enthalpy(p, MIN_TEMPERATURE_K));
            }
            return vapourRegionPH(p, h);
        }
        if (h <= ENTHALPY_BELOW_REGION_13 || h <= Region1.enthalpy(p, REGION_13_TEMPERATURE_K)) {
            checkLowerEnthalpyRegion1(p, h);
            return Region.REGION_1;
        }
        if (h >= Region2.enthalpy(p, B23.temperature(p))) {
            return vapourRegionPH(p, h);
        }
        if (p < If97Constants.CRITICAL_PRESSURE_PA) {
            double Ts = Saturation.temperature(p);
            if (h >= SaturationLine.liquidEnthalpy(p, Ts) && h <= SaturationLine.vapourEnthalpy(p, Ts)) {
                return Region.REGION_4;
            }
        }
        return Region.REGION_3;
    }

    /** Region 2 or 5 above the saturated-vapour or B23 line, for a valid pressure. */
    private static Region vapourRegionPH(double p, double h) {
        if (h <= ENTHALPY_BELOW_REGION_25 || h <= Region2.enthalpy(p, MAX_TEMPERATURE_REGION_2_K)) {
            return Region.REGION_2;
        }
        if (p <= MAX_PRESSURE_REGION_5_PA && h <= Region5.enthalpy(p, MAX_TEMPERATURE_K)) {
            return Region.REGION_5;
        }
        double tMax = p <= MAX_PRESSURE_REGION_5_PA ? MAX_TEMPERATURE_K : MAX_TEMPERATURE_REGION_2_K;
        throw new SteamRangeException("p,h", "h", h, "J/kg",
                "at most h(p, " + tMax + " K) at p = " + p + " Pa");
    }

    /** Temperature T(p, h), K; for a two-phase state the saturation temperature. Allocation-free. */
    public static double temperaturePH(double p, double h) {
        switch (regionPH(p, h)) {
            case REGION_1: return Region1.temperaturePH(p, h);
            case REGION_2: return Region2.temperaturePH(p, h);
            case REGION_3: return Region3.temperaturePH(p, h);
            case REGION_4: return Saturation.temperature(p);
            default: return Region5.temperaturePH(p, h);
        }
    }

    /** The full state at (p, h): single phase, or two-phase with its quality. */
    public static SteamState statePH(double p, double h) {
        checkPressure("p,h", p);
        checkFinite("p,h", "h", h, "J/kg");
        if (p >= TRIPLE_POINT_PRESSURE_PA && p <= REGION_13_SATURATION_PRESSURE_PA
                && h <= ENTHALPY_ABOVE_SATURATED_VAPOUR) {
            // The selection of regionPH below 623.15 K, keeping h' and h'' for the wet state.
            double Ts = Saturation.temperature(p);
            double hL = Region1.enthalpy(p, Ts);
            if (h < hL) {
                checkLowerEnthalpyRegion1(p, h);
                return singlePhase(Region.REGION_1, p, Region1.temperaturePH(p, h));
            }
            double hV = Region2.enthalpy(p, Ts);
            if (h <= hV) {
                return wetState(p, Ts, SaturationLine.quality(h, hL, hV), hL, hV, Region1.entropy(p, Ts), Region2.entropy(p, Ts));
            }
        }
        switch (regionOfValidPH(p, h)) {
            case REGION_1: return singlePhase(Region.REGION_1, p, Region1.temperaturePH(p, h));
            case REGION_2: return singlePhase(Region.REGION_2, p, Region2.temperaturePH(p, h));
            case REGION_3: return region3State(Region3.densityPH(p, h), Region3.temperaturePH(p, h));
            case REGION_4: {
                double Ts = Saturation.temperature(p);
                double hL = SaturationLine.liquidEnthalpy(p, Ts);
                double hV = SaturationLine.vapourEnthalpy(p, Ts);
                return wetState(p, Ts, SaturationLine.quality(h, hL, hV), hL, hV,
                        SaturationLine.liquidEntropy(p, Ts), SaturationLine.vapourEntropy(p, Ts));
            }
            default: return singlePhase(Region.REGION_5, p, Region5.temperaturePH(p, h));
        }
    }

    // ---------------------------------------------------------------- (p, s)

    /**
     * The region of the state at (p, s); {@link Region#REGION_4} for a saturated or wet state.
     * Allocation-free.
     */
    public static Region regionPS(double p, double s) {
        checkPressure("p,s", p);
        checkFinite("p,s", "s", s, "J/(kg·K)");
        return regionOfValidPS(p, s);
    }

    private static Region regionOfValidPS(double p, double s) {
        if (p <= REGION_13_SATURATION_PRESSURE_PA) {
            if (p >= TRIPLE_POINT_PRESSURE_PA) {
                if (s > ENTROPY_ABOVE_SATURATED_VAPOUR) {
                    return vapourRegionPS(p, s);
                }
                double Ts = Saturation.temperature(p);
                if (s < Region1.entropy(p, Ts)) {
                    checkLowerEntropyRegion1(p, s);
                    return Region.REGION_1;
                }
                if (s <= Region2.entropy(p, Ts)) {
                    return Region.REGION_4;
                }
            } else {
                checkLowerEntropy(p, s, Region2.entropy(p, MIN_TEMPERATURE_K));
            }
            return vapourRegionPS(p, s);
        }
        if (s <= ENTROPY_BELOW_REGION_13 || s <= Region1.entropy(p, REGION_13_TEMPERATURE_K)) {
            checkLowerEntropyRegion1(p, s);
            return Region.REGION_1;
        }
        if (s >= Region2.entropy(p, B23.temperature(p))) {
            return vapourRegionPS(p, s);
        }
        if (p < If97Constants.CRITICAL_PRESSURE_PA) {
            double Ts = Saturation.temperature(p);
            if (s >= SaturationLine.liquidEntropy(p, Ts) && s <= SaturationLine.vapourEntropy(p, Ts)) {
                return Region.REGION_4;
            }
        }
        return Region.REGION_3;
    }

    private static Region vapourRegionPS(double p, double s) {
        if (s <= ENTROPY_BELOW_REGION_25 || s <= Region2.entropy(p, MAX_TEMPERATURE_REGION_2_K)) {
            return Region.REGION_2;
        }
        if (p <= MAX_PRESSURE_REGION_5_PA && s <= Region5.entropy(p, MAX_TEMPERATURE_K)) {
            return Region.REGION_5;
        }
        double tMax = p <= MAX_PRESSURE_REGION_5_PA ? MAX_TEMPERATURE_K : MAX_TEMPERATURE_REGION_2_K;
        throw new SteamRangeException("p,s", "s", s, "J/(kg·K)",
                "at most s(p, " + tMax + " K) at p = " + p + " Pa");
    }

    /** Temperature T(p, s), K; for a two-phase state the saturation temperature. Allocation-free. */
    public static double temperaturePS(double p, double s) {
        switch (regionPS(p, s)) {
            case REGION_1: return Region1.temperaturePS(p, s);
            case REGION_2: return Region2.temperaturePS(p, s);
            case REGION_3: return Region3.temperaturePS(p, s);
            case REGION_4: return Saturation.temperature(p);
            default: return Region5.temperaturePS(p, s);
        }
    }

    /** The full state at (p, s): single phase, or two-phase with its quality. */
    public static SteamState statePS(double p, double s) {
        checkPressure("p,s", p);
        checkFinite("p,s", "s", s, "J/(kg·K)");
        if (p >= TRIPLE_POINT_PRESSURE_PA && p <= REGION_13_SATURATION_PRESSURE_PA
                && s <= ENTROPY_ABOVE_SATURATED_VAPOUR) {
            // The selection of regionPS below 623.15 K, keeping s' and s'' for the wet state.
            double Ts = Saturation.temperature(p);
            double sL = Region1.entropy(p, Ts);
            if (s < sL) {
                checkLowerEntropyRegion1(p, s);
                return singlePhase(Region.REGION_1, p, Region1.temperaturePS(p, s));
            }
            double sV = Region2.entropy(p, Ts);
            if (s <= sV) {
                return wetState(p, Ts, SaturationLine.quality(s, sL, sV), Region1.enthalpy(p, Ts), Region2.enthalpy(p, Ts), sL, sV);
            }
        }
        switch (regionOfValidPS(p, s)) {
            case REGION_1: return singlePhase(Region.REGION_1, p, Region1.temperaturePS(p, s));
            case REGION_2: return singlePhase(Region.REGION_2, p, Region2.temperaturePS(p, s));
            case REGION_3: return region3State(Region3.densityPS(p, s), Region3.temperaturePS(p, s));
            case REGION_4: {
                double Ts = Saturation.temperature(p);
                double sL = SaturationLine.liquidEntropy(p, Ts);
                double sV = SaturationLine.vapourEntropy(p, Ts);
                return wetState(p, Ts, SaturationLine.quality(s, sL, sV), SaturationLine.liquidEnthalpy(p, Ts),
                        SaturationLine.vapourEnthalpy(p, Ts), sL, sV);
            }
            default: return singlePhase(Region.REGION_5, p, Region5.temperaturePS(p, s));
        }
    }

    // ---------------------------------------------------------------- (h, s)

    /**
     * The full state at (h, s), the pair of a Mollier chart. The region comes from the boundary
     * equations of IAPWS SR2-01(2014) and SR4-04(2014); the pressure from their backward equations,
     * refined on the forward equations.
     */
    public static SteamState stateHS(double h, double s) {
        checkFinite("h,s", "h", h, "J/kg");
        checkFinite("h,s", "s", s, "J/(kg·K)");
        return HsSolver.state(h, s);
    }

    // ---------------------------------------------------------------- validation

    private static void checkPT(String pair, double p, double T) {
        checkPressure(pair, p);
        checkFinite(pair, "T", T, "K");
        if (T < MIN_TEMPERATURE_K || T > MAX_TEMPERATURE_K) {
            throw new SteamRangeException(pair, "T", T, "K", "273.15 K to 2273.15 K");
        }
        if (T > MAX_TEMPERATURE_REGION_2_K && p > MAX_PRESSURE_REGION_5_PA) {
            throw new SteamRangeException(pair, "T", T, "K",
                    "273.15 K to 1073.15 K above 50 MPa (p = " + p + " Pa)");
        }
    }

    static void checkPressure(String pair, double p) {
        checkFinite(pair, "p", p, "Pa");
        if (p <= 0.0 || p > MAX_PRESSURE_PA) {
            throw new SteamRangeException(pair, "p", p, "Pa", "0 Pa < p ≤ 100 MPa");
        }
    }

    static void checkFinite(String pair, String quantity, double value, String unit) {
        if (!Double.isFinite(value)) {
            throw new SteamRangeException(pair, quantity, value, unit, "a finite number");
        }
    }

    private static void checkSaturationPressure(String pair, double p) {
        checkFinite(pair, "p", p, "Pa");
        if (p < TRIPLE_POINT_PRESSURE_PA || p > If97Constants.CRITICAL_PRESSURE_PA) {
            throw new SteamRangeException(pair, "p", p, "Pa",
                    "611.213 Pa to 22.064 MPa, the saturation line");
        }
    }

    private static void checkSaturationTemperature(String pair, double T) {
        checkFinite(pair, "T", T, "K");
        if (T < MIN_TEMPERATURE_K || T > If97Constants.CRITICAL_TEMPERATURE_K) {
            throw new SteamRangeException(pair, "T", T, "K",
                    "273.15 K to 647.096 K, the saturation line");
        }
    }

    private static void checkQuality(String pair, double x) {
        checkFinite(pair, "x", x, "1");
        if (x < 0.0 || x > 1.0) {
            throw new SteamRangeException(pair, "x", x, "1", "0 to 1");
        }
    }

    /** The lower bound h(p, 273.15 K) of region 1, evaluated only where h could be below it. */
    private static void checkLowerEnthalpyRegion1(double p, double h) {
        if (h < ENTHALPY_ABOVE_MIN_TEMPERATURE) {
            checkLowerEnthalpy(p, h, Region1.enthalpy(p, MIN_TEMPERATURE_K));
        }
    }

    /** The lower bound s(p, 273.15 K) of region 1, evaluated only where s could be below it. */
    private static void checkLowerEntropyRegion1(double p, double s) {
        if (s < ENTROPY_ABOVE_MIN_TEMPERATURE) {
            checkLowerEntropy(p, s, Region1.entropy(p, MIN_TEMPERATURE_K));
        }
    }

    private static void checkLowerEnthalpy(double p, double h, double hMin) {
        if (h < hMin) {
            throw new SteamRangeException("p,h", "h", h, "J/kg",
                    "at least h(p, 273.15 K) = " + hMin + " J/kg at p = " + p + " Pa");
        }
    }

    private static void checkLowerEntropy(double p, double s, double sMin) {
        if (s < sMin) {
            throw new SteamRangeException("p,s", "s", s, "J/(kg·K)",
                    "at least s(p, 273.15 K) = " + sMin + " J/(kg·K) at p = " + p + " Pa");
        }
    }
}
