package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class PowerSeriesTest {

    // A table with negative, zero and positive exponents in both variables, unsorted, and a
    // repeated I, to exercise the regrouping.
    private static final int[] I = {3, -2, 0, 3, 1, -2, 7};
    private static final int[] J = {-4, 5, 0, 2, -1, -3, 11};
    private static final double[] N = {0.5, -1.25, 3.0, 2.0, -0.75, 0.125, 1e-3};

    private static double direct(int[] i, int[] j, double[] n, double x, double y) {
        double sum = 0.0;
        for (int k = 0; k < n.length; k++) {
            sum += n[k] * Math.pow(x, i[k]) * Math.pow(y, j[k]);
        }
        return sum;
    }

    @Test
    void hornerEvaluationEqualsTheTermByTermSum() {
        PowerSeries series = PowerSeries.of(I, J, N);
        for (double x : new double[] {0.3, 1.0, 1.7, 4.2}) {
            for (double y : new double[] {0.2, 0.9, 1.3, 2.5}) {
                double expected = direct(I, J, N, x, y);
                // Both are sums of seven terms in double; 1e-13 relative to the largest term
                // covers their different rounding.
                double scale = direct(I, J, absolute(N), Math.abs(x), Math.abs(y));
                assertEquals(expected, series.sum(x, y), 1e-13 * scale, "x = " + x + ", y = " + y);
            }
        }
    }

    @Test
    void derivativesEqualTheTermByTermDerivatives() {
        PowerSeries series = PowerSeries.of(I, J, N);
        double x = 1.3;
        double y = 0.7;
        double dx = 0.0;
        double dy = 0.0;
        double dxy = 0.0;
        for (int k = 0; k < N.length; k++) {
            dx += N[k] * I[k] * Math.pow(x, I[k] - 1) * Math.pow(y, J[k]);
            dy += N[k] * J[k] * Math.pow(x, I[k]) * Math.pow(y, J[k] - 1);
            dxy += N[k] * I[k] * J[k] * Math.pow(x, I[k] - 1) * Math.pow(y, J[k] - 1);
        }
        // Tolerances as above: rounding of a handful of terms of magnitude up to ~100.
        assertEquals(dx, series.derivativeX().sum(x, y), 1e-12);
        assertEquals(dy, series.derivativeY().sum(x, y), 1e-12);
        assertEquals(dxy, series.derivativeX().derivativeY().sum(x, y), 1e-12);
    }

    @Test
    void quarterIntegerExponentsAreEvaluatedInTheFourthRoot() {
        double[][] rows = {{-1.25, 2, 1.5}, {0.5, -1, -2.0}, {1.0, 0, 0.25}};
        PowerSeries series = PowerSeries.ofRows(rows, 4);
        double pi = 3.7;
        double y = 1.4;
        double expected = 1.5 * Math.pow(pi, -1.25) * y * y - 2.0 * Math.sqrt(pi) / y + 0.25 * pi;
        // Three terms of order 1: rounding of the fourth root and the powers stays below 1e-13.
        assertEquals(expected, series.sum(Math.sqrt(Math.sqrt(pi)), y), 1e-13);
    }

    @Test
    void integerPowerMatchesRepeatedMultiplication() {
        for (int e = 0; e <= 60; e++) {
            double expected = 1.0;
            for (int k = 0; k < e; k++) {
                expected *= 1.03;
            }
            // Squaring and repeated multiplication round differently: at most ~e ulps apart.
            assertEquals(expected, PowerSeries.ipow(1.03, e), 1e-15 * (e + 1) * expected, "e = " + e);
        }
    }

    private static double[] absolute(double[] n) {
        double[] a = new double[n.length];
        for (int k = 0; k < n.length; k++) {
            a[k] = Math.abs(n[k]);
        }
        return a;
    }
}
