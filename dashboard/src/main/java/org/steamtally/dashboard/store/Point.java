package org.steamtally.dashboard.store;

import java.util.Arrays;
import java.util.Objects;
import org.steamtally.dashboard.store.Measurement.Field;

/**
 * One point of the store: a measurement, its tags (site, unit and the id, empty for measurements
 * without an id tag and for the whole-unit reconciliation point), a timestamp in milliseconds since
 * the epoch (UTC), and one value per field of the measurement, {@code null} where empty.
 *
 * <p>Identity is (measurement, site, unit, id, timestampMs): two points with the same identity are
 * the same point, and the later write wins.
 */
public final class Point {

    private final Measurement measurement;
    private final String site;
    private final String unit;
    private final String id;
    private final long timestampMs;
    private final Object[] values;

    /**
     * @param values one per field of {@code measurement}, in its order: {@link Double} (finite),
     *               {@link Long}, {@link Boolean}, {@link String} by field type, or {@code null}
     * @throws IllegalArgumentException naming the field when a value has the wrong type or is not finite
     */
    public Point(Measurement measurement, String site, String unit, String id, long timestampMs, Object... values) {
        this.measurement = Objects.requireNonNull(measurement, "measurement");
        this.site = requireTag(site, "site");
        this.unit = requireTag(unit, "unit");
        this.id = id == null ? "" : id;
        if (!measurement.hasIdTag() && !this.id.isEmpty()) {
            throw new IllegalArgumentException("measurement " + measurement.measurementName() + " has no id tag, got '"
                    + id + "'");
        }
        this.timestampMs = timestampMs;
        if (values.length != measurement.fields().size()) {
            throw new IllegalArgumentException("measurement " + measurement.measurementName() + " has "
                    + measurement.fields().size() + " fields, got " + values.length + " values");
        }
        this.values = values.clone();
        for (int i = 0; i < values.length; i++) {
            check(measurement.fields().get(i), values[i]);
        }
    }

    private static String requireTag(String value, String name) {
        Objects.requireNonNull(value, name);
        if (value.isEmpty()) {
            throw new IllegalArgumentException("tag " + name + " must not be empty");
        }
        return value;
    }

    private void check(Field field, Object value) {
        if (value == null) {
            return;
        }
        boolean ok = switch (field.type()) {
            case DOUBLE -> value instanceof Double d && Double.isFinite(d);
            case LONG -> value instanceof Long;
            case BOOLEAN -> value instanceof Boolean;
            case STRING -> value instanceof String;
        };
        if (!ok) {
            throw new IllegalArgumentException(measurement.measurementName() + "." + field.name() + " of " + site + "/"
                    + unit + "/" + id + ": expected a " + (field.type() == Measurement.FieldType.DOUBLE ? "finite " : "")
                    + field.type().name().toLowerCase(java.util.Locale.ROOT) + ", got " + value + " ("
                    + value.getClass().getSimpleName() + ")");
        }
    }

    public Measurement measurement() {
        return measurement;
    }

    public String site() {
        return site;
    }

    public String unit() {
        return unit;
    }

    /** The id tag's value; empty when the point has none. */
    public String id() {
        return id;
    }

    /** Milliseconds since 1970-01-01T00:00Z. */
    public long timestampMs() {
        return timestampMs;
    }

    /** The value of field {@code index}, or {@code null}. */
    public Object value(int index) {
        return values[index];
    }

    /** The value of the named field, or {@code null}. */
    public Object value(String fieldName) {
        return values[measurement.fieldIndex(fieldName)];
    }

    /** A copy of the values, one per field. */
    public Object[] values() {
        return values.clone();
    }

    /** Whether every field is empty (such a point carries nothing and is not stored). */
    public boolean isEmpty() {
        for (Object v : values) {
            if (v != null) {
                return false;
            }
        }
        return true;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Point p && measurement == p.measurement && timestampMs == p.timestampMs
                && site.equals(p.site) && unit.equals(p.unit) && id.equals(p.id) && Arrays.equals(values, p.values);
    }

    @Override
    public int hashCode() {
        return Objects.hash(measurement, site, unit, id, timestampMs);
    }

    @Override
    public String toString() {
        StringBuilder b = new StringBuilder(measurement.measurementName()).append('{').append(site).append('/')
                .append(unit);
        if (!id.isEmpty()) {
            b.append('/').append(id);
        }
        b.append(" @").append(timestampMs);
        for (int i = 0; i < values.length; i++) {
            b.append(' ').append(measurement.fields().get(i).name()).append('=').append(values[i]);
        }
        return b.append('}').toString();
    }
}
