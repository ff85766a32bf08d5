package org.steamtally.calc.cycle;

import org.steamtally.calc.steam.If97Constants;
import org.steamtally.calc.steam.Region;
import org.steamtally.calc.steam.Region1;
import org.steamtally.calc.steam.Region2;
import org.steamtally.calc.steam.Region3;
import org.steamtally.calc.steam.Region5;
import org.steamtally.calc.steam.SaturationLine;
import org.steamtally.calc.steam.Saturation;
import org.steamtally.calc.steam.Steam;
import org.steamtally.calc.steam.SteamRangeException;

/**
 * A reusable holder for one water/steam state by IAPWS-IF97 (IAPWS R7-97(2012)), filled from one
 * input pair without allocating, with the derivatives the uncertainty propagation needs. It calls
 * the region equations of {@code org.steamtally.calc.steam} directly, after the facade {@link Steam}
 * has validated the pair and chosen the region, so that the hot path builds no
 * {@link org.steamtally.calc.steam.SteamState} record per state.
 *
 * <p>On the saturation line the phases come from regions 1 and 2 up to 623.15 K and from region 3
 * above, as R7-97(2012), section 8, prescribes (the same choice as the facade's wet states).
 *
 * <p>Not thread-safe: one instance per {@link CycleModel}.
 */
final class StatePoint {

    /**
     * Relative pressure step of the forward differences for (∂h/∂p), used only as sensitivity
     * coefficients of the uncertainty propagation: truncation error of order the step (1e-6
     * relative) and rounding of order 1e-16·h/(step·p·∂h/∂p), below 1e-7 for water and steam at
     * plant pressures; an uncertainty needs two significant digits.
     */
    private static final double RELATIVE_PRESSURE_STEP = 1e-6;

    /**
     * Saturation pressure at 623.15 K, Pa: below it the saturation line separates regions 1 and 2
     * only (IAPWS R7-97(2012), Figure 1), and its phases come from those two regions.
     */
    private static final double REGION_13_SATURATION_PRESSURE_PA =
            Saturation.pressure(Steam.REGION_13_TEMPERATURE_K);

    double p;
    double T;
    double h;
    double s;
    double v;
    /** Vapour quality, meaningful only when {@link #twoPhase}. */
    double x;
    boolean twoPhase;
    /** (∂h/∂p) along the fix: at constant T for (p, T), at constant quality on the saturation line. */
    double dhdp;
    /** (∂h/∂T) at constant p, that is cp; 0 where the fix has no temperature. */
    double dhdT;

    /**
     * Fills the single-phase state at (p, T) with h, s, v, cp and (∂h/∂p)_T.
     *
     * @throws SteamRangeException   outside the range of IF97
     * @throws IllegalStateException if a region-3 density iteration does not converge
     */
    void setPT(double pressurePa, double temperatureK) {
        Region region = Steam.regionPT(pressurePa, temperatureK);
        p = pressurePa;
        T = temperatureK;
        twoPhase = false;
        x = 0.0;
        double dp = RELATIVE_PRESSURE_STEP * pressurePa;
        switch (region) {
            case REGION_1:
                h = Region1.enthalpy(p, T);
                s = Region1.entropy(p, T);
                v = Region1.specificVolume(p, T);
                dhdT = Region1.isobaricHeatCapacity(p, T);
                dhdp = (Region1.enthalpy(p + dp, T) - h) / dp;
                break;
            case REGION_2:
                h = Region2.enthalpy(p, T);
                s = Region2.entropy(p, T);
                v = Region2.specificVolume(p, T);
                dhdT = Region2.isobaricHeatCapacity(p, T);
                dhdp = (Region2.enthalpy(p + dp, T) - h) / dp;
                break;
            case REGION_3: {
                double rho = Region3.density(p, T);
                h = Region3.enthalpy(rho, T);
                s = Region3.entropy(rho, T);
                v = 1.0 / rho;
                dhdT = Region3.isobaricHeatCapacity(rho, T);
                dhdp = (Region3.enthalpy(Region3.density(p + dp, T), T) - h) / dp;
                break;
            }
            default:
                h = Region5.enthalpy(p, T);
                s = Region5.entropy(p, T);
                v = Region5.specificVolume(p, T);
                dhdT = Region5.isobaricHeatCapacity(p, T);
                dhdp = (Region5.enthalpy(p + dp, T) - h) / dp;
                break;
        }
    }

