package org.steamtally.calc.steam;

/**
 * A dimensionless Gibbs free energy split into an ideal-gas part and a residual part,
 * γ(π, τ) = ln π + Σ n⁰·τ^J⁰ + Σ n·π^I·(τ − τshift)^J, the form IAPWS R7-97(2012) uses for region 2
 * (eq. 15 to 17), the metastable-vapour region (eq. 18 and 19) and region 5 (eq. 32 to 34), with
 * π = p/p* and τ = T* / T. The property relations are those of the release's Tables 12 and 39.
 *
 * <p>Also the Newton refinements shared by those regions. Instances are immutable and thread-safe.
 * A region may subclass it to replace the sums of its series by generated straight-line code.
 */
class VapourGibbs {

    private static final double R = If97Constants.R;

    private final String name;
    private final double pStarPa;
    private final double tStarK;
    private final double tauShift;
    final PowerSeries ideal;
    final PowerSeries idealTau;
    final PowerSeries idealTauTau;
    final PowerSeries residual;
    final PowerSeries residualPi;
    final PowerSeries residualTau;
    final PowerSeries residualPiPi;
    final PowerSeries residualPiTau;
    final PowerSeries residualTauTau;

    /**
     * @param name          the region's name, for error messages
     * @param pStarPa       reducing pressure p*, Pa
     * @param tStarK        reducing temperature T*, K
     * @param idealRows     rows {J⁰, n⁰} of the ideal-gas part, in printed order
     * @param residualRows  rows {I, J, n} of the residual part, in printed order
     * @param tauShift      the shift in (τ − τshift) of the residual part
     */
    VapourGibbs(String name, double pStarPa, double tStarK, double[][] idealRows, double[][] residualRows,
                double tauShift) {
        this.name = name;
        this.pStarPa = pStarPa;
        this.tStarK = tStarK;
        this.tauShift = tauShift;
        double[][] idealAsRows = new double[idealRows.length][];
        for (int k = 0; k < idealRows.length; k++) {
            idealAsRows[k] = new double[] {0, idealRows[k][0], idealRows[k][1]};
        }
        ideal = PowerSeries.ofRows(idealAsRows);
        idealTau = ideal.derivativeY();
        idealTauTau = idealTau.derivativeY();
        residual = PowerSeries.ofRows(residualRows);
        residualPi = residual.derivativeX();
        residualTau = residual.derivativeY();
        residualPiPi = residualPi.derivativeX();
        residualPiTau = residualPi.derivativeY();
        residualTauTau = residualTau.derivativeY();
    }

    // The sums of the series above. A region overrides them with its generated straight-line
    // evaluations (same result, bit for bit); the table-driven sums serve the rest.

    double idealSum(double tau) {
        return ideal.sum(0.0, tau);
    }

    double idealTauSum(double tau) {
        return idealTau.sum(0.0, tau);
    }

    double idealTauTauSum(double tau) {
        return idealTauTau.sum(0.0, tau);
    }

    double residualSum(double pi, double y) {
        return residual.sum(pi, y);
    }

    double residualPiSum(double pi, double y) {
        return residualPi.sum(pi, y);
    }

    double residualTauSum(double pi, double y) {
        return residualTau.sum(pi, y);
    }

    double residualPiPiSum(double pi, double y) {
        return residualPiPi.sum(pi, y);
    }

    double residualPiTauSum(double pi, double y) {
        return residualPiTau.sum(pi, y);
    }

    double residualTauTauSum(double pi, double y) {
        return residualTauTau.sum(pi, y);
    }

    double specificVolume(double p, double t) {
        double pi = p / pStarPa;
        double y = tStarK / t - tauShift;
        return R * t / p * (1.0 + pi * residualPiSum(pi, y));
    }

    double enthalpy(double p, double t) {
        double pi = p / pStarPa;
        double tau = tStarK / t;
        // RT·τ = R·T*, so h needs no division by T.
        return R * tStarK * (idealTauSum(tau) + residualTauSum(pi, tau - tauShift));
    }

    double entropy(double p, double t) {
        double pi = p / pStarPa;
        double tau = tStarK / t;
        double y = tau - tauShift;
        double gTau = idealTauSum(tau) + residualTauSum(pi, y);
        double g = Math.log(pi) + idealSum(tau) + residualSum(pi, y);
        return R * (tau * gTau - g);
    }

    double internalEnergy(double p, double t) {
        double pi = p / pStarPa;
        double tau = tStarK / t;
        double y = tau - tauShift;
        double gTau = idealTauSum(tau) + residualTauSum(pi, y);
        return R * t * (tau * gTau - 1.0 - pi * residualPiSum(pi, y));
    }

    double isobaricHeatCapacity(double p, double t) {
        double pi = p / pStarPa;
        double tau = tStarK / t;
        return -R * tau * tau * (idealTauTauSum(tau) + residualTauTauSum(pi, tau - tauShift));
    }

    double isochoricHeatCapacity(double p, double t) {
        double pi = p / pStarPa;
        double tau = tStarK / t;
        double y = tau - tauShift;
        double gTauTau = idealTauTauSum(tau) + residualTauTauSum(pi, y);
        double a = 1.0 + pi * residualPiSum(pi, y) - tau * pi * residualPiTauSum(pi, y);
        return R * (-tau * tau * gTauTau - a * a / (1.0 - pi * pi * residualPiPiSum(pi, y)));
    }

