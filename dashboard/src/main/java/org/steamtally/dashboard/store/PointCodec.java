package org.steamtally.dashboard.store;

import java.io.ByteArrayOutputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.BufferUnderflowException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.steamtally.dashboard.store.Measurement.Field;

/**
 * The journal's binary form of one point: a format version, the measurement's code, site, unit, id,
 * the timestamp and one typed value per field. Strings are UTF-8 with an int length; a null value is
 * a type byte of 0. Big-endian throughout.
 */
final class PointCodec {

    static final byte VERSION = 1;

    private static final byte NULL = 0;
    private static final byte DOUBLE = 1;
    private static final byte LONG = 2;
    private static final byte TRUE = 3;
    private static final byte FALSE = 4;
    private static final byte STRING = 5;

    private PointCodec() {
    }

    static byte[] encode(Point p) {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream(256);
        try (DataOutputStream out = new DataOutputStream(bytes)) {
            out.writeByte(VERSION);
            out.writeByte(p.measurement().code());
            string(out, p.site());
            string(out, p.unit());
            string(out, p.id());
            out.writeLong(p.timestampMs());
            List<Field> fields = p.measurement().fields();
            out.writeByte(fields.size());
            for (int i = 0; i < fields.size(); i++) {
                Object v = p.value(i);
                if (v == null) {
                    out.writeByte(NULL);
                } else if (v instanceof Double d) {
                    out.writeByte(DOUBLE);
                    out.writeDouble(d);
                } else if (v instanceof Long l) {
                    out.writeByte(LONG);
                    out.writeLong(l);
                } else if (v instanceof Boolean b) {
                    out.writeByte(b ? TRUE : FALSE);
                } else {
                    out.writeByte(STRING);
                    string(out, (String) v);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("a ByteArrayOutputStream does not fail", e);
        }
        return bytes.toByteArray();
    }

    /**
     * @throws IllegalArgumentException when the bytes are not a point of this version
     */
    static Point decode(byte[] payload) {
        ByteBuffer in = ByteBuffer.wrap(payload);
        try {
            byte version = in.get();
            if (version != VERSION) {
                throw new IllegalArgumentException("journal record of format version " + version + ", expected "
                        + VERSION);
            }
            Measurement m = Measurement.ofCode(in.get());
            String site = string(in);
            String unit = string(in);
            String id = string(in);
            long ts = in.getLong();
            int n = in.get();
            if (n != m.fields().size()) {
                throw new IllegalArgumentException("journal record of " + m.measurementName() + " has " + n
                        + " fields, expected " + m.fields().size());
            }
            Object[] values = new Object[n];
            for (int i = 0; i < n; i++) {
                byte type = in.get();
                values[i] = switch (type) {
                    case NULL -> null;
                    case DOUBLE -> in.getDouble();
                    case LONG -> in.getLong();
                    case TRUE -> Boolean.TRUE;
                    case FALSE -> Boolean.FALSE;
                    case STRING -> string(in);
                    default -> throw new IllegalArgumentException("unknown value type " + type + " in journal record");
                };
            }
            if (in.hasRemaining()) {
                throw new IllegalArgumentException(in.remaining() + " trailing bytes in journal record");
            }
            return new Point(m, site, unit, id, ts, values);
        } catch (BufferUnderflowException e) {
            throw new IllegalArgumentException("journal record ends early (" + payload.length + " bytes)", e);
        }
    }

    private static void string(DataOutputStream out, String s) throws IOException {
        byte[] b = s.getBytes(StandardCharsets.UTF_8);
        out.writeInt(b.length);
        out.write(b);
    }

    private static String string(ByteBuffer in) {
        int n = in.getInt();
        if (n < 0 || n > in.remaining()) {
            throw new IllegalArgumentException("string length " + n + " exceeds the journal record");
        }
        byte[] b = new byte[n];
        in.get(b);
        return new String(b, StandardCharsets.UTF_8);
    }
}
