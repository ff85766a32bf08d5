package org.steamtally.calc.reconcile;

import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;

/**
 * How large an error in each sensor the reconciliation's individual test can find: Baarda's
 * reliability theory (W. Baarda, <i>A testing procedure for use in geodetic networks</i>,
 * Netherlands Geodetic Commission, Publications on Geodesy 2(5), Delft 1968; recalled from memory),
 * in the terms VDI 2048-1 uses for the same quantities.
 *
 * <ul>
 *   <li><b>Redundancy number</b> r_i = σ²(v_i) / u_i² = P_ii, the share of the sensor's own variance
 *       that shows in its adjustment (0 for a just-determined sensor, 1 for one the others fix
 *       exactly); r = ρ², ρ the checked share σ(v_i) / u_i. The r_i sum to the redundancy degree.</li>
 *   <li>A bias b on sensor i shifts its adjustment by r_i b, so its test value |v_i| / σ(v_i) has the
 *       mean √r_i · b / u_i. The test, at its limit z_α (two-sided, level α), finds the bias with
 *       probability 1 − β when that mean reaches δ₀ = z_{1−α/2} + z_{1−β}.</li>
 *   <li><b>Minimum detectable bias</b> MDB_i = u_i · δ₀ / √r_i for one snapshot; for the mean of n
 *       independent readings, with the uncertainties of a mean u_i/√n and the redundancy number r_i,n
 *       of that reconciliation (the declared constants do not average, so r_i,n may be smaller than
 *       r_i): MDB_i,n = (u_i / √n) · δ₀ / √r_i,n.</li>
 * </ul>
 *
 * <p>With the per-snapshot test (α = 0.05, β = 0.2) δ₀ = 1.96 + 0.84 = 2.80; with the window-mean
 * suspect limit 4.0 and β = 0.05, δ₀ = 4.0 + 1.645 = 5.65, the threshold docs/DETECTION.md uses
 * for a sensor whose 3σ bias is found within a minute.
 */
public final class Reliability {

    /** Baarda's δ₀ of the per-snapshot individual test: α = 0.05 two-sided, power 0.8. */
    public static final double DELTA0_SNAPSHOT = delta0(0.05, 0.20);
    /** Window length the daemon's window-mean channel uses, snapshots. */
    public static final int WINDOW = 50;
    /**
     * δ₀ of the window-mean suspect test: its limit 4.0 plus z_{0.95} = 1.645 for a power of 0.95.
     * A bias of k σ is found within one full window when k ≥ MDB_n / u.
     */
    public static final double DELTA0_WINDOW = 4.0 + ChiSquare.normalTwoSided(1.0 - 2 * 0.05);
    /** The error size the detection target is stated for, in standard uncertainties. */
    public static final double TARGET_BIAS_SIGMAS = 3.0;

    private Reliability() {
    }

    /**
     * The reliability figures of one measured sensor.
     *
     * @param id                  sensor id
     * @param redundancyNumber    r = σ²(v)/u² of one snapshot, 0..1
     * @param windowRedundancy    r of a window mean of {@link #WINDOW} readings, 0..1
     * @param mdbSnapshotSi       minimum detectable bias in one snapshot, SI; infinite when r = 0
     * @param mdbWindowSi         minimum detectable bias of the window mean, SI; infinite when r = 0
     * @param sigmaSi             the sensor's standard uncertainty, SI
     */
    public record SensorReliability(String id, double redundancyNumber, double windowRedundancy, double mdbSnapshotSi,
                                    double mdbWindowSi, double sigmaSi) {
        public SensorReliability {
            Objects.requireNonNull(id, "id");
            if (!(redundancyNumber >= 0.0 && redundancyNumber <= 1.0)
                    || !(windowRedundancy >= 0.0 && windowRedundancy <= 1.0)) {
                throw new IllegalArgumentException("sensor " + id + ": redundancy numbers must lie in 0..1, were "
                        + redundancyNumber + " and " + windowRedundancy);
            }
        }

        /** Whether a {@link #TARGET_BIAS_SIGMAS} σ bias is found by the window-mean test within a minute. */
        public boolean checkedAtTargetWithinWindow() {
            return mdbWindowSi <= TARGET_BIAS_SIGMAS * sigmaSi;
        }

        /** MDB of the window mean in the sensor's own standard uncertainties. */
        public double mdbWindowSigmas() {
            return mdbWindowSi / sigmaSi;
        }

        /** MDB of one snapshot in the sensor's own standard uncertainties. */
        public double mdbSnapshotSigmas() {
            return mdbSnapshotSi / sigmaSi;
        }
    }

