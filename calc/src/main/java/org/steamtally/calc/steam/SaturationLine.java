package org.steamtally.calc.steam;

/**
 * Saturated-liquid and saturated-vapour properties at a point (p_s, T_s) of the saturation line.
 * Up to 623.15 K the phases come from regions 1 and 2; above it, from region 3 at the region-4
 * saturation pressure, as IAPWS R7-97(2012), section 8, prescribes. Callers pass a pair that lies
 * on the line (p = p_s(T)); nothing here checks it. Allocation-free, for callers that assemble a
 * wet state themselves; {@link Steam#statePX} and its siblings build the record.
 */
public final class SaturationLine {

    private SaturationLine() {
    }

    private static boolean belowRegion3(double T) {
        return T <= Steam.REGION_13_TEMPERATURE_K;
    }

    /** h', J/kg. */
    public static double liquidEnthalpy(double p, double T) {
        return belowRegion3(T) ? Region1.enthalpy(p, T)
                : Region3.enthalpy(Region3.saturatedLiquidDensity(T), T);
    }

    /** h'', J/kg. */
    public static double vapourEnthalpy(double p, double T) {
        return belowRegion3(T) ? Region2.enthalpy(p, T)
                : Region3.enthalpy(Region3.saturatedVapourDensity(T, p), T);
    }

    /** s', J/(kg·K). */
    public static double liquidEntropy(double p, double T) {
        return belowRegion3(T) ? Region1.entropy(p, T)
                : Region3.entropy(Region3.saturatedLiquidDensity(T), T);
    }

    /** s'', J/(kg·K). */
    public static double vapourEntropy(double p, double T) {
        return belowRegion3(T) ? Region2.entropy(p, T)
                : Region3.entropy(Region3.saturatedVapourDensity(T, p), T);
    }

    /** v', m³/kg. */
    public static double liquidVolume(double p, double T) {
        return belowRegion3(T) ? Region1.specificVolume(p, T) : 1.0 / Region3.saturatedLiquidDensity(T);
    }

    /** v'', m³/kg. */
    public static double vapourVolume(double p, double T) {
        return belowRegion3(T) ? Region2.specificVolume(p, T) : 1.0 / Region3.saturatedVapourDensity(T, p);
    }

    /**
     * Vapour quality from a value (h, s or v) between its saturated-liquid and saturated-vapour
     * values. At the critical point the two coincide and the state is taken as saturated liquid;
     * rounding at the ends is clipped so that x stays within 0 to 1.
     */
    public static double quality(double value, double liquid, double vapour) {
        if (vapour <= liquid) {
            return 0.0;
        }
        return Math.min(1.0, Math.max(0.0, (value - liquid) / (vapour - liquid)));
    }
}
