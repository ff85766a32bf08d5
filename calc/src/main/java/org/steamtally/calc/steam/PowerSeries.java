package org.steamtally.calc.steam;

/**
 * A double power series Σ nᵢ·xᴵⁱ·yᴶⁱ built from an (I, J, n) coefficient table kept in the order the
 * IAPWS release prints it. The backward and boundary equations of the IF97 supplementary releases
 * are all of this form once their shifted and reduced arguments are formed.
 *
 * <p>Evaluation allocates nothing and uses no {@link Math#pow}: the releases print their tables
 * sorted by I, so xᴵ is raised once per run of equal I, and yᴶ by repeated squaring, which handles
 * the negative integer exponents the releases use.
 */
final class PowerSeries {

    private final int[] i;
    private final int[] j;
    private final double[] n;

    /**
     * @param table flat rows I, J, n exactly as printed in the release
     */
    PowerSeries(double[] table) {
        if (table.length % 3 != 0) {
            throw new IllegalArgumentException("a coefficient table holds (I, J, n) triples, got " + table.length + " values");
        }
        int terms = table.length / 3;
        i = new int[terms];
        j = new int[terms];
        n = new double[terms];
        for (int k = 0; k < terms; k++) {
            i[k] = exactInt(table[3 * k]);
            j[k] = exactInt(table[3 * k + 1]);
            n[k] = table[3 * k + 2];
        }
    }

    private static int exactInt(double exponent) {
        int e = (int) exponent;
        if (e != exponent) {
            throw new IllegalArgumentException("exponent must be an integer, got " + exponent);
        }
        return e;
    }

    int terms() {
        return n.length;
    }

    /** Σ nᵢ·xᴵⁱ·yᴶⁱ. */
    double sum(double x, double y) {
        double total = 0;
        int iCurrent = i[0];
        double xPower = ipow(x, iCurrent);
        for (int k = 0; k < n.length; k++) {
            if (i[k] != iCurrent) {
                iCurrent = i[k];
                xPower = ipow(x, iCurrent);
            }
            total += n[k] * xPower * ipow(y, j[k]);
        }
        return total;
    }

    /** Σ nᵢ·xᴵⁱ, for the one-argument boundary equations whose J column is empty. */
    static double polynomial(double[] n, double x) {
        double total = 0;
        for (int k = n.length - 1; k >= 0; k--) {
            total = total * x + n[k];
        }
        return total;
    }

    /** x raised to an integer power by repeated squaring; negative powers give the reciprocal. */
    static double ipow(double x, int e) {
        if (e < 0) {
            return 1.0 / ipow(x, -e);
        }
        double result = 1.0;
        double base = x;
        while (e != 0) {
            if ((e & 1) != 0) {
                result *= base;
            }
            e >>>= 1;
            if (e != 0) {
                base *= base;
            }
        }
        return result;
    }
}