    /**
     * Fills only h and cp at (p, T), for a stream whose other properties are not reported (the
     * cooling water).
     *
     * @throws SteamRangeException   outside the range of IF97
     * @throws IllegalStateException if a region-3 density iteration does not converge
     */
    void setEnthalpyPT(double pressurePa, double temperatureK) {
        Region region = Steam.regionPT(pressurePa, temperatureK);
        p = pressurePa;
        T = temperatureK;
        twoPhase = false;
        x = 0.0;
        dhdp = 0.0;
        switch (region) {
            case REGION_1:
                h = Region1.enthalpy(p, T);
                dhdT = Region1.isobaricHeatCapacity(p, T);
                break;
            case REGION_2:
                h = Region2.enthalpy(p, T);
                dhdT = Region2.isobaricHeatCapacity(p, T);
                break;
            case REGION_3: {
                double rho = Region3.density(p, T);
                h = Region3.enthalpy(rho, T);
                dhdT = Region3.isobaricHeatCapacity(rho, T);
                break;
            }
            default:
                h = Region5.enthalpy(p, T);
                dhdT = Region5.isobaricHeatCapacity(p, T);
                break;
        }
    }

    /**
     * Fills the saturated or wet state at pressure p and quality x, with (∂h/∂p) at constant x
     * along the saturation line.
     *
     * @throws SteamRangeException outside 611.213 Pa to 22.064 MPa or for x outside 0 to 1
     */
    void setPX(double pressurePa, double quality) {
        if (!(quality >= 0.0 && quality <= 1.0)) {
            throw new SteamRangeException("p,x", "x", quality, "1", "0 to 1");
        }
        double ts = Steam.saturationTemperature(pressurePa);
        p = pressurePa;
        T = ts;
        twoPhase = true;
        x = quality;
        dhdT = 0.0;
        double dp = RELATIVE_PRESSURE_STEP * pressurePa;
        // Forward, or backward next to the critical point, where p + dp would leave the line.
        if (p + dp > If97Constants.CRITICAL_PRESSURE_PA) {
            dp = -dp;
        }
        double pStep = p + dp;
        double tsStep = Steam.saturationTemperature(pStep);
        // A saturated liquid or vapour, the common fixes, needs only its own side of the line.
        if (quality == 0.0) {
            h = SaturationLine.liquidEnthalpy(p, ts);
            s = SaturationLine.liquidEntropy(p, ts);
            v = SaturationLine.liquidVolume(p, ts);
            dhdp = (SaturationLine.liquidEnthalpy(pStep, tsStep) - h) / dp;
        } else if (quality == 1.0) {
            h = SaturationLine.vapourEnthalpy(p, ts);
            s = SaturationLine.vapourEntropy(p, ts);
            v = SaturationLine.vapourVolume(p, ts);
            dhdp = (SaturationLine.vapourEnthalpy(pStep, tsStep) - h) / dp;
        } else {
            double hL = SaturationLine.liquidEnthalpy(p, ts);
            h = hL + quality * (SaturationLine.vapourEnthalpy(p, ts) - hL);
            double sL = SaturationLine.liquidEntropy(p, ts);
            s = sL + quality * (SaturationLine.vapourEntropy(p, ts) - sL);
            double vL = SaturationLine.liquidVolume(p, ts);
            v = vL + quality * (SaturationLine.vapourVolume(p, ts) - vL);
            double hLStep = SaturationLine.liquidEnthalpy(pStep, tsStep);
            dhdp = (hLStep + quality * (SaturationLine.vapourEnthalpy(pStep, tsStep) - hLStep) - h) / dp;
        }
    }

