package org.steamtally.dashboard.json;

import java.util.List;

/**
 * The field names of the result record, in the order they are written. Each name carries its SI unit
 * ({@code _Pa}, {@code _K}, {@code _J_per_kg}, {@code _W}); names without a unit are dimensionless.
 * docs/RESULTS.md describes every field.
 */
public final class ResultFields {

    public static final String TS = "ts";
    public static final String SITE = "site";
    public static final String UNIT = "unit";
    public static final String STATES = "states";
    public static final String COMPONENTS = "components";
    public static final String CYCLE = "cycle";
    public static final String CLOSURE = "closure";
    /** After {@code closure}: which values {@code states}, {@code components} and {@code cycle} come from. */
    public static final String METRICS_BASIS = "metrics_basis";
    /** After {@code metrics_basis}: the cycle's figures from the values as measured, fields as {@code cycle}. */
    public static final String CYCLE_RAW = "cycle_raw";
    public static final String RECONCILIATION = "reconciliation";
    public static final String SUSPECTS = "suspects";

    public static final String ID = "id";
    public static final String TYPE = "type";
    public static final String VALID = "valid";
    public static final String REASON = "reason";
    public static final String PHASE = "phase";

    /** Numeric fields of each entry of {@code states}, before {@code phase}. */
    public static final List<String> STATE_NUMBERS = List.of(
            "p_Pa", "T_K", "h_J_per_kg", "s_J_per_kgK", "v_m3_per_kg", "x");

    /** Numeric field of each state after {@code phase}. */
    public static final String SATURATION_MARGIN = "saturation_margin_K";

    /** Numeric field of each state after {@code saturation_margin_K}: the stream's mass flow. */
    public static final String MASS_FLOW = "m_kg_per_s";

    /** Numeric fields of each entry of {@code components}. */
    public static final List<String> COMPONENT_NUMBERS = List.of(
            "heat_in_W", "work_out_W", "isentropic_efficiency", "exergy_destruction_W");

    /** Fields of the {@code cycle} object. */
    public static final List<String> CYCLE_NUMBERS = List.of(
            "heat_added_W", "heat_rejected_W", "turbine_work_W", "pump_work_W", "net_work_W",
            "thermal_efficiency", "back_work_ratio", "heat_rate_kJ_per_kWh", "carnot_efficiency",
            "mean_temperature_carnot_efficiency");

    /** Numeric fields of each entry of {@code closure}. */
    public static final List<String> CLOSURE_NUMBERS = List.of("residual_W", "sigma_W", "z");

    /** Fields of the {@code reconciliation} object, in order; the last two are arrays. */
    public static final String STATUS = "status";
    public static final String PASSED = "passed";
    public static final String CHI2 = "chi2";
    public static final String CHI2_LIMIT = "chi2_limit";
    public static final String REDUNDANCY = "redundancy";
    public static final String CONFIDENCE = "confidence";
    public static final String TEST_LIMIT = "test_limit";
    public static final String ITERATIONS = "iterations";
    public static final String SENSORS = "sensors";
    public static final String UNMEASURED = "unmeasured";

    /** Fields of each entry of {@code reconciliation.sensors}, in order. */
    public static final String KIND = "kind";
    public static final String UNIT_NAME = "unit";
    public static final List<String> SENSOR_NUMBERS = List.of(
            "measured", "sigma_measured", "reconciled", "sigma_reconciled", "test_value");
    public static final String SUSPECT = "suspect";

    /** Fields of each entry of {@code reconciliation.unmeasured}: id, unit, these, observable. */
    public static final List<String> UNMEASURED_NUMBERS = List.of("reconciled", "sigma_reconciled");
    public static final String OBSERVABLE = "observable";

    /** Fields of each entry of {@code suspects}, in order. */
    public static final String RANK = "rank";
    public static final String EQUIVALENCE_SET = "equivalence_set";
    public static final String TEST_VALUE = "test_value";
    public static final List<String> SUSPECT_NUMBERS = List.of("bias", "sigma_bias");
    public static final String CONFIRMED = "confirmed";

    /**
     * The window channel's verdict, absent when no window channel ran; its fields in order, then
     * {@link #REASON} when the verdict was withheld.
     */
    public static final String WINDOW_RECONCILIATION = "window_reconciliation";
    public static final String LENGTH_S = "length_s";
    public static final String LENGTH = "length";
    public static final String SAMPLES = "samples";

    private ResultFields() {
    }
}