    double speedOfSound(double p, double t) {
        double pi = p / pStarPa;
        double tau = tStarK / t;
        double y = tau - tauShift;
        double gTauTau = idealTauTauSum(tau) + residualTauTauSum(pi, y);
        double piGrPi = pi * residualPiSum(pi, y);
        double a = 1.0 + piGrPi - tau * pi * residualPiTauSum(pi, y);
        double numerator = 1.0 + piGrPi * (2.0 + piGrPi);
        double denominator = 1.0 - pi * pi * residualPiPiSum(pi, y) + a * a / (tau * tau * gTauTau);
        return Math.sqrt(R * t * numerator / denominator);
    }

    /**
     * Newton iteration for T with h(p,T) = h from the start {@code t}.
     *
     * @throws IllegalStateException if not converged within {@code maxIterations}
     */
    double temperaturePH(double p, double h, double start, int maxIterations, double tolerance) {
        double pi = p / pStarPa;
        double t = start;
        for (int iteration = 0; iteration < maxIterations; iteration++) {
            double tau = tStarK / t;
            double y = tau - tauShift;
            double hCalc = R * tStarK * (idealTauSum(tau) + residualTauSum(pi, y));
            double cp = -R * tau * tau * (idealTauTauSum(tau) + residualTauTauSum(pi, y));
            double step = (h - hCalc) / cp;
            t += step;
            if (Math.abs(step) <= tolerance * t) {
                return t;
            }
        }
        throw notConverged("T(p,h)", "p = " + p + " Pa, h = " + h + " J/kg", maxIterations);
    }

    /**
     * Newton iteration for T with s(p,T) = s from the start {@code t}. With {@code logStep} the
     * step is taken in ln T (exact for an ideal gas of constant cp, which suits region 5).
     *
     * @throws IllegalStateException if not converged within {@code maxIterations}
     */
    double temperaturePS(double p, double s, double start, int maxIterations, double tolerance, boolean logStep) {
        double pi = p / pStarPa;
        double lnPi = Math.log(pi);
        double t = start;
        for (int iteration = 0; iteration < maxIterations; iteration++) {
            double tau = tStarK / t;
            double y = tau - tauShift;
            double gTau = idealTauSum(tau) + residualTauSum(pi, y);
            double g = lnPi + idealSum(tau) + residualSum(pi, y);
            double sCalc = R * (tau * gTau - g);
            double cp = -R * tau * tau * (idealTauTauSum(tau) + residualTauTauSum(pi, y));
            // ds/dT at constant p is cp/T, so ds/d(ln T) is cp.
            double relative = (s - sCalc) / cp;
            double next = logStep ? t * Math.exp(relative) : t * (1.0 + relative);
            double step = next - t;
            t = next;
            if (Math.abs(step) <= tolerance * t) {
                return t;
            }
        }
        throw notConverged("T(p,s)", "p = " + p + " Pa, s = " + s + " J/(kg·K)", maxIterations);
    }

    /**
     * Two-dimensional Newton iteration in (p, T) for h(p,T) = h and s(p,T) = s from the start
     * (p0, T0). The pressure step is taken in ln p, in which the entropy of a vapour is nearly
     * linear.
     *
     * @return p, Pa
     * @throws IllegalStateException if not converged within {@code maxIterations}
     */
    double pressureHS(double h, double s, double p0, double t0, int maxIterations, double tolerance) {
        double p = p0;
        double t = t0;
        for (int iteration = 0; iteration < maxIterations; iteration++) {
            double pi = p / pStarPa;
            double tau = tStarK / t;
            double y = tau - tauShift;
            double gTau = idealTauSum(tau) + residualTauSum(pi, y);
            double g = Math.log(pi) + idealSum(tau) + residualSum(pi, y);
            double piGrPi = pi * residualPiSum(pi, y);
            double piTauGrPiTau = pi * tau * residualPiTauSum(pi, y);
            double hCalc = R * tStarK * gTau;
            double sCalc = R * (tau * gTau - g);
            double cp = -R * tau * tau * (idealTauTauSum(tau) + residualTauTauSum(pi, y));
            // p·v = RT(1 + π γrπ) and p·(∂v/∂T)p = R(1 + π γrπ − τ π γrπτ): derivatives in ln p.
            double pv = R * t * (1.0 + piGrPi);
            double pDvdT = R * (1.0 + piGrPi - piTauGrPiTau);
            double dhdLnP = pv - t * pDvdT;
            double dhdT = cp;
            double dsdLnP = -pDvdT;
            double dsdT = cp / t;
            double rh = h - hCalc;
            double rs = s - sCalc;
            double det = dhdLnP * dsdT - dhdT * dsdLnP;
            double stepLnP = (rh * dsdT - dhdT * rs) / det;
            double stepT = (dhdLnP * rs - dsdLnP * rh) / det;
            p *= Math.exp(stepLnP);
            t += stepT;
            if (Math.abs(stepLnP) <= tolerance && Math.abs(stepT) <= tolerance * t) {
                return p;
            }
        }
        throw notConverged("p(h,s)", "h = " + h + " J/kg, s = " + s + " J/(kg·K)", maxIterations);
    }

    private IllegalStateException notConverged(String equation, String inputs, int maxIterations) {
        return new IllegalStateException(name + " " + equation + " did not converge in " + maxIterations
                + " Newton steps for " + inputs);
    }
}