    /**
     * Fills the state at (p, h): single phase, or on the saturation line with its quality. No
     * derivatives are filled (the caller propagates through the balance that gave h).
     *
     * @throws SteamRangeException   outside the range of IF97
     * @throws IllegalStateException if an iteration does not converge
     */
    void setPH(double pressurePa, double enthalpy) {
        if (pressurePa >= Steam.TRIPLE_POINT_PRESSURE_PA && pressurePa <= REGION_13_SATURATION_PRESSURE_PA
                && Double.isFinite(enthalpy) && setPHBelowRegion3(pressurePa, enthalpy)) {
            return;
        }
        Region region = Steam.regionPH(pressurePa, enthalpy);
        p = pressurePa;
        h = enthalpy;
        dhdp = 0.0;
        dhdT = 0.0;
        twoPhase = false;
        x = 0.0;
        switch (region) {
            case REGION_1:
                T = Region1.temperaturePH(p, h);
                s = Region1.entropy(p, T);
                v = Region1.specificVolume(p, T);
                break;
            case REGION_2:
                T = Region2.temperaturePH(p, h);
                s = Region2.entropy(p, T);
                v = Region2.specificVolume(p, T);
                break;
            case REGION_3: {
                double rho = Region3.densityPH(p, h);
                T = Region3.temperaturePH(p, h);
                s = Region3.entropy(rho, T);
                v = 1.0 / rho;
                break;
            }
            case REGION_4: {
                double ts = Steam.saturationTemperature(p);
                double hL = SaturationLine.liquidEnthalpy(p, ts);
                double hV = SaturationLine.vapourEnthalpy(p, ts);
                T = ts;
                twoPhase = true;
                x = SaturationLine.quality(h, hL, hV);
                double sL = SaturationLine.liquidEntropy(p, ts);
                s = sL + x * (SaturationLine.vapourEntropy(p, ts) - sL);
                double vL = SaturationLine.liquidVolume(p, ts);
                v = vL + x * (SaturationLine.vapourVolume(p, ts) - vL);
                break;
            }
            default:
                T = Region5.temperaturePH(p, h);
                s = Region5.entropy(p, T);
                v = Region5.specificVolume(p, T);
                break;
        }
    }

    /**
     * Fills the state at (p, s): single phase, or on the saturation line with its quality. No
     * derivatives are filled.
     *
     * @throws SteamRangeException   outside the range of IF97
     * @throws IllegalStateException if an iteration does not converge
     */
    void setPS(double pressurePa, double entropy) {
        if (pressurePa >= Steam.TRIPLE_POINT_PRESSURE_PA && pressurePa <= REGION_13_SATURATION_PRESSURE_PA
                && Double.isFinite(entropy) && setPSBelowRegion3(pressurePa, entropy)) {
            return;
        }
        Region region = Steam.regionPS(pressurePa, entropy);
        p = pressurePa;
        s = entropy;
        dhdp = 0.0;
        dhdT = 0.0;
        twoPhase = false;
        x = 0.0;
        switch (region) {
            case REGION_1:
                T = Region1.temperaturePS(p, s);
                h = Region1.enthalpy(p, T);
                v = Region1.specificVolume(p, T);
                break;
            case REGION_2:
                T = Region2.temperaturePS(p, s);
                h = Region2.enthalpy(p, T);
                v = Region2.specificVolume(p, T);
                break;
            case REGION_3: {
                double rho = Region3.densityPS(p, s);
                T = Region3.temperaturePS(p, s);
                h = Region3.enthalpy(rho, T);
                v = 1.0 / rho;
                break;
            }
            case REGION_4: {
                double ts = Steam.saturationTemperature(p);
                double sL = SaturationLine.liquidEntropy(p, ts);
                double sV = SaturationLine.vapourEntropy(p, ts);
                T = ts;
                twoPhase = true;
                x = SaturationLine.quality(s, sL, sV);
                double hL = SaturationLine.liquidEnthalpy(p, ts);
                h = hL + x * (SaturationLine.vapourEnthalpy(p, ts) - hL);
                double vL = SaturationLine.liquidVolume(p, ts);
                v = vL + x * (SaturationLine.vapourVolume(p, ts) - vL);
                break;
            }
            default:
                T = Region5.temperaturePS(p, s);
                h = Region5.enthalpy(p, T);
                v = Region5.specificVolume(p, T);
                break;
        }
    }

