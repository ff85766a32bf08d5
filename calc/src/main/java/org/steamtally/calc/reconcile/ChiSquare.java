package org.steamtally.calc.reconcile;

/**
 * Quantiles of the χ² distribution, for the global test of a reconciliation, and the two-sided
 * normal quantile of the individual tests, from the regularised incomplete gamma function.
 *
 * <p>The χ² distribution with k degrees of freedom has F(x) = P(k/2, x/2), P the regularised lower
 * incomplete gamma function (NIST Digital Library of Mathematical Functions, DLMF 8.2.4).
 * P is computed by its power series for x &lt; a + 1 (DLMF 8.7.1, in the form
 * γ*(a, x) = e^{-x} Σ x^n / Γ(a + n + 1)) and otherwise through Q = 1 − P by Legendre's continued
 * fraction (DLMF 8.9.2), evaluated by the modified Lentz method; ln Γ by Stirling's series
 * (DLMF 5.11.1) after shifting the argument above 8 with Γ(x + 1) = x Γ(x). The quantile inverts
 * F by Newton's method on the density, safeguarded by bisection inside a bracket, to a relative
 * 1e-13: a Wilson–Hilferty cube-root approximation is off by up to a few per cent at one or two
 * degrees of freedom, which is a different test.
 *
 * <p>The two-sided normal quantile z with P(|Z| ≤ z) = c is √(χ²₁ quantile at c), since Z² of a
 * standard normal Z has the χ² distribution with one degree of freedom.
 */
public final class ChiSquare {

    private static final double LN_SQRT_2PI = 0.5 * Math.log(2.0 * Math.PI);
    /** Series and continued fraction stop when a term changes the sum by less than this. */
    private static final double EPSILON = 1e-16;
    private static final int MAX_TERMS = 10_000;

    private ChiSquare() {
    }

    /**
     * ln Γ(x) for x &gt; 0, by Stirling's series (DLMF 5.11.1) with seven terms after shifting x
     * to at least 8, where the first omitted term is below 1e-17.
     */
    public static double logGamma(double x) {
        if (!(x > 0.0) || !Double.isFinite(x)) {
            throw new IllegalArgumentException("ln Γ(x) needs a finite x > 0, was " + x);
        }
        double shift = 0.0;
        while (x < 8.0) {
            shift -= Math.log(x);
            x += 1.0;
        }
        double inv = 1.0 / x;
        double inv2 = inv * inv;
        // Σ B_2k / (2k (2k − 1) x^(2k−1)), B_2k the Bernoulli numbers 1/6, −1/30, 1/42, −1/30, 5/66, −691/2730, 7/6.
        double series = inv * (1.0 / 12 + inv2 * (-1.0 / 360 + inv2 * (1.0 / 1260 + inv2 * (-1.0 / 1680
                + inv2 * (1.0 / 1188 + inv2 * (-691.0 / 360360 + inv2 * (1.0 / 156)))))));
        return shift + (x - 0.5) * Math.log(x) - x + LN_SQRT_2PI + series;
    }

    /** The regularised lower incomplete gamma function P(a, x), a &gt; 0, x ≥ 0. */
    public static double regularizedGammaP(double a, double x) {
        check(a, x);
        if (x == 0.0) {
            return 0.0;
        }
        return x < a + 1.0 ? series(a, x) : 1.0 - continuedFraction(a, x);
    }

    /** The regularised upper incomplete gamma function Q(a, x) = 1 − P(a, x). */
    public static double regularizedGammaQ(double a, double x) {
        check(a, x);
        if (x == 0.0) {
            return 1.0;
        }
        return x < a + 1.0 ? 1.0 - series(a, x) : continuedFraction(a, x);
    }

    /** The χ² distribution function F(x) = P(k/2, x/2). */
    public static double cdf(double x, double degreesOfFreedom) {
        return regularizedGammaP(0.5 * degreesOfFreedom, 0.5 * Math.max(0.0, x));
    }

