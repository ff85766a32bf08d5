package org.steamtally.dashboard.store;

import java.util.List;
import java.util.Objects;

/**
 * Names numeric series of one measurement of one unit: e.g. the pressure of state {@code main_steam}
 * is {@code new SeriesRef(STATES, site, unit, "main_steam", List.of("p_Pa"))}.
 *
 * @param id     the id tag's value; empty for {@code cycle} and for the whole-unit reconciliation point
 * @param fields numeric fields (double or integer) of the measurement, at least one
 */
public record SeriesRef(Measurement measurement, String site, String unit, String id, List<String> fields) {

    public SeriesRef {
        Objects.requireNonNull(measurement, "measurement");
        Objects.requireNonNull(site, "site");
        Objects.requireNonNull(unit, "unit");
        id = id == null ? "" : id;
        fields = List.copyOf(fields);
        if (fields.isEmpty()) {
            throw new IllegalArgumentException("a series names at least one field");
        }
        for (String f : fields) {
            Measurement.FieldType type = measurement.fields().get(measurement.fieldIndex(f)).type();
            if (type != Measurement.FieldType.DOUBLE && type != Measurement.FieldType.LONG) {
                throw new IllegalArgumentException(measurement.measurementName() + "." + f + " is " + type
                        + ", not a number; only numeric fields can be downsampled");
            }
        }
    }

    /** One field of the cycle, e.g. {@code thermal_efficiency}. */
    public static SeriesRef cycle(String site, String unit, String... fields) {
        return new SeriesRef(Measurement.CYCLE, site, unit, "", List.of(fields));
    }

    /** Fields of one state, component, closure or sensor. */
    public static SeriesRef of(Measurement m, String site, String unit, String id, String... fields) {
        return new SeriesRef(m, site, unit, id, List.of(fields));
    }
}
