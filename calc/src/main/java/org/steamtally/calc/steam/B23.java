package org.steamtally.calc.steam;

/**
 * The boundary between regions 2 and 3 of IAPWS-IF97 (the B23 equation), IAPWS R7-97(2012),
 * eq. 5 and 6 with the coefficients of Table 1.
 *
 * <p>Valid from 623.15 K (16.5292 MPa) to 863.15 K (100 MPa). No range validation is done here.
 */
public final class B23 {

    // IAPWS R7-97(2012), Table 1: coefficients n1 ... n5 of eq. 5 and 6, printed order.
    private static final double N1 = 0.34805185628969e3;
    private static final double N2 = -0.11671859879975e1;
    private static final double N3 = 0.10192970039326e-2;
    private static final double N4 = 0.57254459862746e3;
    private static final double N5 = 0.13918839778870e2;

    // IAPWS R7-97(2012), eq. 5: reducing quantities p* = 1 MPa, T* = 1 K.
    private static final double P_STAR_PA = 1.0e6;

    private B23() {
    }

    /**
     * Boundary pressure p(T), IAPWS R7-97(2012), eq. 5.
     *
     * @param temperatureK T, K, from 623.15 K to 863.15 K
     * @return p on the B23 line, Pa
     */
    public static double pressure(double temperatureK) {
        double theta = temperatureK;
        return (N1 + theta * (N2 + theta * N3)) * P_STAR_PA;
    }

    /**
     * Boundary temperature T(p), IAPWS R7-97(2012), eq. 6.
     *
     * @param pressurePa p, Pa, from 16.5292 MPa to 100 MPa
     * @return T on the B23 line, K
     */
    public static double temperature(double pressurePa) {
        double pi = pressurePa / P_STAR_PA;
        return N4 + Math.sqrt(Math.max((pi - N5) / N3, 0.0));
    }
}