    /**
     * Baarda's non-centrality δ₀ = z_{1−α/2} + z_{1−β}: the mean test value at which a two-sided test
     * of level α finds a bias with probability 1 − β. E.g. 4.13 for α = 0.001, β = 0.2 (Baarda's own
     * choice, recalled from memory), 2.80 for α = 0.05, β = 0.2.
     */
    public static double delta0(double alpha, double beta) {
        if (!(alpha > 0.0 && alpha < 1.0) || !(beta > 0.0 && beta < 0.5)) {
            throw new IllegalArgumentException("alpha must lie in (0, 1) and beta in (0, 0.5), were " + alpha + " and "
                    + beta);
        }
        return ChiSquare.normalTwoSided(1.0 - alpha) + ChiSquare.normalTwoSided(1.0 - 2.0 * beta);
    }

    /**
     * Minimum detectable bias σ δ₀ / (√n √r), SI; {@code +∞} when r is 0 (no check possible).
     *
     * @param sigmaSi standard uncertainty of one reading, SI, &gt; 0
     * @param r       redundancy number of the reconciliation the test runs in (of the mean for n &gt; 1)
     * @param n       readings averaged, ≥ 1
     * @param delta0  the test's δ₀
     */
    public static double minimumDetectableBias(double sigmaSi, double r, int n, double delta0) {
        if (!(sigmaSi > 0.0) || !(r >= 0.0 && r <= 1.0) || n < 1 || !(delta0 > 0.0)) {
            throw new IllegalArgumentException("need sigma > 0, r in 0..1, n >= 1, delta0 > 0; were " + sigmaSi + ", "
                    + r + ", " + n + ", " + delta0);
        }
        if (r == 0.0) {
            return Double.POSITIVE_INFINITY;
        }
        return sigmaSi * delta0 / (Math.sqrt(n) * Math.sqrt(r));
    }

    /** r = 1 − (u(x̂)/u)² from a reconciled sensor; 0 when it was not reconciled or not redundant. */
    public static double redundancyNumber(ReconciledSensor s) {
        if (!"redundant".equals(s.redundancy()) || s.sigmaMeasured().isEmpty() || s.sigmaReconciled().isEmpty()) {
            return 0.0;
        }
        double q = s.sigmaReconciled().getAsDouble() / s.sigmaMeasured().getAsDouble();
        return Math.max(0.0, Math.min(1.0, 1.0 - q * q));
    }

    /**
     * The reliability of every sensor the balances use, at one operating point: reconciles the
     * values once as a snapshot and once as a mean of {@link #WINDOW} readings. The values should
     * close the balances (a design point); only the linearisation is taken from them.
     *
     * @param unit     the unit
     * @param valuesSi one value per sensor of the unit, in its order, SI
     * @return one entry per sensor the reconciliation reports, in its order (declared constants left out)
     */
    public static List<SensorReliability> of(UnitDescription unit, double[] valuesSi) {
        Snapshot snapshot = Snapshot.allGood(Instant.EPOCH, unit.id(), valuesSi);
        List<ReconciledSensor> one = Reconciler.compile(unit).reconcile(snapshot).result().sensors();
        List<ReconciledSensor> window = Reconciler.compile(WindowMeanEvaluator.meanUncertainties(unit, WINDOW))
                .reconcile(snapshot).result().sensors();
        Map<String, ReconciledSensor> windowById = new HashMap<>();
        window.forEach(s -> windowById.put(s.id(), s));
        Map<String, Sensor> sensors = unit.sensorsById();
        List<SensorReliability> out = new ArrayList<>();
        for (ReconciledSensor s : one) {
            Sensor sensor = sensors.get(s.id());
            if (sensor == null) {
                continue;
            }
            double r = redundancyNumber(s);
            ReconciledSensor w = windowById.get(s.id());
            double rw = w == null ? 0.0 : redundancyNumber(w);
            double u = sensor.standardUncertaintySi();
            out.add(new SensorReliability(s.id(), r, rw, minimumDetectableBias(u, r, 1, DELTA0_SNAPSHOT),
                    minimumDetectableBias(u, rw, WINDOW, DELTA0_WINDOW), u));
        }
        return out;
    }
}
