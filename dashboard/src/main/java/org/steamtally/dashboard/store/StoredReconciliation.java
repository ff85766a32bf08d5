package org.steamtally.dashboard.store;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.cycle.UnitResult;

/**
 * The data-reconciliation part of one result record (VDI 2048) as the store keeps it, measurement
 * {@code reconciliation}: the global test and one entry per reconciled sensor. The result record's
 * {@code reconciliation} object maps to this one to one.
 *
 * @param chi2       the quality criterion: the weighted sum of squared corrections, dimensionless
 * @param chi2Limit  the χ² quantile it is compared with at the chosen confidence
 * @param redundancy degrees of freedom of the test (number of independent constraints), ≥ 0
 * @param passed     whether {@code chi2 ≤ chi2Limit}
 */
public record StoredReconciliation(Instant timestamp, String site, String unit, double chi2, double chi2Limit,
        long redundancy, boolean passed, List<Sensor> sensors) {

    /**
     * One reconciled sensor. Values in the SI unit of the sensor's quantity.
     *
     * @param measured        the measured value
     * @param reconciled      the reconciled value
     * @param sigmaReconciled standard uncertainty of the reconciled value, &gt; 0
     * @param testValue       the individual test value |v| / σ_v of its correction, ≥ 0
     * @param suspect         whether the test flags the sensor as suspect
     */
    public record Sensor(String id, double measured, double reconciled, double sigmaReconciled, double testValue,
            boolean suspect) {
        public Sensor {
            Objects.requireNonNull(id, "id");
            if (id.isEmpty()) {
                throw new IllegalArgumentException("reconciled sensor: the id must not be empty");
            }
            finite(measured, "measured", id);
            finite(reconciled, "reconciled", id);
            finite(sigmaReconciled, "sigma_reconciled", id);
            finite(testValue, "test_value", id);
        }
    }

    public StoredReconciliation {
        Objects.requireNonNull(timestamp, "timestamp");
        Objects.requireNonNull(site, "site");
        Objects.requireNonNull(unit, "unit");
        finite(chi2, "chi2", "reconciliation");
        finite(chi2Limit, "chi2_limit", "reconciliation");
        if (redundancy < 0) {
            throw new IllegalArgumentException("reconciliation: redundancy " + redundancy + " must be ≥ 0");
        }
        sensors = List.copyOf(sensors);
        timestamp = Instant.ofEpochMilli(timestamp.toEpochMilli());
    }

    /**
     * The reconciliation of a result record as the store keeps it, when the global test was made
     * (status {@code passed} or {@code failed}); empty otherwise, since a reconciliation that did not
     * run, found nothing to check or did not converge has no χ² to keep. Of the sensors, those with a
     * measured and a reconciled value, its uncertainty and an individual test value, all finite, are
     * kept: a quantity without a test value is not redundant, so its reconciled value is its measured
     * one. This is the one mapping: {@link ResultStore#writeResult} stores it with the record, at
     * the same identity a second writer would overwrite.
     */
    public static Optional<StoredReconciliation> of(UnitResult r) {
        ReconciliationResult rec = r.reconciliation();
        boolean tested = ReconciliationResult.PASSED.equals(rec.status())
                || ReconciliationResult.FAILED.equals(rec.status());
        if (!tested || rec.chi2Limit().isEmpty() || !Double.isFinite(rec.chi2())
                || !Double.isFinite(rec.chi2Limit().getAsDouble())) {
            return Optional.empty();
        }
        List<Sensor> sensors = new java.util.ArrayList<>(rec.sensors().size());
        for (ReconciledSensor s : rec.sensors()) {
            if (kept(s)) {
                sensors.add(new Sensor(s.id(), s.measured().getAsDouble(), s.reconciled().getAsDouble(),
                        s.sigmaReconciled().getAsDouble(), s.testValue().getAsDouble(), s.suspect()));
            }
        }
        return Optional.of(new StoredReconciliation(r.timestamp(), r.site(), r.unit(), rec.chi2(),
                rec.chi2Limit().getAsDouble(), rec.redundancy(), rec.passed(), sensors));
    }

    private static boolean kept(ReconciledSensor s) {
        return s.measured().isPresent() && Double.isFinite(s.measured().getAsDouble())
                && s.reconciled().isPresent() && Double.isFinite(s.reconciled().getAsDouble())
                && s.sigmaReconciled().isPresent() && Double.isFinite(s.sigmaReconciled().getAsDouble())
                && s.testValue().isPresent() && Double.isFinite(s.testValue().getAsDouble());
    }

    private static void finite(double v, String name, String where) {
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException(where + ": " + name + " " + v + " must be finite");
        }
    }
}
