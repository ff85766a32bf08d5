package org.steamtally.calc.reconcile;

/**
 * Householder QR factorisation with column pivoting, A Π = Q R, of a small dense matrix, for the
 * rank decisions and projections of a reconciliation: which unmeasured quantities the balances
 * determine, which balances remain once they are eliminated, and the row space of those.
 *
 * <p>The matrix is held by columns, so that every inner loop (column norms, reflections, the
 * triangular solves) runs over contiguous memory. At step k the remaining column of largest norm is
 * brought forward; the remaining norms are down-dated after each reflection rather than recomputed,
 * and recomputed only when the down-date has cancelled most of the norm (the rule of LAPACK's
 * xGEQP3: Businger &amp; Golub 1965, safeguard of LAPACK working note 176, Drmač &amp; Bujanović; recalled
 * from memory). The pivot's own norm is always recomputed, so the stopping test is exact: the
 * factorisation stops when that norm falls to {@code relativeTolerance} times the largest column
 * norm of A (or of a reference), and the step count is the numerical rank. Q is kept as its
 * reflectors I − β v vᵀ, v below the diagonal of the factored columns and its leading entry apart.
 */
final class PivotedQr {

    /** Square root of the double-precision unit round-off: a down-dated norm is recomputed once
     *  its square has fallen below this fraction of its last recomputed value (LAPACK's tol3z). */
    private static final double RECOMPUTE_BELOW = Math.sqrt(Math.ulp(1.0) / 2.0);

    private int rows;
    private int cols;
    /** Column j of R (pivoted order) at {@code a[j][0..j]}; below the diagonal, the reflector's tail. */
    private double[][] a;
    /** Column k of A Π is column {@code perm[k]} of A, for k below {@link #cols()}. */
    final int[] perm;
    /** Leading entry of reflector k (its tail is in {@code a[k][k+1..]}). */
    private final double[] head;
    private final double[] beta;
    /** Per column, the partial squared norm (down-dated), and its value at the last recomputation. */
    private final double[] partial;
    private final double[] recomputed;
    int rank;

