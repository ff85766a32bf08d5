package org.steamtally.dashboard.store;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.sql.Types;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.StringJoiner;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import org.steamtally.dashboard.store.Measurement.Field;

/**
 * The embedded store: an H2 database in file mode under a data directory, one table per measurement
 * with the same names as the InfluxDB schema (docs/STORE.md): columns {@code site, unit}, the id tag
 * (except {@code cycle}), {@code ts} (BIGINT, ms since the epoch) and one nullable column per field.
 * The primary key is (site, unit, id, ts), the point's identity ({@link #pkColumns} for its column
 * order), and a batch that repeats a stored point is written again as {@code MERGE}s, so writing a
 * point again replaces it. Per-minute rollups of {@code cycle} and {@code closure} ({@link H2Rollup})
 * and the table of suspect sensors ({@link H2Suspects}), kept in step in each write's transaction,
 * answer the shift summary's whole minutes and its suspect list.
 *
 * <p>Points older than the retention period are deleted by {@link #purgeExpired()}, which runs at
 * opening and then on a fixed schedule; "now" comes from the injected clock. H2 commits each write
 * batch and its store survives a killed process (it reopens at its last committed state).
 */
public final class H2Store implements StoreBackend {

    /** Adapter name in meters and logs. */
    public static final String NAME = "h2";

    private static final String DATABASE_FILE = "steamtally";

    /**
     * Covering indexes for the queries behind shift summaries and alarm history: the cycle's energy
     * and efficiency buckets, closure statistics and alarm events by time. Suspect sensors have a
     * table of their own ({@link H2Suspects}) rather than an index on every reconciliation row.
     */
    private static final Map<Measurement, List<String>> SUMMARY_INDEX = Map.of(
            Measurement.CYCLE, List.of("site", "unit", "ts", "heat_added_W", "net_work_W", "thermal_efficiency",
                    "heat_rate_kJ_per_kWh"),
            Measurement.CLOSURE, List.of("site", "unit", "ts", "closure", "z", "residual_W"),
            Measurement.ALARMS, List.of("site", "unit", "ts"));

    private final Connection writeConnection;
    /** Connections for queries, so that two can run at once (a shift summary asks several). */
    private final java.util.concurrent.BlockingQueue<Connection> queryConnections;
    private final List<Connection> allQueryConnections;
    private final Clock clock;
    private final Duration retention;
    private final ScheduledExecutorService purger;
    private final Map<Measurement, String> merges = new EnumMap<>(Measurement.class);
    private final Map<Measurement, String> inserts = new EnumMap<>(Measurement.class);
    /**
     * The writer's INSERT statements, prepared once and reused by every batch (preparing them per
     * batch showed in the writer's profile); used only under the write connection's lock.
     */
    private final Map<Measurement, PreparedStatement> preparedInserts = new EnumMap<>(Measurement.class);
    private PreparedStatement preparedSuspectInsert;
    /** Whether shift-summary queries read the per-minute rollups (false only to compare, in the load driver). */
    private final boolean rollupQueries;

