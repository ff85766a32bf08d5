package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.steam.Steam;

/**
 * A mixer of two liquid streams, every p, T and flow measured: one mass and one energy balance,
 * the energy balance non-linear through IF97. Checked against an independent solve in the test: the
 * constraints are eliminated instead of linearised (m_c = m_a + m_b, and T_c from the mixed
 * enthalpy by IF97's backward T(p, h) through the {@link Steam} facade), and the now unconstrained
 * weighted least-squares problem in the seven free quantities is solved by Gauss–Newton with a
 * central-difference Jacobian.
 */
class ReconcilerNonlinearTest {

    private static final double P = 1.0e6;
    private static final double TA = 423.15;
    private static final double TB = 333.15;
    private static final double MA = 60.0;
    private static final double MB = 40.0;

    private static SmallUnit mixer(double tcOffset, double mcOffset) {
        double hc = (MA * Steam.enthalpyPT(P, TA) + MB * Steam.enthalpyPT(P, TB)) / (MA + MB);
        double tc = Steam.temperaturePH(P, hc);
        return new SmallUnit()
                .measured("a", P, TA, MA, 0.6)
                .measured("b", P, TB, MB, 0.5)
                .measured("c", P, tc + tcOffset, MA + MB + mcOffset, 0.8)
                .component(new Component.Mixer("mix", List.of("a", "b"), "c"));
    }

    @Test
    void consistentMeasurementsAreLeftAsTheyAre() {
        SmallUnit u = mixer(0.0, 0.0);
        ReconciliationResult r = Reconciler.compile(u.unit()).reconcile(u.snapshot()).result();
        assertAll(
                () -> assertEquals(ReconciliationResult.PASSED, r.status()),
                () -> assertEquals(2, r.redundancy()),
                // the exact enthalpies of the test's own forward/backward IF97 round trip differ by ~1e-9 relative
                () -> assertTrue(r.chi2() < 1e-8, "chi2 " + r.chi2()));
    }

    @Test
    void reconciledValuesAgreeWithAnIndependentEliminationSolve() {
        SmallUnit u = mixer(1.5, 1.2);
        double[] x = u.values();
        // sensor order: p_a, T_a, m_a, p_b, T_b, m_b, p_c, T_c, m_c
        double[] sigma = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            sigma[i] = u.unit().sensors().get(i).standardUncertaintySi();
        }
        double[] free = independentSolve(x, sigma);
        double[] full = expand(free);
        double chi2 = 0.0;
        for (int i = 0; i < x.length; i++) {
            chi2 += Math.pow((full[i] - x[i]) / sigma[i], 2);
        }

        ReconciliationResult r = Reconciler.compile(u.unit()).reconcile(u.snapshot()).result();
        Map<String, ReconciledSensor> s = ReconcilerLinearTest.byId(r);
        String[] ids = {"p_a", "T_a", "m_a", "p_b", "T_b", "m_b", "p_c", "T_c", "m_c"};
        double finalChi2 = chi2;
        assertAll(
                () -> assertEquals(2, r.redundancy()),
                () -> assertTrue(r.iterations() <= 6, "iterations " + r.iterations()),
                // both optima to ~1e-8 relative; chi2 of order 10 here
                () -> assertEquals(finalChi2, r.chi2(), 1e-6 * finalChi2));
        for (int i = 0; i < ids.length; i++) {
            int k = i;
            // 1e-4 standard uncertainties: the independent solve's difference Jacobian limits it
            assertEquals(full[k], s.get(ids[k]).reconciled().getAsDouble(), 1e-4 * sigma[k], ids[k]);
        }
    }

    /** (m_a, m_b, p_a, T_a, p_b, T_b, p_c) → all nine, in sensor order. */
    private static double[] expand(double[] u) {
        double ma = u[0];
        double mb = u[1];
        double mc = ma + mb;
        double hc = (ma * Steam.enthalpyPT(u[2], u[3]) + mb * Steam.enthalpyPT(u[4], u[5])) / mc;
        double tc = Steam.temperaturePH(u[6], hc);
        return new double[] {u[2], u[3], ma, u[4], u[5], mb, u[6], tc, mc};
    }

    private static double[] residuals(double[] u, double[] x, double[] sigma) {
        double[] full = expand(u);
        double[] r = new double[full.length];
        for (int i = 0; i < r.length; i++) {
            r[i] = (full[i] - x[i]) / sigma[i];
        }
        return r;
    }

    private static double[] independentSolve(double[] x, double[] sigma) {
        double[] u = {x[2], x[5], x[0], x[1], x[3], x[4], x[6]};
        double[] scale = {1e-4, 1e-4, 1.0, 1e-4, 1.0, 1e-4, 1.0};
        for (int it = 0; it < 30; it++) {
            double[] r = residuals(u, x, sigma);
            double[][] jac = new double[r.length][u.length];
            for (int k = 0; k < u.length; k++) {
                double h = scale[k];
                double[] up = u.clone();
                double[] dn = u.clone();
                up[k] += h;
                dn[k] -= h;
                double[] rp = residuals(up, x, sigma);
                double[] rn = residuals(dn, x, sigma);
                for (int i = 0; i < r.length; i++) {
                    jac[i][k] = (rp[i] - rn[i]) / (2 * h);
                }
            }
            int n = u.length;
            double[][] normal = new double[n][n + 1];
            for (int a = 0; a < n; a++) {
                for (int b = 0; b < n; b++) {
                    for (int i = 0; i < r.length; i++) {
                        normal[a][b] += jac[i][a] * jac[i][b];
                    }
                }
                for (int i = 0; i < r.length; i++) {
                    normal[a][n] -= jac[i][a] * r[i];
                }
            }
            double[] step = gauss(normal, n);
            double largest = 0.0;
            for (int k = 0; k < n; k++) {
                u[k] += step[k];
                largest = Math.max(largest, Math.abs(step[k]) / sigma[k == 0 ? 2 : k == 1 ? 5 : k == 2 ? 0 : k == 3 ? 1
                        : k == 4 ? 3 : k == 5 ? 4 : 6]);
            }
            if (largest < 1e-10) {
                break;
            }
        }
        return u;
    }

    /** Gaussian elimination with partial pivoting on an augmented n × (n + 1) matrix. */
    private static double[] gauss(double[][] a, int n) {
        for (int k = 0; k < n; k++) {
            int p = k;
            for (int i = k + 1; i < n; i++) {
                if (Math.abs(a[i][k]) > Math.abs(a[p][k])) {
                    p = i;
                }
            }
            double[] t = a[k];
            a[k] = a[p];
            a[p] = t;
            for (int i = k + 1; i < n; i++) {
                double f = a[i][k] / a[k][k];
                for (int j = k; j <= n; j++) {
                    a[i][j] -= f * a[k][j];
                }
            }
        }
        double[] x = new double[n];
        for (int i = n - 1; i >= 0; i--) {
            double s = a[i][n];
            for (int j = i + 1; j < n; j++) {
                s -= a[i][j] * x[j];
            }
            x[i] = s / a[i][i];
        }
        return x;
    }
}
