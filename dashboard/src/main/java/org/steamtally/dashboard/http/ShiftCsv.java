package org.steamtally.dashboard.http;

import java.time.Duration;
import java.time.ZoneId;
import java.time.format.DateTimeFormatter;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.stream.Collectors;
import org.steamtally.dashboard.store.ClosureStats;
import org.steamtally.dashboard.store.ShiftSummary;

/**
 * Shift summaries as CSV (RFC 4180: comma, CRLF, fields with commas, quotes or line breaks quoted),
 * one row per shift, for a spreadsheet. Start and end are given in UTC and in the site's local time
 * with its offset, so that the shifts around a daylight-saving change read right. Empty figures are
 * empty cells. A text cell that a spreadsheet would take for a formula (it begins with {@code =},
 * {@code +}, {@code -}, {@code @}) gets a leading apostrophe.
 */
final class ShiftCsv {

    static final List<String> HEADER = List.of("date", "shift", "start_utc", "end_utc", "start_local", "end_local",
            "length_h", "summarised_until_utc", "energy_in_MWh", "energy_out_MWh", "efficiency_from_energy",
            "mean_thermal_efficiency", "worst_thermal_efficiency", "mean_heat_rate_kJ_per_kWh",
            "worst_heat_rate_kJ_per_kWh", "covered_h", "alarms_active_h", "closure_max_abs_z",
            "closure_fraction_outside", "top_suspects");

    private static final DateTimeFormatter LOCAL = DateTimeFormatter.ISO_OFFSET_DATE_TIME;

    private ShiftCsv() {
    }

    static String write(List<ShiftSummary> summaries, String zone) {
        ZoneId z = ZoneId.of(zone);
        StringBuilder out = new StringBuilder();
        row(out, HEADER);
        for (ShiftSummary s : summaries) {
            double maxAbsZ = s.closures().stream().mapToDouble(ClosureStats::maxAbsZ).max().orElse(Double.NaN);
            double outside = s.closures().stream().mapToDouble(ClosureStats::fractionOutside).max()
                    .orElse(Double.NaN);
            row(out, List.of(
                    s.shift().date().toString(),
                    text(s.shift().name()),
                    s.shift().start().toString(),
                    s.shift().end().toString(),
                    LOCAL.format(s.shift().start().atZone(z)),
                    LOCAL.format(s.shift().end().atZone(z)),
                    number(hours(s.shift().length())),
                    s.until().toString(),
                    number(s.energyInMWh()),
                    number(s.energyOutMWh()),
                    number(s.efficiencyFromEnergy()),
                    number(s.meanEfficiency()),
                    number(s.worstEfficiency()),
                    number(s.meanHeatRateKJPerKWh()),
                    number(s.worstHeatRateKJPerKWh()),
                    number(hours(s.covered())),
                    number(hours(s.alarmsActive())),
                    number(maxAbsZ),
                    number(outside),
                    text(s.topSuspects().stream().map(x -> x.sensorId() + " (" + x.suspectCount() + ")")
                            .collect(Collectors.joining("; ")))));
        }
        return out.toString();
    }

    private static double hours(Duration d) {
        return d.toMillis() / 3_600_000.0;
    }

    private static String number(OptionalDouble v) {
        return v.isPresent() ? number(v.getAsDouble()) : "";
    }

    /** Up to 6 significant digits after the point, no exponent; NaN (no data) is an empty cell. */
    private static String number(double v) {
        if (!Double.isFinite(v)) {
            return "";
        }
        String s = String.format(Locale.ROOT, "%.6f", v);
        s = s.replaceAll("0+$", "");
        return s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
    }

    private static String text(String v) {
        if (!v.isEmpty() && "=+-@".indexOf(v.charAt(0)) >= 0) {
            return "'" + v;
        }
        return v;
    }

    private static void row(StringBuilder out, List<String> cells) {
        for (int i = 0; i < cells.size(); i++) {
            if (i > 0) {
                out.append(',');
            }
            String c = cells.get(i);
            if (c.indexOf(',') >= 0 || c.indexOf('"') >= 0 || c.indexOf('\n') >= 0 || c.indexOf('\r') >= 0) {
                out.append('"').append(c.replace("\"", "\"\"")).append('"');
            } else {
                out.append(c);
            }
        }
        out.append("\r\n");
    }
}
