package org.steamtally.dashboard.store;

import org.steamtally.dashboard.store.Measurement.Field;

/**
 * Points as InfluxDB line protocol with millisecond timestamps: {@code measurement,tags fields ts}.
 * Escaping per the InfluxDB 1.x line-protocol reference: commas and spaces in the measurement;
 * commas, equals signs and spaces in tag keys and values and field keys; double quotes and
 * backslashes in string field values. Empty tag values and empty fields are left out (the protocol
 * has no empty tag and no null field). Doubles are written by {@link Double#toString}, which reads
 * back to the same double.
 */
final class LineProtocol {

    private LineProtocol() {
    }

    /** The line of one point, or {@code null} when it has no field to carry. */
    static String line(Point p) {
        if (p.isEmpty()) {
            return null;
        }
        Measurement m = p.measurement();
        StringBuilder b = new StringBuilder(256);
        escape(b, m.measurementName(), false);
        b.append(',').append(Measurement.SITE_TAG).append('=');
        escape(b, p.site(), true);
        b.append(',').append(Measurement.UNIT_TAG).append('=');
        escape(b, p.unit(), true);
        if (m.hasIdTag() && !p.id().isEmpty()) {
            // The server sorts tags itself; their order here does not matter.
            b.append(',').append(m.idTag()).append('=');
            escape(b, p.id(), true);
        }
        b.append(' ');
        boolean first = true;
        for (int i = 0; i < m.fields().size(); i++) {
            Object v = p.value(i);
            if (v == null) {
                continue;
            }
            if (!first) {
                b.append(',');
            }
            first = false;
            Field f = m.fields().get(i);
            escape(b, f.name(), true);
            b.append('=');
            switch (f.type()) {
                case DOUBLE -> b.append(((Double) v).doubleValue());
                case LONG -> b.append(((Long) v).longValue()).append('i');
                case BOOLEAN -> b.append(((Boolean) v) ? "true" : "false");
                case STRING -> {
                    b.append('"');
                    String s = (String) v;
                    for (int k = 0; k < s.length(); k++) {
                        char c = s.charAt(k);
                        if (c == '"' || c == '\\') {
                            b.append('\\');
                        }
                        b.append(c);
                    }
                    b.append('"');
                }
            }
        }
        b.append(' ').append(p.timestampMs());
        return b.toString();
    }

    private static void escape(StringBuilder b, String s, boolean equalsToo) {
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c == ',' || c == ' ' || (equalsToo && c == '=')) {
                b.append('\\');
            }
            b.append(c);
        }
    }
}
