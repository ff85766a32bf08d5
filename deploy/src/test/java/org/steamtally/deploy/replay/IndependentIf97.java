package org.steamtally.deploy.replay;

import com.hummeling.if97.IF97;
import com.hummeling.if97.OutOfRangeException;

/**
 * The independent IAPWS-IF97 implementation {@code com.hummeling:if97:1.0.5} (test scope only) in SI
 * units, for building operating points without the code under test. Only its forward equations
 * and saturation properties are used: its backward equations, taken without refinement, carry the
 * permitted inconsistency of IAPWS R7-97(2012) (up to 25 mK in T(p, s) of region 1), which would
 * swamp a pump's enthalpy rise. Where T(p, s) or T(p, h) is needed it is found here by Newton's
 * method on the forward s(p, T) or h(p, T).
 */
final class IndependentIf97 {

    private static final IF97 REFERENCE = new IF97(IF97.UnitSystem.DEFAULT);

    private IndependentIf97() {
    }

    /** h(p, T), J/kg. */
    static double h(double pPa, double tK) {
        try {
            return REFERENCE.specificEnthalpyPT(pPa / 1e6, tK) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    /** s(p, T), J/(kg·K). */
    static double s(double pPa, double tK) {
        try {
            return REFERENCE.specificEntropyPT(pPa / 1e6, tK) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    private static double cp(double pPa, double tK) {
        try {
            return REFERENCE.isobaricHeatCapacityPT(pPa / 1e6, tK) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    /** Saturation temperature at p, K. */
    static double tSat(double pPa) {
        try {
            return REFERENCE.saturationTemperatureP(pPa / 1e6);
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    /** Saturated-liquid enthalpy at p, J/kg. */
    static double hLiquid(double pPa) {
        try {
            return REFERENCE.specificEnthalpySaturatedLiquidP(pPa / 1e6) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    /** Saturated-liquid entropy at p, J/(kg·K). */
    static double sLiquid(double pPa) {
        try {
            return REFERENCE.specificEntropySaturatedLiquidP(pPa / 1e6) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    private static double hVapour(double pPa) {
        try {
            return REFERENCE.specificEnthalpySaturatedVapourP(pPa / 1e6) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    private static double sVapour(double pPa) {
        try {
            return REFERENCE.specificEntropySaturatedVapourP(pPa / 1e6) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    /**
     * h at (p, s): on the wet side from the saturated entropies and enthalpies, else by Newton's
     * method on s(p, T) starting from {@code tStartK}.
     */
    static double hPS(double pPa, double entropy, double tStartK) {
        double sl = sLiquid(pPa);
        double sv = sVapour(pPa);
        if (entropy > sl && entropy < sv) {
            double x = (entropy - sl) / (sv - sl);
            double hl = hLiquid(pPa);
            return hl + x * (hVapour(pPa) - hl);
        }
        return h(pPa, temperaturePS(pPa, entropy, tStartK));
    }

    /** The quality of a wet state at p with enthalpy h. */
    static double qualityPH(double pPa, double enthalpy) {
        double hl = hLiquid(pPa);
        return (enthalpy - hl) / (hVapour(pPa) - hl);
    }

    /** T at (p, s) in a single-phase region by Newton's method on s(p, T), (∂s/∂T)_p = cp/T. */
    static double temperaturePS(double pPa, double entropy, double tStartK) {
        double t = tStartK;
        for (int i = 0; i < 50; i++) {
            double step = (entropy - s(pPa, t)) * t / cp(pPa, t);
            t += step;
            if (Math.abs(step) < 1e-11 * t) {
                return t;
            }
        }
        throw new IllegalStateException("T(p, s) did not converge at p = " + pPa + " Pa, s = " + entropy);
    }

    /** T at (p, h) in a single-phase region by Newton's method on h(p, T). */
    static double temperaturePH(double pPa, double enthalpy, double tStartK) {
        double t = tStartK;
        for (int i = 0; i < 50; i++) {
            double step = (enthalpy - h(pPa, t)) / cp(pPa, t);
            t += step;
            if (Math.abs(step) < 1e-11 * t) {
                return t;
            }
        }
        throw new IllegalStateException("T(p, h) did not converge at p = " + pPa + " Pa, h = " + enthalpy);
    }
}