    /**
     * The common case of {@link #setPH} below the region-1/3 saturation pressure, where only
     * regions 1, 2 and 4 meet: the saturation enthalpies found for the region choice are reused
     * for the wet state, and the range checks of the facade are left to the general path, taken
     * whenever the result would lie outside 273.15 K to 1073.15 K.
     *
     * @return false when the general path must decide
     */
    private boolean setPHBelowRegion3(double pressurePa, double enthalpy) {
        double ts = Steam.saturationTemperature(pressurePa);
        double hL = Region1.enthalpy(pressurePa, ts);
        double hV = Region2.enthalpy(pressurePa, ts);
        double t;
        boolean liquid = enthalpy < hL;
        if (liquid || enthalpy > hV) {
            try {
                t = liquid ? Region1.temperaturePH(pressurePa, enthalpy) : Region2.temperaturePH(pressurePa, enthalpy);
            } catch (IllegalStateException e) {
                return false;
            }
            if (!(t >= Steam.MIN_TEMPERATURE_K && t <= Steam.MAX_TEMPERATURE_REGION_2_K)) {
                return false;
            }
            p = pressurePa;
            h = enthalpy;
            T = t;
            s = liquid ? Region1.entropy(p, t) : Region2.entropy(p, t);
            v = liquid ? Region1.specificVolume(p, t) : Region2.specificVolume(p, t);
            twoPhase = false;
            x = 0.0;
        } else {
            p = pressurePa;
            h = enthalpy;
            T = ts;
            twoPhase = true;
            x = SaturationLine.quality(enthalpy, hL, hV);
            double sL = Region1.entropy(p, ts);
            s = sL + x * (Region2.entropy(p, ts) - sL);
            double vL = Region1.specificVolume(p, ts);
            v = vL + x * (Region2.specificVolume(p, ts) - vL);
        }
        dhdp = 0.0;
        dhdT = 0.0;
        return true;
    }

    /** As {@link #setPHBelowRegion3}, for (p, s). */
    private boolean setPSBelowRegion3(double pressurePa, double entropy) {
        double ts = Steam.saturationTemperature(pressurePa);
        double sL = Region1.entropy(pressurePa, ts);
        double sV = Region2.entropy(pressurePa, ts);
        boolean liquid = entropy < sL;
        if (liquid || entropy > sV) {
            double t;
            try {
                t = liquid ? Region1.temperaturePS(pressurePa, entropy) : Region2.temperaturePS(pressurePa, entropy);
            } catch (IllegalStateException e) {
                return false;
            }
            if (!(t >= Steam.MIN_TEMPERATURE_K && t <= Steam.MAX_TEMPERATURE_REGION_2_K)) {
                return false;
            }
            p = pressurePa;
            s = entropy;
            T = t;
            h = liquid ? Region1.enthalpy(p, t) : Region2.enthalpy(p, t);
            v = liquid ? Region1.specificVolume(p, t) : Region2.specificVolume(p, t);
            twoPhase = false;
            x = 0.0;
        } else {
            p = pressurePa;
            s = entropy;
            T = ts;
            twoPhase = true;
            x = SaturationLine.quality(entropy, sL, sV);
            double hL = Region1.enthalpy(p, ts);
            h = hL + x * (Region2.enthalpy(p, ts) - hL);
            double vL = Region1.specificVolume(p, ts);
            v = vL + x * (Region2.specificVolume(p, ts) - vL);
        }
        dhdp = 0.0;
        dhdT = 0.0;
        return true;
    }
}
