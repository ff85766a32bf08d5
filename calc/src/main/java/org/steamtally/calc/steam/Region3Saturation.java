package org.steamtally.calc.steam;

/**
 * The region-4 saturation-pressure and saturation-temperature equations of IAPWS R7-97(2012),
 * eqs. 30 and 31 (Table 34), as far as region 3 needs them: the subregion choice of the v(p,T)
 * backward equations of IAPWS SR5-05(2016) is drawn against T_s(p) between 16.5 MPa and the critical
 * point, and the one-argument saturated densities need p_s(T) above 623.15 K. Kept here so that
 * region 3 stands on its own; both equations are valid from 273.15 K (611.213 Pa) to the critical
 * point.
 */
final class Region3Saturation {

    /** IAPWS R7-97(2012), Table 34: coefficients n₁ to n₁₀ of eqs. 30 and 31. */
    private static final double N1 = 0.11670521452767e4;
    private static final double N2 = -0.72421316703206e6;
    private static final double N3 = -0.17073846940092e2;
    private static final double N4 = 0.12020824702470e5;
    private static final double N5 = -0.32325550322333e7;
    private static final double N6 = 0.14915108613530e2;
    private static final double N7 = -0.48232657361591e4;
    private static final double N8 = 0.40511340542057e6;
    private static final double N9 = -0.23855557567849;
    private static final double N10 = 0.65017534844798e3;

    private Region3Saturation() {
    }

    /** Saturation pressure p_s(T), MPa, for temperature T in K. IAPWS R7-97(2012), eq. 30. */
    static double pressureMPa(double T) {
        double theta = T + N9 / (T - N10);
        double a = theta * theta + N1 * theta + N2;
        double b = N3 * theta * theta + N4 * theta + N5;
        double c = N6 * theta * theta + N7 * theta + N8;
        double x = 2 * c / (-b + Math.sqrt(b * b - 4 * a * c));
        double x2 = x * x;
        return x2 * x2;
    }

    /** Saturation temperature T_s(p), K, for pressure p in MPa. IAPWS R7-97(2012), eq. 31. */
    static double temperature(double pMPa) {
        double beta = Math.sqrt(Math.sqrt(pMPa));
        double beta2 = beta * beta;
        double e = beta2 + N3 * beta + N6;
        double f = N1 * beta2 + N4 * beta + N7;
        double g = N2 * beta2 + N5 * beta + N8;
        double d = 2 * g / (-f - Math.sqrt(f * f - 4 * e * g));
        double n10d = N10 + d;
        return (n10d - Math.sqrt(n10d * n10d - 4 * (N9 + N10 * d))) / 2;
    }
}
