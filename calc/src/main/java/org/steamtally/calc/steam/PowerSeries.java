package org.steamtally.calc.steam;

import java.util.Arrays;
import java.util.Comparator;

/**
 * A double power series Σ nᵢ·x^Iᵢ·y^Jᵢ with integer exponents, the form of every IAPWS-IF97
 * polynomial used here (basic equations, backward equations and boundaries).
 *
 * <p>The release prints each table as (I, J, n) rows; the regions keep them in that order. This
 * class rearranges a table once, at class initialisation, into a nested Horner scheme: terms are
 * grouped by I (descending), each group is a Horner polynomial in y over its J (descending), and
 * the groups form a Horner polynomial in x. Every distinct power is then built by a few
 * multiplications of small exponent steps, nothing is allocated per call and no {@code Math.pow}
 * is needed. Negative exponents are handled through 1/x and 1/y, taken only for tables that have
 * them.
 *
 * <p>Instances are immutable and thread-safe.
 */
final class PowerSeries {

    /** Number of I groups. */
    private final int groupCount;
    /** Index one past the last term of each group. */
    private final int[] groupEnd;
    /** For group g > 0, the step I(g−1) − I(g) (positive); 0 for the first group. */
    private final int[] xStep;
    /** For each term but the first of its group, the step J(k−1) − J(k) (non-negative). */
    private final int[] yStep;
    /** The smallest J of each group, by which the group's Horner sum is finally multiplied. */
    private final int[] groupYMin;
    /** Coefficients in evaluation order. */
    private final double[] coef;
    /** The smallest I, by which the outer Horner sum is finally multiplied. */
    private final int xMin;
    private final boolean needsYInverse;

    /** The terms as given, kept for deriving derivative series. */
    private final int[] termI;
    private final int[] termJ;
    private final double[] termN;

    private PowerSeries(int[] i, int[] j, double[] n) {
        termI = i.clone();
        termJ = j.clone();
        termN = n.clone();
        int count = n.length;
        Integer[] order = new Integer[count];
        for (int k = 0; k < count; k++) {
            order[k] = k;
        }
        Arrays.sort(order, Comparator.<Integer>comparingInt(k -> -i[k]).thenComparingInt(k -> -j[k]));

        coef = new double[count];
        yStep = new int[count];
        int[] groupEndTmp = new int[count];
        int[] xStepTmp = new int[count];
        int[] yMinTmp = new int[count];
        int groups = 0;
        boolean negY = false;
        for (int pos = 0; pos < count; pos++) {
            int k = order[pos];
            coef[pos] = n[k];
            boolean newGroup = pos == 0 || i[order[pos - 1]] != i[k];
            if (newGroup) {
                if (groups > 0) {
                    groupEndTmp[groups - 1] = pos;
                    xStepTmp[groups] = i[order[pos - 1]] - i[k];
                }
                groups++;
                yStep[pos] = 0;
            } else {
                yStep[pos] = j[order[pos - 1]] - j[k];
            }
            yMinTmp[groups - 1] = j[k];
            negY |= j[k] < 0;
        }
        if (groups > 0) {
            groupEndTmp[groups - 1] = count;
        }
        groupCount = groups;
        groupEnd = Arrays.copyOf(groupEndTmp, groups);
        xStep = Arrays.copyOf(xStepTmp, groups);
        groupYMin = Arrays.copyOf(yMinTmp, groups);
        xMin = count == 0 ? 0 : i[order[count - 1]];
        needsYInverse = negY;
    }

    /**
     * A series from a table printed as rows (Iᵢ, Jᵢ, nᵢ).
     *
     * @throws IllegalArgumentException if the three columns differ in length
     */
    static PowerSeries of(int[] i, int[] j, double[] n) {
        if (i.length != j.length || j.length != n.length) {
            throw new IllegalArgumentException("I, J and n columns differ in length: "
                    + i.length + ", " + j.length + ", " + n.length);
        }
        return new PowerSeries(i, j, n);
    }

    /**
     * A series from a table written as rows {I, J, n} in the order printed in the release.
     * I and J must be whole numbers.
     */
    static PowerSeries ofRows(double[][] rows) {
        return ofRows(rows, 1);
    }

    /**
     * A series from rows {I, J, n} whose I are multiples of 1/xScale, evaluated with
     * x = (argument)^(1/xScale); used for the quarter-integer exponents of IAPWS R7-97(2012),
     * eq. 25, where x = π^(1/4) turns every exponent into a whole number.
     */
    static PowerSeries ofRows(double[][] rows, int xScale) {
        int count = rows.length;
        int[] i = new int[count];
        int[] j = new int[count];
        double[] n = new double[count];
        for (int k = 0; k < count; k++) {
            double[] row = rows[k];
            if (row.length != 3) {
                throw new IllegalArgumentException("row " + (k + 1) + " is not {I, J, n}");
            }
            i[k] = whole(row[0] * xScale, k);
            j[k] = whole(row[1], k);
            n[k] = row[2];
        }
        return of(i, j, n);
    }

