package org.steamtally.calc.sim;

/**
 * Least-squares solution of a consistent, possibly over-determined linear system by Householder QR
 * (the method of Golub and Van Loan, Matrix Computations, section 5.3; recalled from memory), which
 * needs no choice of which dependent rows to drop.
 */
final class LeastSquares {

    private LeastSquares() {
    }

    /**
     * Solves min ‖A x − b‖ for A of full column rank.
     *
     * @param a m × n, m ≥ n; overwritten
     * @param b length m; overwritten
     * @param relativeRankTolerance a diagonal entry of R below this fraction of the largest marks a rank deficit
     * @return x, or null when A is rank deficient
     */
    static double[] solve(double[][] a, double[] b, double relativeRankTolerance) {
        int m = a.length;
        int n = a[0].length;
        double largest = 0.0;
        for (int k = 0; k < n; k++) {
            double norm = 0.0;
            for (int i = k; i < m; i++) {
                norm = Math.hypot(norm, a[i][k]);
            }
            if (norm == 0.0) {
                return null;
            }
            double alpha = a[k][k] > 0 ? -norm : norm;
            // v = x − alpha e1, stored in column k from row k down
            a[k][k] -= alpha;
            double vv = 0.0;
            for (int i = k; i < m; i++) {
                vv += a[i][k] * a[i][k];
            }
            for (int c = k + 1; c < n; c++) {
                double dot = 0.0;
                for (int i = k; i < m; i++) {
                    dot += a[i][k] * a[i][c];
                }
                double f = 2.0 * dot / vv;
                for (int i = k; i < m; i++) {
                    a[i][c] -= f * a[i][k];
                }
            }
            double dot = 0.0;
            for (int i = k; i < m; i++) {
                dot += a[i][k] * b[i];
            }
            double f = 2.0 * dot / vv;
            for (int i = k; i < m; i++) {
                b[i] -= f * a[i][k];
            }
            a[k][k] = alpha;
            largest = Math.max(largest, Math.abs(alpha));
        }
        for (int k = 0; k < n; k++) {
            if (Math.abs(a[k][k]) <= relativeRankTolerance * largest) {
                return null;
            }
        }
        double[] x = new double[n];
        for (int k = n - 1; k >= 0; k--) {
            double s = b[k];
            for (int c = k + 1; c < n; c++) {
                s -= a[k][c] * x[c];
            }
            x[k] = s / a[k][k];
        }
        return x;
    }
}
