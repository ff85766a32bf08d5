package org.steamtally.calc.steam;

/**
 * Saturated-liquid and saturated-vapour properties at a point (p_s, T_s) of the saturation line.
 * Up to 623.15 K the phases come from regions 1 and 2; above it, from region 3 at the region-4
 * saturation pressure, as IAPWS R7-97(2012), section 8, prescribes. Callers pass a pair that lies
 * on the line (p = p_s(T)); nothing here checks it.
 */
final class SaturationLine {

    private SaturationLine() {
    }

    private static boolean belowRegion3(double T) {
        return T <= Steam.REGION_13_TEMPERATURE_K;
    }

    /** h', J/kg. */
    static double liquidEnthalpy(double p, double T) {
        return belowRegion3(T) ? Region1.enthalpy(p, T)
                : Region3.enthalpy(Region3.saturatedLiquidDensity(T), T);
    }

    /** h'', J/kg. */
    static double vapourEnthalpy(double p, double T) {
        return belowRegion3(T) ? Region2.enthalpy(p, T)
                : Region3.enthalpy(Region3.saturatedVapourDensity(T, p), T);
    }

    /** s', J/(kg·K). */
    static double liquidEntropy(double p, double T) {
        return belowRegion3(T) ? Region1.entropy(p, T)
                : Region3.entropy(Region3.saturatedLiquidDensity(T), T);
    }

    /** s'', J/(kg·K). */
    static double vapourEntropy(double p, double T) {
        return belowRegion3(T) ? Region2.entropy(p, T)
                : Region3.entropy(Region3.saturatedVapourDensity(T, p), T);
    }

    /** v', m³/kg. */
    static double liquidVolume(double p, double T) {
        return belowRegion3(T) ? Region1.specificVolume(p, T) : 1.0 / Region3.saturatedLiquidDensity(T);
    }

    /** v'', m³/kg. */
    static double vapourVolume(double p, double T) {
        return belowRegion3(T) ? Region2.specificVolume(p, T) : 1.0 / Region3.saturatedVapourDensity(T, p);
    }
}
