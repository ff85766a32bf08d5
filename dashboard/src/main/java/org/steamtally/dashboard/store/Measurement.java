package org.steamtally.dashboard.store;

import java.util.List;
import java.util.Objects;

/**
 * The store's schema: one measurement per kind of record, each with the tags {@code site},
 * {@code unit} and (except {@code cycle}) one id tag, and its fields in SI with the unit in the
 * name, as in the result record (docs/RESULTS.md). docs/STORE.md documents it for third-party
 * readers; the embedded store's tables mirror it column for column.
 *
 * <p>A point is identified by measurement, tags and its millisecond timestamp, so writing the same
 * point twice overwrites it: that is what makes replaying the spool free of duplicates.
 */
public enum Measurement {

    /** One point per state of the result record. */
    STATES("states", "state", 1,
            Field.number("p_Pa"), Field.number("T_K"), Field.number("h_J_per_kg"), Field.number("s_J_per_kgK"),
            Field.number("v_m3_per_kg"), Field.number("x"), Field.text("phase"), Field.number("saturation_margin_K"),
            Field.number("m_kg_per_s"), Field.flag("valid"), Field.text("reason")),

    /** One point per component. */
    COMPONENTS("components", "component", 2,
            Field.text("type"), Field.number("heat_in_W"), Field.number("work_out_W"),
            Field.number("isentropic_efficiency"), Field.number("exergy_destruction_W"), Field.flag("valid"),
            Field.text("reason")),

    /** One point per record: the cycle's figures of merit. No id tag. */
    CYCLE("cycle", null, 3,
            Field.number("heat_added_W"), Field.number("heat_rejected_W"), Field.number("turbine_work_W"),
            Field.number("pump_work_W"), Field.number("net_work_W"), Field.number("thermal_efficiency"),
            Field.number("back_work_ratio"), Field.number("heat_rate_kJ_per_kWh"), Field.number("carnot_efficiency"),
            Field.number("mean_temperature_carnot_efficiency")),

    /** One point per first-law check. */
    CLOSURE("closure", "closure", 4,
            Field.number("residual_W"), Field.number("sigma_W"), Field.number("z")),

    /**
     * Data reconciliation: one point per record without a sensor tag (empty id) carrying the global
     * test ({@code chi2, chi2_limit, redundancy, passed}) and one point per sensor carrying
     * {@code measured, reconciled, sigma_reconciled, test_value, suspect}.
     */
    RECONCILIATION("reconciliation", "sensor", 5,
            Field.number("chi2"), Field.number("chi2_limit"), Field.integer("redundancy"), Field.flag("passed"),
            Field.number("measured"), Field.number("reconciled"), Field.number("sigma_reconciled"),
            Field.number("test_value"), Field.flag("suspect")),

    /** Alarm state transitions, acknowledgements and shelving. */
    ALARMS("alarms", "alarm", 6,
            Field.text("kind"), Field.text("priority"), Field.text("old_state"), Field.text("new_state"),
            Field.flag("active"), Field.number("value"), Field.number("limit"), Field.text("user"),
            Field.text("note")),

    /** Raw readings after conversion to SI. */
    READINGS("readings", "sensor", 7,
            Field.number("value_si"), Field.text("quality")),

    /**
     * The window channel's verdict on the mean of the last snapshots, one point per record that has
     * one (docs/RESULTS.md, {@code window_reconciliation}). No id tag. {@code chi2_ratio} is χ² over
     * its quantile and {@code suspects} the ranked suspect ids joined by commas (absent when none).
     */
    WINDOW_RECONCILIATION("window_reconciliation", null, 8,
            Field.number("length_s"), Field.integer("samples"), Field.text("status"), Field.flag("passed"),
            Field.number("chi2"), Field.number("chi2_limit"), Field.number("chi2_ratio"), Field.integer("redundancy"),
            Field.text("suspects"));

    /** The type a field has in every point of its measurement. */
    public enum FieldType {
        /** IEEE 754 double, always finite. */
        DOUBLE,
        /** 64-bit integer. */
        LONG,
        BOOLEAN,
        STRING
    }

    /** One field of a measurement: its name (with unit) and type. */
    public record Field(String name, FieldType type) {
        public Field {
            Objects.requireNonNull(name, "name");
            Objects.requireNonNull(type, "type");
        }

        static Field number(String name) {
            return new Field(name, FieldType.DOUBLE);
        }

        static Field integer(String name) {
            return new Field(name, FieldType.LONG);
        }

        static Field flag(String name) {
            return new Field(name, FieldType.BOOLEAN);
        }

        static Field text(String name) {
            return new Field(name, FieldType.STRING);
        }
    }

    /** Tag (and column) naming the site. */
    public static final String SITE_TAG = "site";
    /** Tag (and column) naming the unit. */
    public static final String UNIT_TAG = "unit";

    private final String measurementName;
    private final String idTag;
    private final byte code;
    private final List<Field> fields;

    Measurement(String name, String idTag, int code, Field... fields) {
        this.measurementName = name;
        this.idTag = idTag;
        this.code = (byte) code;
        this.fields = List.of(fields);
    }

    /** The measurement's name in InfluxDB and the table's name in the embedded store. */
    public String measurementName() {
        return measurementName;
    }

    /** The id tag ({@code state}, {@code component}, ...), or {@code null} for {@code cycle}. */
    public String idTag() {
        return idTag;
    }

    /** Whether points of this measurement carry an id tag. */
    public boolean hasIdTag() {
        return idTag != null;
    }

    /** The fields, in a fixed order that {@link Point#values()} follows. */
    public List<Field> fields() {
        return fields;
    }

    /** Index of the named field in {@link #fields()}. */
    public int fieldIndex(String fieldName) {
        for (int i = 0; i < fields.size(); i++) {
            if (fields.get(i).name().equals(fieldName)) {
                return i;
            }
        }
        throw new IllegalArgumentException("measurement " + measurementName + " has no field '" + fieldName
                + "'; its fields are " + fields.stream().map(Field::name).toList());
    }

    /** A stable one-byte code for the journal, independent of declaration order. */
    byte code() {
        return code;
    }

    static Measurement ofCode(byte code) {
        for (Measurement m : values()) {
            if (m.code == code) {
                return m;
            }
        }
        throw new IllegalArgumentException("unknown measurement code " + code + " in the journal");
    }

    /** The measurement with this name. */
    public static Measurement named(String name) {
        for (Measurement m : values()) {
            if (m.measurementName.equals(name)) {
                return m;
            }
        }
        throw new IllegalArgumentException("unknown measurement '" + name + "'; expected one of states, components,"
                + " cycle, closure, reconciliation, alarms, readings, window_reconciliation");
    }
}
