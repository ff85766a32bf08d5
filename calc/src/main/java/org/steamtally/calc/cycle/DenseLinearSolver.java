package org.steamtally.calc.cycle;

/**
 * Gaussian elimination with partial pivoting (the LU factorisation PA = LU, row by row) for the
 * small dense systems of the
 * mass and energy balances, about 10 to 40 unknowns, and an incremental row-echelon basis for the
 * structural checks at compile time. Compact on purpose: a linear-algebra library may replace it
 * without changing {@link CycleModel}'s results beyond rounding.
 *
 * <p>All methods work in place on caller-owned arrays and allocate nothing.
 */
final class DenseLinearSolver {

    private DenseLinearSolver() {
    }

    /**
     * Factors the n × n matrix {@code a} in place into L (unit lower, below the diagonal) and U (on
     * and above it), recording the row interchanges in {@code perm} (row i of the factors is row
     * perm[i] of the original).
     *
     * @param relativePivotTolerance a pivot smaller than this times the largest entry of its column
     *                               before elimination is taken as zero
     * @return false when the matrix is singular to that tolerance; the factors are then unusable
     */
    static boolean factor(double[][] a, int n, int[] perm, double relativePivotTolerance) {
        for (int i = 0; i < n; i++) {
            perm[i] = i;
        }
        double scale = 0.0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                scale = Math.max(scale, Math.abs(a[i][j]));
            }
        }
        if (!(scale > 0.0) || !Double.isFinite(scale)) {
            return false;
        }
        double threshold = relativePivotTolerance * scale;
        for (int k = 0; k < n; k++) {
            int pivotRow = k;
            double pivotAbs = Math.abs(a[k][k]);
            for (int i = k + 1; i < n; i++) {
                double candidate = Math.abs(a[i][k]);
                if (candidate > pivotAbs) {
                    pivotAbs = candidate;
                    pivotRow = i;
                }
            }
            if (!(pivotAbs > threshold)) {
                return false;
            }
            if (pivotRow != k) {
                double[] row = a[k];
                a[k] = a[pivotRow];
                a[pivotRow] = row;
                int p = perm[k];
                perm[k] = perm[pivotRow];
                perm[pivotRow] = p;
            }
            double[] pivot = a[k];
            double inverse = 1.0 / pivot[k];
            for (int i = k + 1; i < n; i++) {
                double[] row = a[i];
                double factor = row[k] * inverse;
                row[k] = factor;
                if (factor != 0.0) {
                    for (int j = k + 1; j < n; j++) {
                        row[j] -= factor * pivot[j];
                    }
                }
            }
        }
        return true;
    }

    /**
     * Solves A x = b with the factors from {@link #factor}; {@code b} is overwritten by x.
     * {@code work} has length at least n.
     */
    static void solve(double[][] lu, int n, int[] perm, double[] b, double[] work) {
        for (int i = 0; i < n; i++) {
            work[i] = b[perm[i]];
        }
        for (int i = 1; i < n; i++) {
            double sum = work[i];
            double[] row = lu[i];
            for (int j = 0; j < i; j++) {
                sum -= row[j] * work[j];
            }
            work[i] = sum;
        }
        for (int i = n - 1; i >= 0; i--) {
            double sum = work[i];
            double[] row = lu[i];
            for (int j = i + 1; j < n; j++) {
                sum -= row[j] * work[j];
            }
            work[i] = sum / row[i];
        }
        System.arraycopy(work, 0, b, 0, n);
    }

    /**
     * Solves A X = B for {@code columns} right-hand sides at once, B given row by row
     * ({@code b[i][c]} is row i of column c); {@code b} is overwritten by X. The rows of {@code b}
     * are permuted by swapping references, so the caller must not keep references to them.
     * {@code work} has n rows.
     */
    static void solveColumns(double[][] lu, int n, int[] perm, double[][] b, int columns, double[][] work) {
        for (int i = 0; i < n; i++) {
            work[i] = b[perm[i]];
        }
        for (int i = 0; i < n; i++) {
            b[i] = work[i];
        }
        for (int i = 1; i < n; i++) {
            double[] target = b[i];
            double[] row = lu[i];
            for (int j = 0; j < i; j++) {
                double f = row[j];
                if (f != 0.0) {
                    double[] source = b[j];
                    for (int c = 0; c < columns; c++) {
                        target[c] -= f * source[c];
                    }
                }
            }
        }
        for (int i = n - 1; i >= 0; i--) {
            double[] target = b[i];
            double[] row = lu[i];
            for (int j = i + 1; j < n; j++) {
                double f = row[j];
                if (f != 0.0) {
                    double[] source = b[j];
                    for (int c = 0; c < columns; c++) {
                        target[c] -= f * source[c];
                    }
                }
            }
            double inverse = 1.0 / row[i];
            for (int c = 0; c < columns; c++) {
                target[c] *= inverse;
            }
        }
    }

    /**
     * A basis of row vectors in echelon form, grown one candidate at a time: the tool for the
     * compile-time questions "is this balance independent of the ones before it?" and "is this
     * flow fixed by the balances?". Allocates; not for the hot path.
     */
    static final class EchelonBasis {

        /** Below this, relative to the candidate's largest entry, a reduced row counts as zero. */
        private static final double RELATIVE_TOLERANCE = 1e-9;

        private final int width;
        private final double[][] rows;
        private final int[] pivots;
        private int rank;

        EchelonBasis(int width) {
            this.width = width;
            this.rows = new double[width][];
            this.pivots = new int[width];
        }

        int rank() {
            return rank;
        }

        /** Adds the row when it is independent of the basis; returns whether it was. */
        boolean add(double[] candidate) {
            double[] reduced = reduce(candidate);
            if (reduced == null) {
                return false;
            }
            int pivot = 0;
            for (int j = 1; j < width; j++) {
                if (Math.abs(reduced[j]) > Math.abs(reduced[pivot])) {
                    pivot = j;
                }
            }
            rows[rank] = reduced;
            pivots[rank] = pivot;
            rank++;
            return true;
        }

        /** Whether the row lies in the span of the basis. */
        boolean spans(double[] candidate) {
            return reduce(candidate) == null;
        }

        private double[] reduce(double[] candidate) {
            double[] v = candidate.clone();
            double size = 0.0;
            for (double value : v) {
                size = Math.max(size, Math.abs(value));
            }
            if (size == 0.0) {
                return null;
            }
            for (int k = 0; k < rank; k++) {
                double[] row = rows[k];
                double f = v[pivots[k]] / row[pivots[k]];
                if (f != 0.0) {
                    for (int j = 0; j < width; j++) {
                        v[j] -= f * row[j];
                    }
                }
            }
            double left = 0.0;
            for (double value : v) {
                left = Math.max(left, Math.abs(value));
            }
            return left <= RELATIVE_TOLERANCE * size ? null : v;
        }
    }
}