    /**
     * The quantile x with F(x) = probability, for k degrees of freedom: the χ² limit of the global
     * test at that confidence, e.g. 3.841 for k = 1 and probability 0.95.
     *
     * @param probability     in (0, 1)
     * @param degreesOfFreedom k &gt; 0
     */
    public static double quantile(double probability, double degreesOfFreedom) {
        if (!(probability > 0.0 && probability < 1.0)) {
            throw new IllegalArgumentException("probability must lie strictly within 0 and 1, was " + probability);
        }
        if (!(degreesOfFreedom > 0.0) || !Double.isFinite(degreesOfFreedom)) {
            throw new IllegalArgumentException("degrees of freedom must be a finite number > 0, was " + degreesOfFreedom);
        }
        double k = degreesOfFreedom;
        double lo = 0.0;
        double hi = Math.max(1.0, k);
        while (cdf(hi, k) < probability) {
            lo = hi;
            hi *= 2.0;
        }
        double half = 0.5 * k;
        double logNorm = half * Math.log(2.0) + logGamma(half);
        double x = 0.5 * (lo + hi);
        for (int i = 0; i < 200; i++) {
            double f = cdf(x, k) - probability;
            if (f == 0.0) {
                return x;
            }
            if (f < 0.0) {
                lo = x;
            } else {
                hi = x;
            }
            double density = Math.exp((half - 1.0) * Math.log(x) - 0.5 * x - logNorm);
            double next = x - f / density;
            if (!(next > lo && next < hi) || !Double.isFinite(next)) {
                next = 0.5 * (lo + hi);
            }
            if (Math.abs(next - x) <= 1e-13 * x) {
                return next;
            }
            x = next;
        }
        return x;
    }

    /**
     * The two-sided standard normal quantile z with P(|Z| ≤ z) = confidence, e.g. 1.96 at 0.95:
     * the limit of the individual tests.
     */
    public static double normalTwoSided(double confidence) {
        return Math.sqrt(quantile(confidence, 1.0));
    }

    private static void check(double a, double x) {
        if (!(a > 0.0) || !Double.isFinite(a) || !(x >= 0.0) || Double.isInfinite(x)) {
            throw new IllegalArgumentException("incomplete gamma needs a > 0 and finite x ≥ 0, was a = " + a
                    + ", x = " + x);
        }
    }

    /** P(a, x) = x^a e^{-x} / Γ(a + 1) · Σ_n x^n / ((a + 1)(a + 2)…(a + n)), DLMF 8.7.1. */
    private static double series(double a, double x) {
        double term = 1.0;
        double sum = 1.0;
        double ap = a;
        for (int n = 1; n < MAX_TERMS; n++) {
            ap += 1.0;
            term *= x / ap;
            sum += term;
            if (Math.abs(term) < EPSILON * Math.abs(sum)) {
                break;
            }
        }
        return sum * Math.exp(a * Math.log(x) - x - logGamma(a + 1.0));
    }

    /**
     * Q(a, x) = e^{-x} x^a / Γ(a) · 1 / (x + 1 − a − 1(1 − a) / (x + 3 − a − 2(2 − a) / (x + 5 − a − …))),
     * the even part of Legendre's continued fraction (DLMF 8.9.2), by the modified Lentz method.
     */
    private static double continuedFraction(double a, double x) {
        double tiny = 1e-300;
        double b = x + 1.0 - a;
        double c = 1.0 / tiny;
        double d = 1.0 / b;
        double h = d;
        for (int n = 1; n < MAX_TERMS; n++) {
            double an = -n * (n - a);
            b += 2.0;
            d = an * d + b;
            if (Math.abs(d) < tiny) {
                d = tiny;
            }
            c = b + an / c;
            if (Math.abs(c) < tiny) {
                c = tiny;
            }
            d = 1.0 / d;
            double delta = d * c;
            h *= delta;
            if (Math.abs(delta - 1.0) < EPSILON) {
                break;
            }
        }
        return Math.exp(a * Math.log(x) - x - logGamma(a)) * h;
    }
}
