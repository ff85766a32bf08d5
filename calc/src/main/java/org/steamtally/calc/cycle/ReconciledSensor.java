package org.steamtally.calc.cycle;

import java.util.Objects;
import java.util.OptionalDouble;

/**
 * One measured quantity of a reconciliation: a sensor used by the balances, or a declared constant
 * with an uncertainty (an efficiency, a heating value) taken as a quasi-measurement. Values in SI,
 * in the unit {@link #unit}.
 *
 * <p>JSON (result record, {@code reconciliation.sensors[]}): {@code id, kind, unit, measured,
 * sigma_measured, reconciled, sigma_reconciled, test_value, redundancy, suspect}.
 *
 * @param id              the sensor's tag, or {@code <component>.<constant>} for a constant, e.g.
 *                        {@code generator.efficiency}
 * @param kind            {@code sensor} or {@code constant}
 * @param unit            SI unit of the values, e.g. {@code Pa}; {@code 1} for a fraction
 * @param measured        the value as measured (declared, for a constant); empty when the sensor
 *                        had no usable value
 * @param sigmaMeasured   its standard uncertainty u(x)
 * @param reconciled      the reconciled value; empty when reconciliation did not run to the end
 * @param sigmaReconciled the reconciled value's standard uncertainty, ≤ u(x)
 * @param testValue       individual test |v| / σ(v) (VDI 2048-1 individual test), empty for a quantity
 *                        that is not redundant
 * @param redundancy      {@code redundant}, {@code just_determined} (no check possible) or
 *                        {@code excluded} (no usable value in this snapshot)
 * @param suspect         true when named by gross-error identification, alone or in an equivalence set
 */
public record ReconciledSensor(
        String id,
        String kind,
        String unit,
        OptionalDouble measured,
        OptionalDouble sigmaMeasured,
        OptionalDouble reconciled,
        OptionalDouble sigmaReconciled,
        OptionalDouble testValue,
        String redundancy,
        boolean suspect) {

    public ReconciledSensor {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(redundancy, "redundancy");
        for (OptionalDouble v : new OptionalDouble[] {measured, sigmaMeasured, reconciled, sigmaReconciled, testValue}) {
            if (v.isPresent() && !Double.isFinite(v.getAsDouble())) {
                throw new IllegalArgumentException("reconciled sensor " + id + ": values must be finite, was "
                        + v.getAsDouble());
            }
        }
    }
}
