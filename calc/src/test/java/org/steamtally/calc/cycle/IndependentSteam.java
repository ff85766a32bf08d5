package org.steamtally.calc.cycle;

import com.hummeling.if97.IF97;
import com.hummeling.if97.OutOfRangeException;

/**
 * The independent IAPWS-IF97 implementation {@code com.hummeling:if97:1.0.5} (test scope only) in SI
 * units, for recomputing cycles by hand-written balance equations without our facade. Only its
 * forward equations are used: its backward equations, taken without refinement, carry the
 * permitted inconsistency of IAPWS R7-97(2012) (up to 25 mK in T(p, s) of region 1), which would
 * swamp a pump's enthalpy rise. Where an isentropic state is needed, T is found here by Newton's
 * method on the reference's forward s(p, T).
 */
final class IndependentSteam {

    private static final IF97 REFERENCE = new IF97(IF97.UnitSystem.DEFAULT);

    private IndependentSteam() {
    }

    /** h(p, T), J/kg. */
    static double h(double p, double t) {
        try {
            return REFERENCE.specificEnthalpyPT(p / 1e6, t) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    /** s(p, T), J/(kg·K). */
    static double s(double p, double t) {
        try {
            return REFERENCE.specificEntropyPT(p / 1e6, t) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    static double cp(double p, double t) {
        try {
            return REFERENCE.isobaricHeatCapacityPT(p / 1e6, t) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    static double tSat(double p) {
        try {
            return REFERENCE.saturationTemperatureP(p / 1e6);
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    static double hLiquid(double p) {
        try {
            return REFERENCE.specificEnthalpySaturatedLiquidP(p / 1e6) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    static double hVapour(double p) {
        try {
            return REFERENCE.specificEnthalpySaturatedVapourP(p / 1e6) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    static double sLiquid(double p) {
        try {
            return REFERENCE.specificEntropySaturatedLiquidP(p / 1e6) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    static double sVapour(double p) {
        try {
            return REFERENCE.specificEntropySaturatedVapourP(p / 1e6) * 1e3;
        } catch (OutOfRangeException e) {
            throw new IllegalArgumentException(e);
        }
    }

    /** The wet state's quality at p with entropy s, from the saturated entropies. */
    static double qualityPS(double p, double entropy) {
        double sl = sLiquid(p);
        return (entropy - sl) / (sVapour(p) - sl);
    }

    /** h of the wet state at p with quality x. */
    static double hWet(double p, double x) {
        double hl = hLiquid(p);
        return hl + x * (hVapour(p) - hl);
    }

    /** T at (p, s) in a single-phase region by Newton's method on s(p, T), (∂s/∂T)_p = cp/T. */
    static double temperaturePS(double p, double entropy, double tStart) {
        double t = tStart;
        for (int i = 0; i < 50; i++) {
            double step = (entropy - s(p, t)) * t / cp(p, t);
            t += step;
            if (Math.abs(step) < 1e-11 * t) {
                return t;
            }
        }
        throw new IllegalStateException("T(p, s) did not converge at p = " + p + " Pa, s = " + entropy);
    }

    /** T at (p, h) in a single-phase region by Newton's method on h(p, T). */
    static double temperaturePH(double p, double enthalpy, double tStart) {
        double t = tStart;
        for (int i = 0; i < 50; i++) {
            double step = (enthalpy - h(p, t)) / cp(p, t);
            t += step;
            if (Math.abs(step) < 1e-11 * t) {
                return t;
            }
        }
        throw new IllegalStateException("T(p, h) did not converge at p = " + p + " Pa, h = " + enthalpy);
    }
}