    /**
     * A series from a table written flat as consecutive (I, J, n) triples in the order printed in
     * the release, the layout of the supplementary releases' tables here.
     */
    static PowerSeries ofTriples(double[] table) {
        if (table.length % 3 != 0) {
            throw new IllegalArgumentException("a coefficient table holds (I, J, n) triples, got "
                    + table.length + " values");
        }
        double[][] rows = new double[table.length / 3][];
        for (int k = 0; k < rows.length; k++) {
            rows[k] = new double[] {table[3 * k], table[3 * k + 1], table[3 * k + 2]};
        }
        return ofRows(rows);
    }

    /** Σ nᵢ·x^i for i = 0, 1, ..., by Horner's rule: the one-argument boundary equations. */
    static double polynomial(double[] n, double x) {
        double total = 0.0;
        for (int k = n.length - 1; k >= 0; k--) {
            total = total * x + n[k];
        }
        return total;
    }

    private static int whole(double value, int row) {
        long rounded = Math.round(value);
        if (rounded != value) {
            throw new IllegalArgumentException("row " + (row + 1) + ": exponent " + value + " is not whole");
        }
        return (int) rounded;
    }

    /** A series in y alone, Σ nᵢ·y^Jᵢ (all I = 0), for the ideal-gas parts. */
    static PowerSeries ofY(int[] j, double[] n) {
        return of(new int[j.length], j, n);
    }

    /** ∂/∂x of this series, as a new series (terms with I = 0 drop out). */
    PowerSeries derivativeX() {
        int count = 0;
        for (int k = 0; k < termN.length; k++) {
            if (termI[k] != 0) {
                count++;
            }
        }
        int[] i = new int[count];
        int[] j = new int[count];
        double[] n = new double[count];
        int pos = 0;
        for (int k = 0; k < termN.length; k++) {
            if (termI[k] != 0) {
                i[pos] = termI[k] - 1;
                j[pos] = termJ[k];
                n[pos] = termN[k] * termI[k];
                pos++;
            }
        }
        return new PowerSeries(i, j, n);
    }

    /** ∂/∂y of this series, as a new series (terms with J = 0 drop out). */
    PowerSeries derivativeY() {
        int count = 0;
        for (int k = 0; k < termN.length; k++) {
            if (termJ[k] != 0) {
                count++;
            }
        }
        int[] i = new int[count];
        int[] j = new int[count];
        double[] n = new double[count];
        int pos = 0;
        for (int k = 0; k < termN.length; k++) {
            if (termJ[k] != 0) {
                i[pos] = termI[k];
                j[pos] = termJ[k] - 1;
                n[pos] = termN[k] * termJ[k];
                pos++;
            }
        }
        return new PowerSeries(i, j, n);
    }

    // The evaluation plan, read by the generator of the straight-line sums (calc/src/test).

    int[] groupEnds() {
        return groupEnd.clone();
    }

    int[] xSteps() {
        return xStep.clone();
    }

    int[] ySteps() {
        return yStep.clone();
    }

    int[] groupYMins() {
        return groupYMin.clone();
    }

    double[] coefficients() {
        return coef.clone();
    }

    int smallestI() {
        return xMin;
    }

    boolean needsYInverse() {
        return needsYInverse;
    }

    /** Whether the series has no term in x, so that its sum does not depend on x. */
    boolean isPolynomialInYOnly() {
        return groupCount <= 1 && xMin == 0;
    }

    /** Σ nᵢ·x^Iᵢ·y^Jᵢ. x and y must be non-zero where the table has negative exponents of them. */
    double sum(double x, double y) {
        double yInv = needsYInverse ? 1.0 / y : 0.0;
        double outer = 0.0;
        int k = 0;
        for (int g = 0; g < groupCount; g++) {
            int end = groupEnd[g];
            double inner = coef[k++];
            while (k < end) {
                inner = inner * ipow(y, yStep[k]) + coef[k];
                k++;
            }
            int ym = groupYMin[g];
            if (ym != 0) {
                inner *= ym > 0 ? ipow(y, ym) : ipow(yInv, -ym);
            }
            outer = outer * ipow(x, xStep[g]) + inner;
        }
        if (xMin != 0) {
            outer *= xMin > 0 ? ipow(x, xMin) : ipow(1.0 / x, -xMin);
        }
        return outer;
    }

    /**
     * b^e by repeated squaring; the small exponents that dominate are special-cased, and a negative
     * exponent gives the reciprocal.
     */
    static double ipow(double b, int e) {
        if (e < 0) {
            return 1.0 / ipow(b, -e);
        }
        switch (e) {
            case 0:
                return 1.0;
            case 1:
                return b;
            case 2:
                return b * b;
            case 3:
                return b * b * b;
            case 4: {
                double b2 = b * b;
                return b2 * b2;
            }
            default: {
                double r = 1.0;
                double base = b;
                int n = e;
                while (true) {
                    if ((n & 1) != 0) {
                        r *= base;
                    }
                    n >>>= 1;
                    if (n == 0) {
                        return r;
                    }
                    base *= base;
                }
            }
        }
    }
}
