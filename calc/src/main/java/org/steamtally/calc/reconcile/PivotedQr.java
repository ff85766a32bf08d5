package org.steamtally.calc.reconcile;

/**
 * Householder QR factorisation with column pivoting, A Π = Q R, of a small dense matrix, for the
 * rank decisions and projections of a reconciliation: which unmeasured quantities the balances
 * determine, which balances remain once they are eliminated, and the row space of those.
 *
 * <p>At step k the remaining column of largest norm is brought forward (norms recomputed, not
 * down-dated, since the matrices have a few dozen columns); the factorisation stops when that norm
 * falls to {@code relativeTolerance} times the largest column norm of A (or of a reference), and the step count is the
 * numerical rank. Q is kept as its reflectors I − β v vᵀ.
 */
final class PivotedQr {

    private final int rows;
    private final int cols;
    /** R in the upper triangle of the first {@link #rank} rows, in pivoted column order. */
    final double[][] r;
    /** Column k of A Π is column {@code perm[k]} of A. */
    final int[] perm;
    private final double[][] reflector;
    private final double[] beta;
    int rank;

    /**
     * Factors the {@code rows} × {@code cols} matrix {@code a}, which is copied.
     *
     * @param relativeTolerance a remaining column norm at or below this fraction of the largest
     *                          column norm of A ends the factorisation
     */
    PivotedQr(double[][] a, int rows, int cols, double relativeTolerance) {
        this(a, rows, cols, relativeTolerance, 0.0);
    }

    /**
     * As {@link #PivotedQr(double[][], int, int, double)}, with the tolerance taken relative to the
     * larger of A's largest column norm and {@code referenceNorm}: for a matrix that is a projection
     * of another, whose entries may be nothing but rounding, the norm of the original is the scale.
     */
    PivotedQr(double[][] a, int rows, int cols, double relativeTolerance, double referenceNorm) {
        this.rows = rows;
        this.cols = cols;
        r = new double[rows][cols];
        for (int i = 0; i < rows; i++) {
            System.arraycopy(a[i], 0, r[i], 0, cols);
        }
        perm = new int[cols];
        for (int j = 0; j < cols; j++) {
            perm[j] = j;
        }
        int steps = Math.min(rows, cols);
        reflector = new double[steps][];
        beta = new double[steps];
        double largest = 0.0;
        for (int j = 0; j < cols; j++) {
            largest = Math.max(largest, columnNorm2(j, 0));
        }
        largest = Math.max(largest, referenceNorm * referenceNorm);
        double threshold = relativeTolerance * relativeTolerance * largest;
        for (int k = 0; k < steps; k++) {
            int best = -1;
            double bestNorm2 = threshold;
            for (int j = k; j < cols; j++) {
                double n2 = columnNorm2(j, k);
                if (n2 > bestNorm2) {
                    best = j;
                    bestNorm2 = n2;
                }
            }
            if (best < 0) {
                break;
            }
            if (best != k) {
                for (int i = 0; i < rows; i++) {
                    double t = r[i][k];
                    r[i][k] = r[i][best];
                    r[i][best] = t;
                }
                int t = perm[k];
                perm[k] = perm[best];
                perm[best] = t;
            }
            double norm = Math.sqrt(bestNorm2);
            double alpha = r[k][k] > 0.0 ? -norm : norm;
            double[] v = new double[rows];
            for (int i = k; i < rows; i++) {
                v[i] = r[i][k];
            }
            v[k] -= alpha;
            double v2 = 0.0;
            for (int i = k; i < rows; i++) {
                v2 += v[i] * v[i];
            }
            reflector[k] = v;
            beta[k] = v2 > 0.0 ? 2.0 / v2 : 0.0;
            r[k][k] = alpha;
            for (int i = k + 1; i < rows; i++) {
                r[i][k] = 0.0;
            }
            for (int j = k + 1; j < cols; j++) {
                double s = 0.0;
                for (int i = k; i < rows; i++) {
                    s += v[i] * r[i][j];
                }
                s *= beta[k];
                if (s != 0.0) {
                    for (int i = k; i < rows; i++) {
                        r[i][j] -= s * v[i];
                    }
                }
            }
            rank = k + 1;
        }
    }

    private double columnNorm2(int j, int from) {
        double s = 0.0;
        for (int i = from; i < rows; i++) {
            s += r[i][j] * r[i][j];
        }
        return s;
    }

    /** b ← Qᵀ b, for a vector of length {@code rows}. */
    void applyQt(double[] b) {
        for (int k = 0; k < rank; k++) {
            reflect(k, b);
        }
    }

    /** b ← Q b, for a vector of length {@code rows}. */
    void applyQ(double[] b) {
        for (int k = rank - 1; k >= 0; k--) {
            reflect(k, b);
        }
    }

    private void reflect(int k, double[] b) {
        double[] v = reflector[k];
        double s = 0.0;
        for (int i = k; i < rows; i++) {
            s += v[i] * b[i];
        }
        s *= beta[k];
        if (s != 0.0) {
            for (int i = k; i < rows; i++) {
                b[i] -= s * v[i];
            }
        }
    }

    /** Solves R11 u = b in place, R11 the leading {@link #rank} × {@link #rank} block. */
    void solveUpper(double[] b) {
        for (int i = rank - 1; i >= 0; i--) {
            double s = b[i];
            for (int j = i + 1; j < rank; j++) {
                s -= r[i][j] * b[j];
            }
            b[i] = s / r[i][i];
        }
    }

    /** Solves R11ᵀ w = b in place. */
    void solveUpperTransposed(double[] b) {
        for (int i = 0; i < rank; i++) {
            double s = b[i];
            for (int j = 0; j < i; j++) {
                s -= r[j][i] * b[j];
            }
            b[i] = s / r[i][i];
        }
    }

    int rows() {
        return rows;
    }

    int cols() {
        return cols;
    }
}