    /**
     * Room for the factorisation of any matrix of at most {@code maxRows} × {@code maxCols}, by
     * {@link #factorColumns}: the working arrays are allocated here once, so that a caller that
     * factors matrices of the same unit over and over allocates nothing per factorisation. Each
     * factorisation replaces the previous one.
     */
    PivotedQr(int maxRows, int maxCols) {
        perm = new int[maxCols];
        int steps = Math.min(maxRows, maxCols);
        head = new double[steps];
        beta = new double[steps];
        partial = new double[maxCols];
        recomputed = new double[maxCols];
    }

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
        this(rows, cols);
        factorColumns(transpose(a, rows, cols), rows, cols, relativeTolerance, referenceNorm);
    }

    /**
     * As {@link #PivotedQr(double[][], int, int, double, double)}, for a matrix given by its columns,
     * {@code columns[j]} of length at least {@code rows}: the arrays are factored in place (and so
     * overwritten), which spares a copy when the caller builds A for this factorisation only.
     */
    static PivotedQr ofColumns(double[][] columns, int rows, int cols, double relativeTolerance, double referenceNorm) {
        PivotedQr qr = new PivotedQr(rows, cols);
        qr.factorColumns(columns, rows, cols, relativeTolerance, referenceNorm);
        return qr;
    }

    private static double[][] transpose(double[][] a, int rows, int cols) {
        double[][] c = new double[cols][rows];
        for (int i = 0; i < rows; i++) {
            double[] row = a[i];
            for (int j = 0; j < cols; j++) {
                c[j][i] = row[j];
            }
        }
        return c;
    }

    /**
     * Factors the matrix given by its columns as {@link #ofColumns} does, in place, into this
     * instance's working arrays (which must have room for it), replacing the previous factorisation.
     * The columns array is kept (its entries are swapped into pivoted order) until the next call.
     *
     * @throws IllegalArgumentException when the matrix is larger than the room made at construction
     */
    void factorColumns(double[][] columns, int rows, int cols, double relativeTolerance, double referenceNorm) {
        if (cols > perm.length || Math.min(rows, cols) > head.length) {
            throw new IllegalArgumentException("a " + rows + " x " + cols + " matrix does not fit a factorisation"
                    + " made for " + perm.length + " columns and " + head.length + " steps");
        }
        this.rows = rows;
        this.cols = cols;
        double[][] c = columns;
        this.a = c;
        rank = 0;
        for (int j = 0; j < cols; j++) {
            perm[j] = j;
        }
        int steps = Math.min(rows, cols);
        double largest = 0.0;
        for (int j = 0; j < cols; j++) {
            double n2 = norm2(c[j], 0);
            partial[j] = n2;
            recomputed[j] = n2;
            largest = Math.max(largest, n2);
        }
        largest = Math.max(largest, referenceNorm * referenceNorm);
        double threshold = relativeTolerance * relativeTolerance * largest;
        for (int k = 0; k < steps; k++) {
            int best = k;
            for (int j = k + 1; j < cols; j++) {
                if (partial[j] > partial[best]) {
                    best = j;
                }
            }
            double bestNorm2 = norm2(c[best], k);
            if (!(bestNorm2 > threshold)) {
                break;
            }
            if (best != k) {
                double[] t = c[k];
                c[k] = c[best];
                c[best] = t;
                int p = perm[k];
                perm[k] = perm[best];
                perm[best] = p;
                partial[best] = partial[k];
                recomputed[best] = recomputed[k];
            }
            double[] v = c[k];
            double norm = Math.sqrt(bestNorm2);
            double alpha = v[k] > 0.0 ? -norm : norm;
            double v0 = v[k] - alpha;
            double v2 = v0 * v0;
            for (int i = k + 1; i < rows; i++) {
                v2 += v[i] * v[i];
            }
            double b = v2 > 0.0 ? 2.0 / v2 : 0.0;
            head[k] = v0;
            beta[k] = b;
            v[k] = v0;
            for (int j = k + 1; j < cols; j++) {
                double[] w = c[j];
                double s = dot(v, w, k, rows) * b;
                if (s != 0.0) {
                    for (int i = k; i < rows; i++) {
                        w[i] -= s * v[i];
                    }
                }
                // down-date ‖w[k+1..]‖² = ‖w[k..]‖² − w[k]², recomputed when that cancels
                if (partial[j] != 0.0) {
                    double rest = Math.max(0.0, 1.0 - w[k] * w[k] / partial[j]);
                    if (rest * (partial[j] / recomputed[j]) <= RECOMPUTE_BELOW) {
                        double n2 = norm2(w, k + 1);
                        partial[j] = n2;
                        recomputed[j] = n2;
                    } else {
                        partial[j] *= rest;
                    }
                }
            }
            v[k] = alpha;
            rank = k + 1;
        }
    }

    private double norm2(double[] column, int from) {
        return dot(column, column, from, rows);
    }

    /**
     * Σ x_i y_i over [from, to), in four interleaved partial sums: the JIT does not reorder a
     * floating-point sum, so a single accumulator waits on the adder's latency at every term. Only
     * the rounding differs from the sum in order.
     */
    private static double dot(double[] x, double[] y, int from, int to) {
        double s0 = 0.0;
        double s1 = 0.0;
        double s2 = 0.0;
        double s3 = 0.0;
        int i = from;
        for (; i + 3 < to; i += 4) {
            s0 += x[i] * y[i];
            s1 += x[i + 1] * y[i + 1];
            s2 += x[i + 2] * y[i + 2];
            s3 += x[i + 3] * y[i + 3];
        }
        for (; i < to; i++) {
            s0 += x[i] * y[i];
        }
        return (s0 + s1) + (s2 + s3);
    }

    /** Entry (i, j) of R, i ≤ j, i < {@link #rank}, in pivoted column order. */
    double r(int i, int j) {
        return a[j][i];
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

    /**
     * b ← Q b for a b whose entries after {@code last} are zero (a unit vector e_last, say):
     * reflectors past {@code last} act on those entries only and leave b as it is, so are skipped.
     */
    void applyQ(double[] b, int last) {
        for (int k = Math.min(rank - 1, last); k >= 0; k--) {
            reflect(k, b);
        }
    }

    private void reflect(int k, double[] b) {
        double[] v = a[k];
        double h = head[k];
        double s = (h * b[k] + dot(v, b, k + 1, rows)) * beta[k];
        if (s != 0.0) {
            b[k] -= s * h;
            for (int i = k + 1; i < rows; i++) {
                b[i] -= s * v[i];
            }
        }
    }

    /** Solves R11 u = b in place, R11 the leading {@link #rank} × {@link #rank} block. */
    void solveUpper(double[] b) {
        // by columns: once u_j is known, its column of R leaves the rows above it
        for (int j = rank - 1; j >= 0; j--) {
            double[] col = a[j];
            double u = b[j] / col[j];
            b[j] = u;
            if (u != 0.0) {
                for (int i = 0; i < j; i++) {
                    b[i] -= col[i] * u;
                }
            }
        }
    }

    /** Solves R11ᵀ w = b in place. */
    void solveUpperTransposed(double[] b) {
        for (int i = 0; i < rank; i++) {
            double[] col = a[i];
            double s = b[i];
            for (int j = 0; j < i; j++) {
                s -= col[j] * b[j];
            }
            b[i] = s / col[i];
        }
    }

    int rows() {
        return rows;
    }

    int cols() {
        return cols;
    }
}
