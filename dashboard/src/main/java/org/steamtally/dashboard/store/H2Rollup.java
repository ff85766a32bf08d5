package org.steamtally.dashboard.store;

import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * Per-minute rollups of the embedded store's {@code cycle} and {@code closure} tables, the two
 * series a shift summary reads in full: an 8-hour shift at 1 Hz is 480 rollup rows per series
 * instead of 28,800 raw rows (docs/STORE.md, docs/PERFORMANCE.md).
 *
 * <p>The rollup is updated in the same transaction as the raw write, so a rolled-back write leaves
 * no trace in it. A batch written with plain {@code INSERT}s holds only new points (a stored one
 * fails the insert), so its points are added to the minutes' rows ({@link #add}). A batch that
 * repeats stored points (a journal replay, written with {@code MERGE}) has its minutes rebuilt from
 * the raw rows instead ({@link #rebuild}): a replayed point replaces its raw row and cannot be
 * counted twice. Minutes are aligned to the epoch (minute start = ⌊ts / 60,000 ms⌋ · 60,000 ms).
 */
final class H2Rollup {

    /** One minute, ms: the rollup's resolution. */
    static final long MINUTE_MS = 60_000L;

    /** The cycle fields a shift summary reads (ShiftSummaries). */
    static final List<String> CYCLE_FIELDS = List.of("heat_added_W", "net_work_W", "thermal_efficiency",
            "heat_rate_kJ_per_kWh");

    static final String CYCLE_TABLE = "cycle_minute";
    static final String CLOSURE_TABLE = "closure_minute";

    /** Minute start of {@code ts} in SQL, floor division also for times before 1970. */
    private static final String MINUTE_OF_TS = "(\"ts\" - MOD(\"ts\", 60000) - CASE WHEN MOD(\"ts\", 60000) < 0"
            + " THEN 60000 ELSE 0 END)";

    private H2Rollup() {
    }

    static long minuteOf(long ms) {
        return Math.floorDiv(ms, MINUTE_MS) * MINUTE_MS;
    }

    private static String q(String identifier) {
        return '"' + identifier + '"';
    }

    /** Column names of the cycle rollup for one field: count, sum, min, max. */
    static String col(String field, String aggregate) {
        return q(field + "_" + aggregate);
    }

    /**
     * Creates the rollup tables; when one is new (a database written before rollups existed), fills
     * it from the raw table.
     */
    static void createSchema(Connection c) throws SQLException {
        boolean cycleNew = !exists(c, CYCLE_TABLE);
        boolean closureNew = !exists(c, CLOSURE_TABLE);
        try (Statement st = c.createStatement()) {
            StringBuilder cycle = new StringBuilder("CREATE TABLE IF NOT EXISTS " + q(CYCLE_TABLE) + " (\"site\" VARCHAR"
                    + " NOT NULL, \"unit\" VARCHAR NOT NULL, \"minute\" BIGINT NOT NULL");
            for (String f : CYCLE_FIELDS) {
                cycle.append(", ").append(col(f, "count")).append(" BIGINT NOT NULL, ").append(col(f, "sum"))
                        .append(" DOUBLE PRECISION, ").append(col(f, "min")).append(" DOUBLE PRECISION, ")
                        .append(col(f, "max")).append(" DOUBLE PRECISION");
            }
            cycle.append(", PRIMARY KEY (\"site\", \"unit\", \"minute\"))");
            st.execute(cycle.toString());
            st.execute("CREATE TABLE IF NOT EXISTS " + q(CLOSURE_TABLE) + " (\"site\" VARCHAR NOT NULL, \"unit\" VARCHAR"
                    + " NOT NULL, \"minute\" BIGINT NOT NULL, \"closure\" VARCHAR NOT NULL, \"count\" BIGINT NOT NULL,"
                    + " \"residual_W_sum\" DOUBLE PRECISION NOT NULL, \"z_sum\" DOUBLE PRECISION NOT NULL,"
                    + " \"z_min\" DOUBLE PRECISION NOT NULL, \"z_max\" DOUBLE PRECISION NOT NULL,"
                    + " \"outside_count\" BIGINT NOT NULL, PRIMARY KEY (\"site\", \"unit\", \"minute\", \"closure\"))");
            if (cycleNew) {
                st.executeUpdate(insertCycle("TRUE"));
            }
            if (closureNew) {
                st.executeUpdate(insertClosure("TRUE"));
            }
        }
    }

    private static boolean exists(Connection c, String table) throws SQLException {
        try (PreparedStatement ps = c.prepareStatement(
                "SELECT COUNT(*) FROM INFORMATION_SCHEMA.TABLES WHERE TABLE_SCHEMA = SCHEMA() AND TABLE_NAME = ?")) {
            ps.setString(1, table);
            try (ResultSet rs = ps.executeQuery()) {
                rs.next();
                return rs.getLong(1) > 0;
            }
        }
    }

    private static String insertCycle(String where) {
        StringBuilder cols = new StringBuilder("\"site\", \"unit\", \"minute\"");
        StringBuilder sel = new StringBuilder("\"site\", \"unit\", " + MINUTE_OF_TS);
        for (String f : CYCLE_FIELDS) {
            for (String a : List.of("count", "sum", "min", "max")) {
                cols.append(", ").append(col(f, a));
                sel.append(", ").append(a.toUpperCase(java.util.Locale.ROOT)).append('(').append(q(f)).append(')');
            }
        }
        return "INSERT INTO " + q(CYCLE_TABLE) + " (" + cols + ") SELECT " + sel + " FROM \"cycle\" WHERE " + where
                + " GROUP BY \"site\", \"unit\", " + MINUTE_OF_TS;
    }

    /**
     * Closure statistics as the raw path computes them: an empty z or residual counts as 0 there
     * (ResultSet.getDouble), so it does here.
     */
    private static String insertClosure(String where) {
        return "INSERT INTO " + q(CLOSURE_TABLE) + " (\"site\", \"unit\", \"minute\", \"closure\", \"count\","
                + " \"residual_W_sum\", \"z_sum\", \"z_min\", \"z_max\", \"outside_count\") SELECT \"site\", \"unit\", "
                + MINUTE_OF_TS + ", \"closure\", COUNT(*), SUM(COALESCE(\"residual_W\", 0.0)),"
                + " SUM(COALESCE(\"z\", 0.0)), MIN(COALESCE(\"z\", 0.0)), MAX(COALESCE(\"z\", 0.0)),"
                + " COUNT(CASE WHEN ABS(COALESCE(\"z\", 0.0)) > " + ClosureStats.Z_LIMIT + " THEN 1 END)"
                + " FROM \"closure\" WHERE " + where + " GROUP BY \"site\", \"unit\", " + MINUTE_OF_TS + ", \"closure\"";
    }

    /** Sums of a minute's (or a batch's) values of one series: per field count, sum, min, max. */
    private static final class Acc {
        final String site;
        final String unit;
        final String id;
        final long minute;
        final double[] a;
        /** Closure only: samples with |z| above the limit. */
        long outside;

        Acc(String site, String unit, String id, long minute, int fields) {
            this.site = site;
            this.unit = unit;
            this.id = id;
            this.minute = minute;
            this.a = new double[4 * fields];
            for (int i = 0; i < fields; i++) {
                a[4 * i + 2] = Double.POSITIVE_INFINITY;
                a[4 * i + 3] = Double.NEGATIVE_INFINITY;
            }
        }

        void add(int field, double v) {
            a[4 * field] += 1;
            a[4 * field + 1] += v;
            a[4 * field + 2] = Math.min(a[4 * field + 2], v);
            a[4 * field + 3] = Math.max(a[4 * field + 3], v);
        }
    }

    /**
     * Adds the points of a batch that held only new points to the rollup, on the writer's
     * connection and inside its open transaction: one update (or insert) per minute and series.
     */
    static void add(Connection c, Map<Measurement, List<Point>> byMeasurement) throws SQLException {
        List<Point> cycle = byMeasurement.get(Measurement.CYCLE);
        if (cycle != null) {
            int[] index = new int[CYCLE_FIELDS.size()];
            for (int i = 0; i < index.length; i++) {
                index[i] = Measurement.CYCLE.fieldIndex(CYCLE_FIELDS.get(i));
            }
            Map<List<Object>, Acc> accs = new java.util.LinkedHashMap<>();
            for (Point p : cycle) {
                long minute = minuteOf(p.timestampMs());
                Acc acc = accs.computeIfAbsent(List.of(p.site(), p.unit(), minute),
                        k -> new Acc(p.site(), p.unit(), null, minute, index.length));
                for (int i = 0; i < index.length; i++) {
                    if (p.value(index[i]) instanceof Double v) {
                        acc.add(i, v);
                    }
                }
            }
            StringBuilder set = new StringBuilder();
            StringBuilder cols = new StringBuilder("\"site\", \"unit\", \"minute\"");
            StringBuilder marks = new StringBuilder("?, ?, ?");
            for (String f : CYCLE_FIELDS) {
                // A field without samples has NULL sum, min and max; LEAST and GREATEST skip NULLs.
                set.append(set.isEmpty() ? "" : ", ").append(col(f, "count")).append(" = ").append(col(f, "count"))
                        .append(" + ?, ").append(col(f, "sum")).append(" = CASE WHEN ? = 0 THEN ").append(col(f, "sum"))
                        .append(" ELSE COALESCE(").append(col(f, "sum")).append(", 0.0) + ? END, ").append(col(f, "min"))
                        .append(" = LEAST(").append(col(f, "min")).append(", ?), ").append(col(f, "max"))
                        .append(" = GREATEST(").append(col(f, "max")).append(", ?)");
                for (String a : List.of("count", "sum", "min", "max")) {
                    cols.append(", ").append(col(f, a));
                    marks.append(", ?");
                }
            }
            apply(c, accs.values(), "UPDATE " + q(CYCLE_TABLE) + " SET " + set
                    + " WHERE \"site\" = ? AND \"unit\" = ? AND \"minute\" = ?",
                    "INSERT INTO " + q(CYCLE_TABLE) + " (" + cols + ") VALUES (" + marks + ")");
        }
        List<Point> closure = byMeasurement.get(Measurement.CLOSURE);
        if (closure != null) {
            int z = Measurement.CLOSURE.fieldIndex("z");
            int residual = Measurement.CLOSURE.fieldIndex("residual_W");
            Map<List<Object>, Acc> accs = new java.util.LinkedHashMap<>();
            for (Point p : closure) {
                long minute = minuteOf(p.timestampMs());
                Acc acc = accs.computeIfAbsent(List.of(p.site(), p.unit(), minute, p.id()),
                        k -> new Acc(p.site(), p.unit(), p.id(), minute, 2));
                // As the raw path reads them: an empty value is 0 (ResultSet.getDouble).
                double zv = p.value(z) instanceof Double v ? v : 0.0;
                acc.add(0, zv);
                acc.add(1, p.value(residual) instanceof Double v ? v : 0.0);
                if (Math.abs(zv) > ClosureStats.Z_LIMIT) {
                    acc.outside++;
                }
            }
            applyClosures(c, new ArrayList<>(accs.values()));
        }
    }

    private static void applyClosures(Connection c, List<Acc> list) throws SQLException {
        int[] updated;
        try (PreparedStatement up = c.prepareStatement("UPDATE " + q(CLOSURE_TABLE) + " SET \"count\" = \"count\" + ?,"
                + " \"residual_W_sum\" = \"residual_W_sum\" + ?, \"z_sum\" = \"z_sum\" + ?, \"z_min\" = LEAST(\"z_min\", ?),"
                + " \"z_max\" = GREATEST(\"z_max\", ?), \"outside_count\" = \"outside_count\" + ? WHERE \"site\" = ? AND"
                + " \"unit\" = ? AND \"minute\" = ? AND \"closure\" = ?")) {
            for (Acc acc : list) {
                up.setLong(1, (long) acc.a[0]);
                up.setDouble(2, acc.a[5]);
                up.setDouble(3, acc.a[1]);
                up.setDouble(4, acc.a[2]);
                up.setDouble(5, acc.a[3]);
                up.setLong(6, acc.outside);
                up.setString(7, acc.site);
                up.setString(8, acc.unit);
                up.setLong(9, acc.minute);
                up.setString(10, acc.id);
                up.addBatch();
            }
            updated = up.executeBatch();
        }
        try (PreparedStatement ins = c.prepareStatement("INSERT INTO " + q(CLOSURE_TABLE) + " (\"site\", \"unit\","
                + " \"minute\", \"closure\", \"count\", \"residual_W_sum\", \"z_sum\", \"z_min\", \"z_max\","
                + " \"outside_count\") VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
            boolean any = false;
            for (int k = 0; k < list.size(); k++) {
                if (updated[k] != 0) {
                    continue;
                }
                Acc acc = list.get(k);
                ins.setString(1, acc.site);
                ins.setString(2, acc.unit);
                ins.setLong(3, acc.minute);
                ins.setString(4, acc.id);
                ins.setLong(5, (long) acc.a[0]);
                ins.setDouble(6, acc.a[5]);
                ins.setDouble(7, acc.a[1]);
                ins.setDouble(8, acc.a[2]);
                ins.setDouble(9, acc.a[3]);
                ins.setLong(10, acc.outside);
                ins.addBatch();
                any = true;
            }
            if (any) {
                ins.executeBatch();
            }
        }
    }

    private static void apply(Connection c, java.util.Collection<Acc> accs, String update, String insert)
            throws SQLException {
        List<Acc> list = new ArrayList<>(accs);
        int[] updated;
        try (PreparedStatement up = c.prepareStatement(update)) {
            for (Acc acc : list) {
                int i = 1;
                for (int f = 0; f < acc.a.length / 4; f++) {
                    long count = (long) acc.a[4 * f];
                    up.setLong(i++, count);
                    up.setLong(i++, count);
                    setSum(up, i++, count, acc.a[4 * f + 1]);
                    setSum(up, i++, count, acc.a[4 * f + 2]);
                    setSum(up, i++, count, acc.a[4 * f + 3]);
                }
                up.setString(i++, acc.site);
                up.setString(i++, acc.unit);
                up.setLong(i, acc.minute);
                up.addBatch();
            }
            updated = up.executeBatch();
        }
        try (PreparedStatement ins = c.prepareStatement(insert)) {
            boolean any = false;
            for (int k = 0; k < list.size(); k++) {
                if (updated[k] != 0) {
                    continue;
                }
                Acc acc = list.get(k);
                int i = 1;
                ins.setString(i++, acc.site);
                ins.setString(i++, acc.unit);
                ins.setLong(i++, acc.minute);
                for (int f = 0; f < acc.a.length / 4; f++) {
                    long count = (long) acc.a[4 * f];
                    ins.setLong(i++, count);
                    setSum(ins, i++, count, acc.a[4 * f + 1]);
                    setSum(ins, i++, count, acc.a[4 * f + 2]);
                    setSum(ins, i++, count, acc.a[4 * f + 3]);
                }
                ins.addBatch();
                any = true;
            }
            if (any) {
                ins.executeBatch();
            }
        }
    }

    private static void setSum(PreparedStatement ps, int i, long count, double v) throws SQLException {
        if (count == 0) {
            ps.setNull(i, java.sql.Types.DOUBLE);
        } else {
            ps.setDouble(i, v);
        }
    }

    private static final String UNIT_RANGE = "\"site\" = ? AND \"unit\" = ? AND \"ts\" >= ? AND \"ts\" < ?";
    private static final String UNIT_MINUTES = "\"site\" = ? AND \"unit\" = ? AND \"minute\" >= ? AND \"minute\" < ?";

    /** A run of whole minutes [fromMs, toMs) of one unit whose rollup rows are rebuilt. */
    private record Run(String site, String unit, long fromMs, long toMs) {
    }

    /**
     * Rebuilds, on the writer's connection and inside its open transaction, the rollup minutes that
     * the points of a written batch fall into.
     */
    static void rebuild(Connection c, Map<Measurement, List<Point>> byMeasurement) throws SQLException {
        List<Point> cycle = byMeasurement.get(Measurement.CYCLE);
        if (cycle != null) {
            rebuild(c, runs(cycle), CYCLE_TABLE, insertCycle(UNIT_RANGE));
        }
        List<Point> closure = byMeasurement.get(Measurement.CLOSURE);
        if (closure != null) {
            rebuild(c, runs(closure), CLOSURE_TABLE, insertClosure(UNIT_RANGE));
        }
    }

    /** The affected minutes of each unit, joined into runs of consecutive minutes. */
    private static List<Run> runs(List<Point> points) {
        Map<List<String>, TreeSet<Long>> minutes = new TreeMap<>((a, b) -> {
            int s = a.get(0).compareTo(b.get(0));
            return s != 0 ? s : a.get(1).compareTo(b.get(1));
        });
        for (Point p : points) {
            minutes.computeIfAbsent(List.of(p.site(), p.unit()), k -> new TreeSet<>()).add(minuteOf(p.timestampMs()));
        }
        List<Run> runs = new ArrayList<>();
        for (Map.Entry<List<String>, TreeSet<Long>> e : minutes.entrySet()) {
            long start = Long.MIN_VALUE;
            long end = Long.MIN_VALUE;
            for (long m : e.getValue()) {
                if (m != end) {
                    if (start != Long.MIN_VALUE) {
                        runs.add(new Run(e.getKey().get(0), e.getKey().get(1), start, end));
                    }
                    start = m;
                }
                end = m + MINUTE_MS;
            }
            runs.add(new Run(e.getKey().get(0), e.getKey().get(1), start, end));
        }
        return runs;
    }

    private static void rebuild(Connection c, List<Run> runs, String table, String insert) throws SQLException {
        try (PreparedStatement del = c.prepareStatement("DELETE FROM " + q(table) + " WHERE " + UNIT_MINUTES);
                PreparedStatement ins = c.prepareStatement(insert)) {
            for (Run r : runs) {
                bind(del, r);
                del.addBatch();
                bind(ins, r);
                ins.addBatch();
            }
            del.executeBatch();
            ins.executeBatch();
        }
    }

    private static void bind(PreparedStatement ps, Run r) throws SQLException {
        ps.setString(1, r.site());
        ps.setString(2, r.unit());
        ps.setLong(3, r.fromMs());
        ps.setLong(4, r.toMs());
    }

    /**
     * After the raw rows before {@code cutoffMs} were deleted: drops the rollup minutes wholly before
     * it and rebuilds the minute it falls in, which lost part of its rows.
     */
    static void purge(Connection c, long cutoffMs) throws SQLException {
        long minute = minuteOf(cutoffMs);
        for (String table : List.of(CYCLE_TABLE, CLOSURE_TABLE)) {
            try (PreparedStatement del = c.prepareStatement("DELETE FROM " + q(table) + " WHERE \"minute\" < ?")) {
                del.setLong(1, minute);
                del.executeUpdate();
            }
        }
        if (minute == cutoffMs) {
            return;
        }
        for (String table : List.of(CYCLE_TABLE, CLOSURE_TABLE)) {
            List<Run> runs = new ArrayList<>();
            try (PreparedStatement units = c.prepareStatement("SELECT DISTINCT \"site\", \"unit\" FROM " + q(table)
                    + " WHERE \"minute\" = ?")) {
                units.setLong(1, minute);
                try (ResultSet rs = units.executeQuery()) {
                    while (rs.next()) {
                        runs.add(new Run(rs.getString(1), rs.getString(2), minute, minute + MINUTE_MS));
                    }
                }
            }
            rebuild(c, runs, table, table.equals(CYCLE_TABLE) ? insertCycle(UNIT_RANGE) : insertClosure(UNIT_RANGE));
        }
    }
}
