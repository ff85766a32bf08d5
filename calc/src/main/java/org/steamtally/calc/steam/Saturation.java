package org.steamtally.calc.steam;

/**
 * The saturation line, region 4 of IAPWS-IF97: the saturation-pressure equation (IAPWS R7-97(2012),
 * eq. 30) and the saturation-temperature equation (eq. 31), both from the implicit quadratic eq. 28
 * with the coefficients of Table 34.
 *
 * <p>Valid from 273.15 K to the critical temperature 647.096 K, that is from 611.213 Pa to the
 * critical pressure 22.064 MPa. No range validation is done here; inside the range the result is
 * always finite.
 */
public final class Saturation {

    // IAPWS R7-97(2012), Table 34: coefficients n1 ... n10 of eq. 28 to 31, printed order.
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

    // IAPWS R7-97(2012), eq. 29a and 29b: reducing quantities p* = 1 MPa, T* = 1 K.
    private static final double P_STAR_PA = 1.0e6;

    private Saturation() {
    }

    /**
     * Saturation pressure ps(T), IAPWS R7-97(2012), eq. 30.
     *
     * @param temperatureK T, K, from 273.15 K to 647.096 K
     * @return ps, Pa
     */
    public static double pressure(double temperatureK) {
        double theta = temperatureK + N9 / (temperatureK - N10);
        double theta2 = theta * theta;
        double a = theta2 + N1 * theta + N2;
        double b = N3 * theta2 + N4 * theta + N5;
        double c = N6 * theta2 + N7 * theta + N8;
        double discriminant = Math.max(b * b - 4.0 * a * c, 0.0);
        double root = 2.0 * c / (-b + Math.sqrt(discriminant));
        double root2 = root * root;
        return root2 * root2 * P_STAR_PA;
    }

    /**
     * Saturation temperature Ts(p), IAPWS R7-97(2012), eq. 31.
     *
     * @param pressurePa p, Pa, from 611.213 Pa to 22.064 MPa
     * @return Ts, K
     */
    public static double temperature(double pressurePa) {
        double beta = Math.sqrt(Math.sqrt(pressurePa / P_STAR_PA));
        double beta2 = beta * beta;
        double e = beta2 + N3 * beta + N6;
        double f = N1 * beta2 + N4 * beta + N7;
        double g = N2 * beta2 + N5 * beta + N8;
        double d = 2.0 * g / (-f - Math.sqrt(Math.max(f * f - 4.0 * e * g, 0.0)));
        double sum = N10 + d;
        return 0.5 * (sum - Math.sqrt(Math.max(sum * sum - 4.0 * (N9 + N10 * d), 0.0)));
    }
}
