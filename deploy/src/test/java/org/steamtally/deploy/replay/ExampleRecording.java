package org.steamtally.deploy.replay;

import java.math.BigDecimal;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Writes an {@link ExampleOperatingPoint} as the messages its instruments would publish over a few
 * seconds, one JSON object a line ({@code topic}, {@code ts}, {@code value}, {@code unit},
 * {@code quality}), with the small disorder of a real recording, each kind once:
 * <ul>
 *   <li>every sensor publishes once a second, staggered by 11 ms from the one before;</li>
 *   <li>at second 1 one message is sent twice (a publisher retry);</li>
 *   <li>the first sensor sends its odd seconds in a second unit ({@code bar} for {@code MPa},
 *       {@code barg} for {@code psig}), converted here;</li>
 *   <li>at second 2 the second sensor's message arrives after all of second 3's (late, within
 *       replay's default 2 s lateness);</li>
 *   <li>at second 3 one line is cut short (a recorder restart), which replay reports and skips.</li>
 * </ul>
 * The values carry ten significant digits, enough to keep every figure within 1e-8 of the hand
 * computation. None of the disorder changes a value, so every snapshot is the same operating point.
 */
final class ExampleRecording {

    /** 2025-12-02T00:00:00Z: the recording's first second. */
    static final long START_MILLIS = 1_764_633_600_000L;
    static final int SECONDS = 5;
    /**
     * Snapshots replay makes of it: one at each whole second after the first readings, up to the
     * last reading (the first sensor publishes 5 ms into the second, so second 0 has none).
     */
    static final int SNAPSHOTS = SECONDS - 1;
    /** Sensor publishing offsets: the first sensor 5 ms into each second, the next 11 ms later. */
    private static final int FIRST_OFFSET_MS = 5;
    private static final int STAGGER_MS = 11;

    /** NIST SP 811 (2008), B.8: psi → Pa, exact from lb, g_n and in. */
    private static final double PSI_PA = 0.45359237 * 9.80665 / (0.0254 * 0.0254);

    private ExampleRecording() {
    }

    /** The recording as JSON Lines text. */
    static String of(ExampleOperatingPoint point) {
        List<String> ids = new ArrayList<>(point.readings().keySet());
        StringBuilder out = new StringBuilder();
        String late = null;
        for (int second = 0; second < SECONDS; second++) {
            for (int i = 0; i < ids.size(); i++) {
                String id = ids.get(i);
                long ts = START_MILLIS + 1000L * second + FIRST_OFFSET_MS + (long) STAGGER_MS * i;
                String line = line(point, id, ts, i == 0 && second % 2 == 1);
                if (second == 2 && i == 1) {
                    late = line;
                    continue;
                }
                out.append(line).append('\n');
                if (second == 1 && i == 2) {
                    out.append(line).append('\n');
                }
                if (second == 3 && i == 5) {
                    out.append(line, 0, 40).append('\n');
                }
            }
            if (second == 3) {
                out.append(late).append('\n');
            }
        }
        return out.toString();
    }

    private static String line(ExampleOperatingPoint point, String id, long ts, boolean alternateUnit) {
        double value = point.readings().get(id);
        String unit = point.units().get(id);
        if (alternateUnit) {
            Map.Entry<String, Double> other = switch (unit) {
                case "MPa" -> Map.entry("bar", value * 10.0);
                case "psig" -> Map.entry("barg", value * PSI_PA / 1e5);
                default -> Map.entry(unit, value);
            };
            unit = other.getKey();
            value = other.getValue();
        }
        return "{\"topic\":\"" + point.topicPrefix() + id + "\",\"ts\":\"" + Instant.ofEpochMilli(ts)
                + "\",\"value\":" + decimal(value) + ",\"unit\":\"" + unit + "\",\"quality\":\"good\"}";
    }

    /** Ten significant digits, trailing zeros dropped: 12.5, not 12.50000000. */
    private static String decimal(double value) {
        return new BigDecimal(String.format(Locale.ROOT, "%.10g", value)).stripTrailingZeros().toPlainString();
    }
}
