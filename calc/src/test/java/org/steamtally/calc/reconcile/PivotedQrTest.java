package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/** Householder QR with column pivoting: rank decisions and the orthogonal factor, by hand-made matrices. */
class PivotedQrTest {

    @Test
    void rankOfAMatrixWithTwoEqualColumnsAndOneSumColumnIsTwo() {
        double[][] a = {
                {1, 1, 3, 2},
                {2, 2, 5, 3},
                {0, 0, 1, 1},
                {1, 1, 2, 1}};
        // column 2 = column 0 + column 3, column 1 = column 0
        PivotedQr qr = new PivotedQr(a, 4, 4, 1e-10);
        assertEquals(2, qr.rank);
    }

    @Test
    void qTransposeTimesQIsTheIdentityAndReproducesTheNormOfAVector() {
        double[][] a = {
                {4, 1, 0},
                {1, 3, 1},
                {0, 1, 2},
                {2, 0, 1},
                {1, 1, 1}};
        PivotedQr qr = new PivotedQr(a, 5, 3, 1e-10);
        double[] v = {0.3, -1.2, 2.5, 0.7, -0.4};
        double[] w = v.clone();
        qr.applyQt(w);
        double n1 = 0;
        double n2 = 0;
        for (int i = 0; i < 5; i++) {
            n1 += v[i] * v[i];
            n2 += w[i] * w[i];
        }
        qr.applyQ(w);
        double norm1 = n1;
        double norm2 = n2;
        assertAll(
                () -> assertEquals(3, qr.rank),
                () -> assertEquals(norm1, norm2, 1e-12),
                () -> assertEquals(v[0], w[0], 1e-14),
                () -> assertEquals(v[4], w[4], 1e-14));
    }

    @Test
    void triangularSolvesInvertTheLeadingBlock() {
        double[][] a = {{2, 1}, {1, 3}, {0, 1}};
        PivotedQr qr = new PivotedQr(a, 3, 2, 1e-10);
        double[] b = {1.0, -2.0};
        double[] x = b.clone();
        qr.solveUpper(x);
        // R x = b, checked by multiplying back
        double r0 = qr.r(0, 0) * x[0] + qr.r(0, 1) * x[1];
        double r1 = qr.r(1, 1) * x[1];
        double[] y = b.clone();
        qr.solveUpperTransposed(y);
        double s0 = qr.r(0, 0) * y[0];
        double s1 = qr.r(0, 1) * y[0] + qr.r(1, 1) * y[1];
        assertAll(
                () -> assertEquals(b[0], r0, 1e-14),
                () -> assertEquals(b[1], r1, 1e-14),
                () -> assertEquals(b[0], s0, 1e-14),
                () -> assertEquals(b[1], s1, 1e-14));
    }

    @Test
    void aRankDeficientMatrixIsReproducedByQTimesRInThePivotOrderOfLargestRemainingNorm() {
        // columns e1, 2 e2, 3 e3 and 2 e1 + 2 e2 (= 2 c0 + c1): rank 3. Hand derivation of the pivots:
        // norms 1, 2, 3, √8, so c2 then c3; left after projecting out (2, 2, 0, 0)/√8:
        // c0 → (1/2, −1/2, 0, 0), norm² 1/2; c1 → (−1, 1, 0, 0), norm² 2, so c1; then c0 is 0.
        double[][] a = {
                {1, 0, 0, 2},
                {0, 2, 0, 2},
                {0, 0, 3, 0},
                {0, 0, 0, 0}};
        PivotedQr qr = new PivotedQr(a, 4, 4, 1e-10);
        assertAll(
                () -> assertEquals(3, qr.rank),
                () -> assertArrayEquals(new int[] {2, 3, 1, 0}, qr.perm),
                () -> assertEquals(3.0, Math.abs(qr.r(0, 0)), 1e-12),
                () -> assertEquals(Math.sqrt(8.0), Math.abs(qr.r(1, 1)), 1e-12),
                () -> assertEquals(Math.sqrt(2.0), Math.abs(qr.r(2, 2)), 1e-12));
        for (int k = 0; k < 4; k++) {
            // column k of A Π is Q times column k of R (rows below the rank are zero for a rank-3 A)
            double[] col = new double[4];
            for (int i = 0; i <= Math.min(k, qr.rank - 1); i++) {
                col[i] = qr.r(i, k);
            }
            qr.applyQ(col);
            for (int i = 0; i < 4; i++) {
                assertEquals(a[i][qr.perm[k]], col[i], 1e-12, "entry " + i + " of column " + k + " of A Π");
            }
        }
    }

    @Test
    void qTimesAUnitVectorSkippingTheReflectorsPastItsEntryEqualsTheFullProduct() {
        double[][] a = {{4, 1, 0}, {1, 3, 1}, {0, 1, 2}, {2, 0, 1}, {1, 1, 1}};
        PivotedQr qr = new PivotedQr(a, 5, 3, 1e-10);
        for (int k = 0; k < 3; k++) {
            double[] full = new double[5];
            full[k] = 1.0;
            double[] part = full.clone();
            qr.applyQ(full);
            qr.applyQ(part, k);
            assertArrayEquals(full, part, 0.0, "column " + k + " of Q");
        }
    }
}