    private H2Store(Connection write, List<Connection> query, Clock clock, Duration retention, boolean rollupQueries) {
        this.writeConnection = write;
        this.rollupQueries = rollupQueries;
        this.allQueryConnections = List.copyOf(query);
        this.queryConnections = new java.util.concurrent.ArrayBlockingQueue<>(query.size(), false, query);
        this.clock = clock;
        this.retention = retention;
        this.purger = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "steamtally-store-h2-purge");
            t.setDaemon(true);
            return t;
        });
    }

    /**
     * Opens (creating if needed) the database in {@code dataDir} and schedules the retention purge.
     *
     * @param retention     how long points are kept, &gt; 0
     * @param purgeInterval how often expired points are deleted, &gt; 0
     * @throws StoreQueryException when the database cannot be opened (e.g. another process holds it)
     */
    public static H2Store open(Path dataDir, Duration retention, Duration purgeInterval, Clock clock) {
        return open(dataDir, retention, purgeInterval, clock, true);
    }

    /**
     * As {@link #open(Path, Duration, Duration, Clock)}; with {@code rollupQueries} false the
     * summary queries read the raw rows (the rollups are maintained all the same), so that a
     * benchmark can compare both on the same data.
     */
    static H2Store open(Path dataDir, Duration retention, Duration purgeInterval, Clock clock,
            boolean rollupQueries) {
        Objects.requireNonNull(clock, "clock");
        if (retention.isNegative() || retention.isZero() || purgeInterval.isNegative() || purgeInterval.isZero()) {
            throw new IllegalArgumentException("retention " + retention + " and purge interval " + purgeInterval
                    + " must be positive");
        }
        try {
            Files.createDirectories(dataDir);
            // The store closes the database itself, after the writer has handed over its last batch;
            // H2's own shutdown hook could close it first.
            String url = "jdbc:h2:file:" + dataDir.toAbsolutePath().resolve(DATABASE_FILE) + ";DB_CLOSE_ON_EXIT=FALSE";
            Connection write = DriverManager.getConnection(url, "sa", "");
            List<Connection> query = List.of(DriverManager.getConnection(url, "sa", ""),
                    DriverManager.getConnection(url, "sa", ""));
            H2Store store = new H2Store(write, query, clock, retention, rollupQueries);
            store.createSchema();
            store.purgeExpired();
            long ms = purgeInterval.toMillis();
            store.purger.scheduleWithFixedDelay(store::purgeQuietly, ms, ms, TimeUnit.MILLISECONDS);
            return store;
        } catch (SQLException | java.io.IOException e) {
            throw new StoreQueryException("cannot open the embedded store in " + dataDir + ": " + e.getMessage(), e);
        }
    }

    @Override
    public String name() {
        return NAME;
    }

    private static String q(String identifier) {
        return '"' + identifier + '"';
    }

    private static String sqlType(Measurement.FieldType t) {
        return switch (t) {
            case DOUBLE -> "DOUBLE PRECISION";
            case LONG -> "BIGINT";
            case BOOLEAN -> "BOOLEAN";
            case STRING -> "VARCHAR";
        };
    }

    private static List<String> keyColumns(Measurement m) {
        List<String> k = new ArrayList<>(List.of(Measurement.SITE_TAG, Measurement.UNIT_TAG));
        if (m.hasIdTag()) {
            k.add(m.idTag());
        }
        k.add("ts");
        return k;
    }

    /**
     * The primary key's column order for a table this store creates. {@code states} and
     * {@code components} put {@code ts} before the id: a result's rows of one unit then land next to
     * each other at the end of the key's B-tree instead of at one place per series (20 and 12 a
     * unit), so a batch dirties, and H2 rewrites and caches, far fewer pages. No query reads those
     * tables one series at a time. The tables whose series are read one at a time (a check's
     * residual trend, a sensor's trend, an alarm's last event) keep the id before {@code ts}.
     * The order changes no answer, so a database made with the former order needs no upgrade.
     */
    static List<String> pkColumns(Measurement m) {
        if (m != Measurement.STATES && m != Measurement.COMPONENTS) {
            return keyColumns(m);
        }
        return List.of(Measurement.SITE_TAG, Measurement.UNIT_TAG, "ts", m.idTag());
    }

    private void createSchema() throws SQLException {
        synchronized (writeConnection) {
            try (Statement st = writeConnection.createStatement()) {
                for (Measurement m : Measurement.values()) {
                    StringJoiner cols = new StringJoiner(", ");
                    List<String> key = keyColumns(m);
                    for (String k : key) {
                        cols.add(q(k) + (k.equals("ts") ? " BIGINT NOT NULL" : " VARCHAR NOT NULL"));
                    }
                    for (Field f : m.fields()) {
                        cols.add(q(f.name()) + " " + sqlType(f.type()));
                    }
                    StringJoiner pk = new StringJoiner(", ");
                    pkColumns(m).forEach(k -> pk.add(q(k)));
                    st.execute("CREATE TABLE IF NOT EXISTS " + q(m.measurementName()) + " (" + cols + ", PRIMARY KEY ("
                            + pk + "))");
                    List<String> covering = SUMMARY_INDEX.get(m);
                    if (covering != null) {
                        // Holds every column the unit-wide range queries read, so H2 answers them from
                        // the index alone instead of fetching each row.
                        StringJoiner ic = new StringJoiner(", ");
                        covering.forEach(c -> ic.add(q(c)));
                        st.execute("CREATE INDEX IF NOT EXISTS " + q(m.measurementName() + "_summary") + " ON "
                                + q(m.measurementName()) + " (" + ic + ")");
                    }
                    StringJoiner all = new StringJoiner(", ");
                    StringJoiner marks = new StringJoiner(", ");
                    for (String k : key) {
                        all.add(q(k));
                        marks.add("?");
                    }
                    for (Field f : m.fields()) {
                        all.add(q(f.name()));
                        marks.add("?");
                    }
                    merges.put(m, "MERGE INTO " + q(m.measurementName()) + " (" + all + ") KEY (" + pk + ") VALUES ("
                            + marks + ")");
                    inserts.put(m, "INSERT INTO " + q(m.measurementName()) + " (" + all + ") VALUES (" + marks + ")");
                }
            }
            H2Rollup.createSchema(writeConnection);
            H2Suspects.createSchema(writeConnection);
        }
    }

    @Override
    public void write(List<Point> points) throws StoreUnavailableException {
        Map<Measurement, List<Point>> byMeasurement = new EnumMap<>(Measurement.class);
        for (Point p : points) {
            if (!p.isEmpty()) {
                byMeasurement.computeIfAbsent(p.measurement(), k -> new ArrayList<>()).add(p);
            }
        }
        synchronized (writeConnection) {
            try {
                writeBatch(byMeasurement, inserts);
            } catch (SQLException e) {
                if (!isDuplicateKey(e)) {
                    throw new StoreUnavailableException("embedded store write failed: " + e.getMessage(), e);
                }
                // A point of the batch is there already (a replay after a crash): write the batch
                // again as MERGEs, which replace. Plain INSERTs are faster when nothing is replayed.
                try {
                    writeBatch(byMeasurement, merges);
                } catch (SQLException again) {
                    throw new StoreUnavailableException("embedded store write failed: " + again.getMessage(), again);
                }
            }
        }
    }

    /** H2's SQLState for a duplicate primary key (DUPLICATE_KEY_1, ErrorCode 23505). */
    private static final String DUPLICATE_KEY = "23505";

    private static boolean isDuplicateKey(SQLException e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof SQLException s) {
                for (SQLException n = s; n != null; n = n.getNextException()) {
                    if (DUPLICATE_KEY.equals(n.getSQLState())) {
                        return true;
                    }
                }
            }
        }
        return false;
    }

    private void writeBatch(Map<Measurement, List<Point>> byMeasurement, Map<Measurement, String> sql)
            throws SQLException {
        try {
            writeConnection.setAutoCommit(false);
            for (Map.Entry<Measurement, List<Point>> e : byMeasurement.entrySet()) {
                Measurement m = e.getKey();
                boolean reuse = sql == inserts;
                PreparedStatement ps = reuse ? preparedInsert(m) : writeConnection.prepareStatement(sql.get(m));
                try {
                    for (Point p : e.getValue()) {
                        int i = 1;
                        ps.setString(i++, p.site());
                        ps.setString(i++, p.unit());
                        if (m.hasIdTag()) {
                            ps.setString(i++, p.id());
                        }
                        ps.setLong(i++, p.timestampMs());
                        for (int f = 0; f < m.fields().size(); f++) {
                            bind(ps, i++, m.fields().get(f).type(), p.value(f));
                        }
                        ps.addBatch();
                    }
                    ps.executeBatch();
                } finally {
                    if (reuse) {
                        ps.clearBatch();
                    } else {
                        ps.close();
                    }
                }
            }
            List<Point> reconciliation = byMeasurement.get(Measurement.RECONCILIATION);
            // In the same transaction: the rollup never disagrees with the raw rows. Plain INSERTs
            // succeeded only if every point was new, so adding them is exact; MERGEs may have
            // replaced stored points, so their minutes are rebuilt from the raw rows.
            if (sql == inserts) {
                H2Rollup.add(writeConnection, byMeasurement);
                if (reconciliation != null) {
                    if (preparedSuspectInsert == null) {
                        preparedSuspectInsert = writeConnection.prepareStatement(H2Suspects.INSERT);
                    }
                    try {
                        H2Suspects.add(preparedSuspectInsert, reconciliation);
                    } finally {
                        preparedSuspectInsert.clearBatch();
                    }
                }
            } else {
                H2Rollup.rebuild(writeConnection, byMeasurement);
                if (reconciliation != null) {
                    H2Suspects.replace(writeConnection, reconciliation);
                }
            }
            writeConnection.commit();
        } catch (SQLException e) {
            try {
                writeConnection.rollback();
            } catch (SQLException suppressed) {
                e.addSuppressed(suppressed);
            }
            throw e;
        } finally {
            try {
                writeConnection.setAutoCommit(true);
            } catch (SQLException ignored) {
                // The next write sets it again.
            }
        }
    }

    private PreparedStatement preparedInsert(Measurement m) throws SQLException {
        PreparedStatement ps = preparedInserts.get(m);
        if (ps == null) {
            ps = writeConnection.prepareStatement(inserts.get(m));
            preparedInserts.put(m, ps);
        }
        return ps;
    }

    private static void bind(PreparedStatement ps, int i, Measurement.FieldType type, Object v) throws SQLException {
        if (v == null) {
            ps.setNull(i, switch (type) {
                case DOUBLE -> Types.DOUBLE;
                case LONG -> Types.BIGINT;
                case BOOLEAN -> Types.BOOLEAN;
                case STRING -> Types.VARCHAR;
            });
            return;
        }
        switch (type) {
            case DOUBLE -> ps.setDouble(i, (Double) v);
            case LONG -> ps.setLong(i, (Long) v);
            case BOOLEAN -> ps.setBoolean(i, (Boolean) v);
            case STRING -> ps.setString(i, (String) v);
        }
    }

    /**
     * Deletes every point older than the retention period before the clock's now.
     *
     * @return the number of points deleted
     */
    public long purgeExpired() {
        long cutoff = clock.instant().minus(retention).toEpochMilli();
        long deleted = 0;
        synchronized (writeConnection) {
            try {
                for (Measurement m : Measurement.values()) {
                    try (PreparedStatement del = writeConnection.prepareStatement(
                            "DELETE FROM " + q(m.measurementName()) + " WHERE " + q("ts") + " < ?")) {
                        del.setLong(1, cutoff);
                        deleted += del.executeUpdate();
                    }
                }
                // After the raw rows: a crash in between leaves rollup minutes before the cut-off
                // until the purge at the next opening removes them.
                H2Rollup.purge(writeConnection, cutoff);
                // Likewise: suspect rows whose raw rows are gone are removed by the next purge.
                H2Suspects.purge(writeConnection, cutoff);
            } catch (SQLException e) {
                throw new StoreQueryException("embedded store purge failed: " + e.getMessage(), e);
            }
        }
        return deleted;
    }

    private void purgeQuietly() {
        try {
            purgeExpired();
        } catch (RuntimeException e) {
            System.getLogger(H2Store.class.getName()).log(System.Logger.Level.ERROR, e.getMessage(), e);
        }
    }

    private interface Rows<T> {
        T read(ResultSet rs) throws SQLException;
    }

    private <T> T query(String sql, Rows<T> rows, Object... params) {
        Connection c;
        try {
            c = queryConnections.take();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new StoreQueryException("interrupted while waiting for a connection to the embedded store", e);
        }
        try (PreparedStatement ps = c.prepareStatement(sql)) {
            for (int i = 0; i < params.length; i++) {
                ps.setObject(i + 1, params[i]);
            }
            try (ResultSet rs = ps.executeQuery()) {
                return rows.read(rs);
            }
        } catch (SQLException e) {
            throw new StoreQueryException("embedded store query failed: " + e.getMessage() + " [" + sql + "]", e);
        } finally {
            queryConnections.add(c);
        }
    }

    private static String unitRange() {
        return q("site") + " = ? AND " + q("unit") + " = ? AND " + q("ts") + " >= ? AND " + q("ts") + " < ?";
    }

    @Override
    public List<Point> points(Measurement m, String site, String unit, Instant from, Instant to) {
        String order = m.hasIdTag() ? q(m.idTag()) + ", " + q("ts") : q("ts");
        return query("SELECT * FROM " + q(m.measurementName()) + " WHERE " + unitRange() + " ORDER BY " + order,
                rs -> {
                    List<Point> out = new ArrayList<>();
                    while (rs.next()) {
                        out.add(point(m, rs));
                    }
                    return out;
                }, site, unit, from.toEpochMilli(), to.toEpochMilli());
    }

    private static Point point(Measurement m, ResultSet rs) throws SQLException {
        Object[] values = new Object[m.fields().size()];
        for (int f = 0; f < values.length; f++) {
            Field field = m.fields().get(f);
            String col = field.name();
            values[f] = switch (field.type()) {
                case DOUBLE -> nullable(rs, rs.getDouble(col));
                case LONG -> nullable(rs, rs.getLong(col));
                case BOOLEAN -> nullable(rs, rs.getBoolean(col));
                case STRING -> rs.getString(col);
            };
        }
        return new Point(m, rs.getString("site"), rs.getString("unit"), m.hasIdTag() ? rs.getString(m.idTag()) : null,
                rs.getLong("ts"), values);
    }

    private static Object nullable(ResultSet rs, Object v) throws SQLException {
        return rs.wasNull() ? null : v;
    }

    /*
     * Buckets and closure statistics are aggregated here from the streamed rows rather than by SQL
     * aggregates: H2 2.5 spends several times longer per row in AVG/MIN/MAX/SUM than in reading the
     * (covering) index, which decided whether an 8-hour summary at 1 Hz fits its time budget
     * (docs/PERFORMANCE.md).
     */

    @Override
    public Map<String, List<Bucket>> buckets(SeriesRef s, Instant from, Instant to, Duration width) {
        long fromMs = from.toEpochMilli();
        long toMs = to.toEpochMilli();
        long widthMs = width.toMillis();
        if (widthMs < 1) {
            throw new IllegalArgumentException("bucket width " + width + " must be at least 1 ms");
        }
        int n = s.fields().size();
        // Per bucket index: for each field count, sum, min, max.
        java.util.TreeMap<Long, double[]> acc = new java.util.TreeMap<>();
        long rawFrom = fromMs;
        if (rollupQueries && s.measurement() == Measurement.CYCLE && H2Rollup.CYCLE_FIELDS.containsAll(s.fields())
                && widthMs % H2Rollup.MINUTE_MS == 0 && H2Rollup.minuteOf(fromMs) == fromMs) {
            // Whole minutes from the rollup (each lies in one bucket), the last partial minute raw.
            long wholeTo = Math.max(fromMs, H2Rollup.minuteOf(toMs));
            rollupBuckets(s, fromMs, wholeTo, widthMs, acc);
            rawFrom = wholeTo;
        }
        if (rawFrom < toMs) {
            rawBuckets(s, fromMs, rawFrom, toMs, widthMs, acc);
        }
        Map<String, List<Bucket>> out = new LinkedHashMap<>();
        s.fields().forEach(f -> out.put(f, new ArrayList<>()));
        for (Map.Entry<Long, double[]> e : acc.entrySet()) {
            Instant start = Instant.ofEpochMilli(fromMs + e.getKey() * widthMs);
            double[] a = e.getValue();
            for (int i = 0; i < n; i++) {
                long count = (long) a[4 * i];
                if (count > 0) {
                    out.get(s.fields().get(i)).add(new Bucket(start, a[4 * i + 1] / count, a[4 * i + 2],
                            a[4 * i + 3], count));
                }
            }
        }
        return out;
    }

    private static double[] bucketAcc(java.util.TreeMap<Long, double[]> acc, long index, int n) {
        double[] a = acc.get(index);
        if (a == null) {
            a = new double[4 * n];
            for (int k = 0; k < n; k++) {
                a[4 * k + 2] = Double.POSITIVE_INFINITY;
                a[4 * k + 3] = Double.NEGATIVE_INFINITY;
            }
            acc.put(index, a);
        }
        return a;
    }

    /** Adds the raw rows in [rawFrom, to) into buckets aligned to {@code fromMs}. */
    private void rawBuckets(SeriesRef s, long fromMs, long rawFrom, long toMs, long widthMs,
            java.util.TreeMap<Long, double[]> acc) {
        int n = s.fields().size();
        StringBuilder sql = new StringBuilder("SELECT ").append(q("ts"));
        for (String f : s.fields()) {
            sql.append(", ").append(q(f));
        }
        sql.append(" FROM ").append(q(s.measurement().measurementName())).append(" WHERE ").append(unitRange());
        List<Object> params = new ArrayList<>(List.of(s.site(), s.unit(), rawFrom, toMs));
        if (s.measurement().hasIdTag()) {
            sql.append(" AND ").append(q(s.measurement().idTag())).append(" = ?");
            params.add(s.id());
        }
        query(sql.toString(), rs -> {
            while (rs.next()) {
                long index = (rs.getLong(1) - fromMs) / widthMs;
                double[] a = null;
                for (int i = 0; i < n; i++) {
                    double v = rs.getDouble(2 + i);
                    if (rs.wasNull()) {
                        continue;
                    }
                    if (a == null) {
                        a = bucketAcc(acc, index, n);
                    }
                    a[4 * i] += 1;
                    a[4 * i + 1] += v;
                    a[4 * i + 2] = Math.min(a[4 * i + 2], v);
                    a[4 * i + 3] = Math.max(a[4 * i + 3], v);
                }
            }
            return null;
        }, params.toArray());
    }

    /** Adds the cycle rollup's minutes in [fromMs, toMs) (both whole minutes) into buckets. */
    private void rollupBuckets(SeriesRef s, long fromMs, long toMs, long widthMs, java.util.TreeMap<Long, double[]> acc) {
        if (toMs <= fromMs) {
            return;
        }
        int n = s.fields().size();
        StringBuilder sql = new StringBuilder("SELECT ").append(q("minute"));
        for (String f : s.fields()) {
            for (String a : List.of("count", "sum", "min", "max")) {
                sql.append(", ").append(H2Rollup.col(f, a));
            }
        }
        sql.append(" FROM ").append(q(H2Rollup.CYCLE_TABLE)).append(" WHERE ").append(q("site")).append(" = ? AND ")
                .append(q("unit")).append(" = ? AND ").append(q("minute")).append(" >= ? AND ").append(q("minute"))
                .append(" < ?");
        query(sql.toString(), rs -> {
            while (rs.next()) {
                long index = (rs.getLong(1) - fromMs) / widthMs;
                double[] a = null;
                for (int i = 0; i < n; i++) {
                    long count = rs.getLong(2 + 4 * i);
                    if (count == 0) {
                        continue;
                    }
                    if (a == null) {
                        a = bucketAcc(acc, index, n);
                    }
                    a[4 * i] += count;
                    a[4 * i + 1] += rs.getDouble(3 + 4 * i);
                    a[4 * i + 2] = Math.min(a[4 * i + 2], rs.getDouble(4 + 4 * i));
                    a[4 * i + 3] = Math.max(a[4 * i + 3], rs.getDouble(5 + 4 * i));
                }
            }
            return null;
        }, s.site(), s.unit(), fromMs, toMs);
    }

    @Override
    public List<ClosureStats> closureStats(String site, String unit, Instant from, Instant to) {
        long fromMs = from.toEpochMilli();
        long toMs = to.toEpochMilli();
        // Per id: count, sum of residuals, sum of z, min z, max z, count outside.
        Map<String, double[]> acc = new java.util.TreeMap<>();
        long wholeFrom = H2Rollup.minuteOf(fromMs) == fromMs ? fromMs : H2Rollup.minuteOf(fromMs) + H2Rollup.MINUTE_MS;
        long wholeTo = H2Rollup.minuteOf(toMs);
        if (rollupQueries && wholeFrom < wholeTo) {
            // The partial minutes at either end raw, the whole minutes between them from the rollup.
            if (fromMs < wholeFrom) {
                rawClosures(site, unit, fromMs, wholeFrom, acc);
            }
            rollupClosures(site, unit, wholeFrom, wholeTo, acc);
            if (wholeTo < toMs) {
                rawClosures(site, unit, wholeTo, toMs, acc);
            }
        } else {
            rawClosures(site, unit, fromMs, toMs, acc);
        }
        List<ClosureStats> out = new ArrayList<>(acc.size());
        for (Map.Entry<String, double[]> e : acc.entrySet()) {
            double[] a = e.getValue();
            out.add(new ClosureStats(e.getKey(), (long) a[0], a[1] / a[0], a[2] / a[0], a[3], a[4], (long) a[5]));
        }
        return out;
    }

    private static double[] closureAcc(Map<String, double[]> acc, String id) {
        return acc.computeIfAbsent(id, k -> new double[] {0, 0, 0, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY,
            0});
    }

    private void rawClosures(String site, String unit, long fromMs, long toMs, Map<String, double[]> acc) {
        query("SELECT " + q("closure") + ", " + q("z") + ", " + q("residual_W") + " FROM " + q("closure")
                + " WHERE " + unitRange(), rs -> {
                    while (rs.next()) {
                        double[] a = closureAcc(acc, rs.getString(1));
                        double z = rs.getDouble(2);
                        a[0] += 1;
                        a[1] += rs.getDouble(3);
                        a[2] += z;
                        a[3] = Math.min(a[3], z);
                        a[4] = Math.max(a[4], z);
                        if (Math.abs(z) > ClosureStats.Z_LIMIT) {
                            a[5] += 1;
                        }
                    }
                    return null;
                }, site, unit, fromMs, toMs);
    }

    private void rollupClosures(String site, String unit, long fromMs, long toMs, Map<String, double[]> acc) {
        query("SELECT " + q("closure") + ", " + q("count") + ", " + q("residual_W_sum") + ", " + q("z_sum") + ", "
                + q("z_min") + ", " + q("z_max") + ", " + q("outside_count") + " FROM " + q(H2Rollup.CLOSURE_TABLE)
                + " WHERE " + q("site") + " = ? AND " + q("unit") + " = ? AND " + q("minute") + " >= ? AND "
                + q("minute") + " < ?", rs -> {
                    while (rs.next()) {
                        double[] a = closureAcc(acc, rs.getString(1));
                        a[0] += rs.getLong(2);
                        a[1] += rs.getDouble(3);
                        a[2] += rs.getDouble(4);
                        a[3] = Math.min(a[3], rs.getDouble(5));
                        a[4] = Math.max(a[4], rs.getDouble(6));
                        a[5] += rs.getLong(7);
                    }
                    return null;
                }, site, unit, fromMs, toMs);
    }

    @Override
    public List<SuspectSensor> suspects(String site, String unit, Instant from, Instant to) {
        return query(H2Suspects.query(), rs -> {
                    List<SuspectSensor> out = new ArrayList<>();
                    while (rs.next()) {
                        out.add(new SuspectSensor(rs.getString(1), rs.getLong(2), rs.getDouble(3)));
                    }
                    return out;
                }, site, unit, from.toEpochMilli(), to.toEpochMilli());
    }

    @Override
    public List<StoredAlarmEvent> alarmEvents(String site, String unit, Instant from, Instant to) {
        return query("SELECT * FROM " + q("alarms") + " WHERE " + unitRange() + " ORDER BY " + q("ts") + ", "
                + q("alarm"), this::alarms, site, unit, from.toEpochMilli(), to.toEpochMilli());
    }

    @Override
    public List<StoredAlarmEvent> lastAlarmEventsBefore(String site, String unit, Instant t) {
        return query("SELECT * FROM " + q("alarms") + " a WHERE a." + q("site") + " = ? AND a." + q("unit")
                + " = ? AND a." + q("ts") + " = (SELECT MAX(b." + q("ts") + ") FROM " + q("alarms") + " b WHERE b."
                + q("site") + " = a." + q("site") + " AND b." + q("unit") + " = a." + q("unit") + " AND b."
                + q("alarm") + " = a." + q("alarm") + " AND b." + q("ts") + " < ?) ORDER BY a." + q("alarm"),
                this::alarms, site, unit, t.toEpochMilli());
    }

    private List<StoredAlarmEvent> alarms(ResultSet rs) throws SQLException {
        List<StoredAlarmEvent> out = new ArrayList<>();
        while (rs.next()) {
            out.add(ResultPoints.alarmEvent(point(Measurement.ALARMS, rs)));
        }
        return out;
    }

    @Override
    public void close() {
        purger.shutdownNow();
        synchronized (writeConnection) {
            try {
                for (Connection c : allQueryConnections) {
                    c.close();
                }
                // Closing the connection closes its statements, the writer's prepared ones with it.
                writeConnection.close();
            } catch (SQLException e) {
                throw new StoreQueryException("closing the embedded store: " + e.getMessage(), e);
            }
        }
    }
}
