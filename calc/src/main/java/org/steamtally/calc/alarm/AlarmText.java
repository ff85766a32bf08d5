package org.steamtally.calc.alarm;

import java.util.Locale;

import org.steamtally.calc.cycle.Snapshot;

/** The one-sentence texts of alarms, built only when an event or a record needs one. */
final class AlarmText {

    private AlarmText() {
    }

    static void requireGiven(String text, String what) {
        if (text == null || text.isBlank()) {
            throw new IllegalArgumentException(what + " must be given, was " + (text == null ? "absent" : "blank"));
        }
    }

    /** A number for a person: five significant digits, plain notation within 0.01 to 100,000. */
    static String number(double v) {
        double a = Math.abs(v);
        if (a == 0.0 || a >= 0.01 && a < 1e5) {
            String s = String.format(Locale.ROOT, "%.5g", v);
            if (s.contains("e")) {
                return s;
            }
            if (s.contains(".")) {
                s = s.replaceAll("0+$", "");
                s = s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
            }
            return s;
        }
        String s = String.format(Locale.ROOT, "%.3e", v);
        int e = s.indexOf('e');
        String mantissa = s.substring(0, e).replaceAll("\\.?0+$", "");
        int exponent = Integer.parseInt(s.substring(e + 1));
        return mantissa + "e" + exponent;
    }

    private static String unitOf(Alarm a) {
        return a.sensor == null ? "" : " " + a.sensor.quantity().siUnit();
    }

    static String of(Alarm a) {
        if (a.restoredText != null) {
            return a.restoredText;
        }
        return switch (a.kind) {
            case CLOSURE -> closure(a);
            case GLOBAL_TEST -> globalTest(a);
            case SUSPECT_SENSOR -> suspect(a);
            case STALE_SENSOR -> stale(a);
            case OUT_OF_RANGE -> range(a);
            case CALCULATION_INVALID -> invalid(a);
            case FROZEN_SENSOR -> frozen(a);
            case ERRATIC_SENSOR -> erratic(a);
            case SILENT_UNIT -> silent(a);
        };
    }

    private static String closure(Alarm a) {
        String name = "energy balance \"" + a.subject + "\"";
        if (!a.hasValue) {
            return name + ": no closure computed";
        }
        return name + (a.pending ? " does not close" : " closes") + ": residual " + number(a.residualW) + " W, u "
                + number(a.sigmaW) + " W, z " + number(a.value) + " (limit |z| " + number(a.limit) + ")";
    }

    private static String globalTest(Alarm a) {
        if (!a.hasValue) {
            return "reconciliation global test: no test made";
        }
        return "reconciliation global test " + (a.pending ? "fails" : "passes") + ": chi-squared " + number(a.value)
                + " against " + number(a.limit);
    }

    private static String suspect(Alarm a) {
        String name = "sensor " + a.subject;
        SuspectInput s = a.suspect;
        if (s == null) {
            return name + ": not named by the reconciliation";
        }
        String unit = unitOf(a);
        StringBuilder text = new StringBuilder(name).append(a.listed ? " is suspect" : " was suspect")
                .append(": estimated bias ").append(number(s.biasSi())).append(unit)
                .append(", u ").append(number(s.sigmaSi())).append(unit)
                .append(", test value ").append(number(s.testValue()))
                .append(" (limit ").append(number(a.limit)).append(')');
        if (!s.equivalenceSet().isEmpty()) {
            text.append("; the balances cannot tell it apart from ").append(String.join(", ", s.equivalenceSet()));
        }
        if (!a.listed) {
            text.append("; no longer named");
        }
        return text.toString();
    }

    private static String stale(Alarm a) {
        String name = "sensor " + a.subject;
        if (a.status == null) {
            return name + ": no snapshot yet";
        }
        String maxAge = a.sensor == null ? "" : " of " + a.sensor.maxAge().toString().substring(2).toLowerCase(Locale.ROOT);
        return switch (a.status) {
            case GOOD -> name + " has a good value";
            case STALE -> name + " has no good value within its max age" + maxAge;
            case MISSING -> name + " has sent no value yet";
        };
    }

    private static String range(Alarm a) {
        String name = "sensor " + a.subject;
        if (a.status != Snapshot.SensorStatus.GOOD || a.sensor == null) {
            return name + ": no good value to check against its plausible range";
        }
        String unit = unitOf(a);
        String span = number(a.sensor.rangeMinSi()) + " to " + number(a.sensor.rangeMaxSi()) + unit;
        if (!a.hasValue) {
            return name + " reads a value that is not a number, plausible range " + span;
        }
        String reads = name + " reads " + number(a.value) + unit;
        if (a.value > a.sensor.rangeMaxSi()) {
            return reads + ", above its plausible range " + span;
        }
        if (a.value < a.sensor.rangeMinSi()) {
            return reads + ", below its plausible range " + span;
        }
        return reads + ", within its plausible range " + span;
    }

    private static String invalid(Alarm a) {
        String name = (a.aboutState ? "state \"" : "component \"") + a.subject + "\"";
        return a.reason == null ? name + " is valid" : name + " is invalid: " + a.reason;
    }

    private static String frozen(Alarm a) {
        String name = "sensor " + a.subject;
        if (!a.hasValue) {
            return name + ": no good reading to test for a frozen value";
        }
        return name + (a.pending ? " is frozen" : " moves") + ": unchanged for " + number(a.value) + " s (limit "
                + number(a.limit) + " s)";
    }

    private static String erratic(Alarm a) {
        String name = "sensor " + a.subject;
        if (!a.hasValue) {
            return name + ": scatter not tested (too few readings, or still learning its normal scatter)";
        }
        return name + (a.pending ? " is erratic" : " scatters normally") + ": successive-difference scatter "
                + number(a.value) + " times its normal (limit " + number(a.limit) + ")";
    }

    private static String silent(Alarm a) {
        String name = "unit " + a.subject;
        if (a.sensorCount == 0) {
            return name + ": no snapshot yet";
        }
        String share = " (limit: a share of " + number(a.limit) + " of its sensors)";
        if (a.pending) {
            return name + " is silent: no good reading from " + a.silentSensors + " of " + a.sensorCount
                    + " sensors within their max age" + share;
        }
        return name + " reports: " + a.silentSensors + " of " + a.sensorCount
                + " sensors without a good reading within their max age" + share;
    }
}
