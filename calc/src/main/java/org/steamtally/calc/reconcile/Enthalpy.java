package org.steamtally.calc.reconcile;

import org.steamtally.calc.steam.If97Constants;
import org.steamtally.calc.steam.Region1;
import org.steamtally.calc.steam.Region2;
import org.steamtally.calc.steam.Region3;
import org.steamtally.calc.steam.Region5;
import org.steamtally.calc.steam.SaturationLine;
import org.steamtally.calc.steam.Steam;

/**
 * Specific enthalpy by IAPWS-IF97 (IAPWS R7-97(2012)) with the derivatives the linearised balances
 * need, the same way the cycle model's closure sensitivities take them: (∂h/∂T)_p = c_p from the
 * region's equation, (∂h/∂p)_T and, on the saturation line, dh/dp at constant quality by a forward
 * difference of relative step 1e-6 on the same equation (backward next to the critical point).
 * Truncation error of order 1e-6 relative: a Gauss–Newton step only needs the direction, and the
 * converged point is set by the balances themselves, which are evaluated exactly.
 *
 * <p>Not thread-safe: holds the last result in its fields.
 */
final class Enthalpy {

    private static final double RELATIVE_PRESSURE_STEP = 1e-6;

    /** J/kg. */
    double h;
    /** J/(kg·Pa). */
    double dhdp;
    /** J/(kg·K), 0 on the saturation line. */
    double dhdT;

    /**
     * h(p, T) of a single-phase state.
     *
     * @throws org.steamtally.calc.steam.SteamRangeException outside IF97
     */
    void pt(double p, double t) {
        double dp = RELATIVE_PRESSURE_STEP * p;
        switch (Steam.regionPT(p, t)) {
            case REGION_1 -> {
                h = Region1.enthalpy(p, t);
                dhdT = Region1.isobaricHeatCapacity(p, t);
                dhdp = (Region1.enthalpy(p + dp, t) - h) / dp;
            }
            case REGION_2 -> {
                h = Region2.enthalpy(p, t);
                dhdT = Region2.isobaricHeatCapacity(p, t);
                dhdp = (Region2.enthalpy(p + dp, t) - h) / dp;
            }
            case REGION_3 -> {
                double rho = Region3.density(p, t);
                h = Region3.enthalpy(rho, t);
                dhdT = Region3.isobaricHeatCapacity(rho, t);
                dhdp = (Region3.enthalpy(Region3.density(p + dp, t), t) - h) / dp;
            }
            default -> {
                h = Region5.enthalpy(p, t);
                dhdT = Region5.isobaricHeatCapacity(p, t);
                dhdp = (Region5.enthalpy(p + dp, t) - h) / dp;
            }
        }
    }

    /**
     * h on the saturation line at pressure p and quality x.
     *
     * @throws org.steamtally.calc.steam.SteamRangeException outside the saturation line's range
     */
    void px(double p, double x) {
        double dp = RELATIVE_PRESSURE_STEP * p;
        if (p + dp > If97Constants.CRITICAL_PRESSURE_PA) {
            dp = -dp;
        }
        h = saturated(p, x);
        dhdp = (saturated(p + dp, x) - h) / dp;
        dhdT = 0.0;
    }

    private static double saturated(double p, double x) {
        double ts = Steam.saturationTemperature(p);
        double hL = SaturationLine.liquidEnthalpy(p, ts);
        return x == 0.0 ? hL : hL + x * (SaturationLine.vapourEnthalpy(p, ts) - hL);
    }
}
