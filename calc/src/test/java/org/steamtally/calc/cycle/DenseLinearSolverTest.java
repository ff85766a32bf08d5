package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class DenseLinearSolverTest {

    private static final long SEED = 4_242L;

    @Test
    void solvesASystemThatNeedsPivoting() {
        // A zero on the first diagonal: elimination without row interchange would divide by zero.
        double[][] a = {{0, 2, 1}, {1, 1, 1}, {2, 1, 0}};
        double[] b = {5, 6, 4};
        int[] perm = new int[3];
        assertTrue(DenseLinearSolver.factor(a, 3, perm, 1e-12));
        DenseLinearSolver.solve(a, 3, perm, b, new double[3]);
        double[][] original = {{0, 2, 1}, {1, 1, 1}, {2, 1, 0}};
        double[] rhs = {5, 6, 4};
        for (int i = 0; i < 3; i++) {
            double sum = 0;
            for (int j = 0; j < 3; j++) {
                sum += original[i][j] * b[j];
            }
            assertEquals(rhs[i], sum, 1e-14, "row " + i);
        }
    }

    @Test
    void recoversAKnownSolutionOfRandomSystems() {
        SplittableRandom random = new SplittableRandom(SEED);
        for (int trial = 0; trial < 50; trial++) {
            int n = 2 + random.nextInt(30);
            double[][] a = new double[n][n];
            double[][] copy = new double[n][n];
            double[] x = new double[n];
            for (int i = 0; i < n; i++) {
                x[i] = random.nextDouble(-100, 100);
                for (int j = 0; j < n; j++) {
                    a[i][j] = random.nextDouble(-1, 1);
                    copy[i][j] = a[i][j];
                }
            }
            double[] b = new double[n];
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n; j++) {
                    b[i] += copy[i][j] * x[j];
                }
            }
            int[] perm = new int[n];
            assertTrue(DenseLinearSolver.factor(a, n, perm, 1e-14), "seed " + SEED + ", trial " + trial);
            double[][] columns = new double[n][2];
            for (int i = 0; i < n; i++) {
                columns[i][0] = b[i];
                columns[i][1] = 2 * b[i];
            }
            DenseLinearSolver.solve(a, n, perm, b, new double[n]);
            DenseLinearSolver.solveColumns(a, n, perm, columns, 2, new double[n][]);
            // Random matrices of this size have condition numbers up to some 1e4: 1e-8 of |x| is rounding.
            assertArrayEquals(x, b, 1e-8 * 100, "seed " + SEED + ", trial " + trial);
            for (int i = 0; i < n; i++) {
                assertEquals(x[i], columns[i][0], 1e-6, "column 0, seed " + SEED + ", trial " + trial);
                assertEquals(2 * x[i], columns[i][1], 2e-6, "column 1, seed " + SEED + ", trial " + trial);
            }
        }
    }

    @Test
    void reportsASingularMatrix() {
        double[][] a = {{1, 2}, {2, 4}};
        assertFalse(DenseLinearSolver.factor(a, 2, new int[2], 1e-12));
        assertFalse(DenseLinearSolver.factor(new double[2][2], 2, new int[2], 1e-12));
    }

    @Test
    void echelonBasisFindsDependentRowsAndUnfixedUnknowns() {
        DenseLinearSolver.EchelonBasis basis = new DenseLinearSolver.EchelonBasis(3);
        assertTrue(basis.add(new double[] {1, -1, 0}));
        assertTrue(basis.add(new double[] {0, 1, -1}));
        // The loop's third balance is the negative sum of the first two.
        assertFalse(basis.add(new double[] {-1, 0, 1}));
        assertFalse(basis.spans(new double[] {1, 0, 0}), "no flow is fixed without a measurement");
        assertTrue(basis.add(new double[] {0, 0, 1}));
        assertTrue(basis.spans(new double[] {1, 0, 0}));
        assertEquals(3, basis.rank());
    }
}
