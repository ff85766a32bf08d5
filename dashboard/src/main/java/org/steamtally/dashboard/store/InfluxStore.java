package org.steamtally.dashboard.store;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import okhttp3.OkHttpClient;
import org.influxdb.InfluxDB;
import org.influxdb.InfluxDBException;
import org.influxdb.InfluxDBFactory;
import org.influxdb.dto.Query;
import org.influxdb.dto.QueryResult;

/**
 * The InfluxDB adapter: points as line protocol with millisecond timestamps, written over HTTP with
 * gzip through {@code org.influxdb:influxdb-java}, to InfluxDB 1.x or the 1.x-compatible
 * {@code /write} and {@code /query} endpoints of later versions. The schema is docs/STORE.md. A point
 * is unique by measurement, tag set and timestamp in InfluxDB, so a replayed point overwrites itself.
 *
 * <p>Batching and retry with backoff are the {@link SpooledStore}'s: this class sends one request per
 * batch and says whether a failure is worth retrying. Queries are InfluxQL; tag values and
 * identifiers are quoted and escaped here, timestamps are integers.
 */
public final class InfluxStore implements StoreBackend {

    /** Adapter name in meters and logs. */
    public static final String NAME = "influxdb";

    /**
     * Points per write: InfluxData's guidance for 1.x and 2.x is 5,000 lines of line protocol a
     * request ("Optimize writes to InfluxDB", docs.influxdata.com). Against a server that forces its
     * write-ahead log to disk on every request, a fleet's 9,600 points/s in writes of 1,000 could not
     * catch up once behind.
     */
    public static final int BATCH_POINTS = 5_000;

    private final InfluxSettings settings;
    private final InfluxDB influx;
    private volatile boolean databaseEnsured;

    private InfluxStore(InfluxSettings settings, InfluxDB influx) {
        this.settings = settings;
        this.influx = influx;
    }

    /** A client for the server; nothing is sent until the first write or query. */
    public static InfluxStore connect(InfluxSettings settings) {
        long ms = settings.timeout().toMillis();
        OkHttpClient.Builder http = new OkHttpClient.Builder()
                .connectTimeout(ms, TimeUnit.MILLISECONDS)
                .readTimeout(ms, TimeUnit.MILLISECONDS)
                .writeTimeout(ms, TimeUnit.MILLISECONDS);
        InfluxDB influx = settings.username().isEmpty()
                ? InfluxDBFactory.connect(settings.url(), http)
                : InfluxDBFactory.connect(settings.url(), settings.username(), settings.password(), http);
        influx.enableGzip();
        return new InfluxStore(settings, influx);
    }

    @Override
    public String name() {
        return NAME;
    }

    @Override
    public void write(List<Point> points) throws StoreUnavailableException, PointsRejectedException {
        List<String> lines = new ArrayList<>(points.size());
        for (Point p : points) {
            String line = LineProtocol.line(p);
            if (line != null) {
                lines.add(line);
            }
        }
        if (lines.isEmpty()) {
            return;
        }
        try {
            ensureDatabase();
            influx.write(settings.database(), settings.retentionPolicy(), InfluxDB.ConsistencyLevel.ONE,
                    TimeUnit.MILLISECONDS, lines);
        } catch (InfluxDBException.FieldTypeConflictException | InfluxDBException.UnableToParseException
                | InfluxDBException.PointsBeyondRetentionPolicyException e) {
            throw new PointsRejectedException("InfluxDB " + settings.url() + " refused " + lines.size() + " points: "
                    + e.getMessage(), e);
        } catch (InfluxDBException e) {
            if (e instanceof InfluxDBException.DatabaseNotFoundException) {
                databaseEnsured = false;
            }
            // Unreachable, overloaded, not authorised or without the database: all may be mended while
            // the points wait in the spool.
            throw new StoreUnavailableException("InfluxDB " + settings.url() + " write failed: " + e.getMessage(), e);
        }
    }

    private void ensureDatabase() {
        if (settings.createDatabase() && !databaseEnsured) {
            QueryResult r = influx.query(new Query("CREATE DATABASE " + ident(settings.database()), null, true));
            if (r.getError() != null) {
                throw new InfluxDBException(r.getError());
            }
            databaseEnsured = true;
        }
    }

    private static String ident(String s) {
        return '"' + s.replace("\\", "\\\\").replace("\"", "\\\"") + '"';
    }

    private static String literal(String s) {
        return '\'' + s.replace("\\", "\\\\").replace("'", "\\'") + '\'';
    }

    private String from(Measurement m) {
        String rp = settings.retentionPolicy().isEmpty() ? "" : ident(settings.retentionPolicy()) + ".";
        return rp + ident(m.measurementName());
    }

    private static String where(String site, String unit, Instant from, Instant to) {
        return ident(Measurement.SITE_TAG) + " = " + literal(site) + " AND " + ident(Measurement.UNIT_TAG) + " = "
                + literal(unit) + " AND time >= " + from.toEpochMilli() + "ms AND time < " + to.toEpochMilli() + "ms";
    }

    private List<QueryResult.Result> query(String influxQl) {
        QueryResult r;
        try {
            r = influx.query(new Query(influxQl, settings.database()), TimeUnit.MILLISECONDS);
        } catch (InfluxDBException e) {
            throw new StoreQueryException("InfluxDB " + settings.url() + " query failed: " + e.getMessage(), e);
        }
        if (r.getError() != null) {
            throw new StoreQueryException("InfluxDB query failed: " + r.getError() + " [" + influxQl + "]");
        }
        List<QueryResult.Result> results = r.getResults() == null ? List.of() : r.getResults();
        for (QueryResult.Result res : results) {
            if (res.getError() != null && res.getError().contains("database not found")) {
                // Nothing has been written yet: no data rather than an error.
                return List.of();
            }
        }
        for (QueryResult.Result res : results) {
            if (res.getError() != null) {
                throw new StoreQueryException("InfluxDB query failed: " + res.getError() + " [" + influxQl + "]");
            }
        }
        return results;
    }

    private static List<QueryResult.Series> series(List<QueryResult.Result> results, int statement) {
        if (results.size() <= statement || results.get(statement).getSeries() == null) {
            return List.of();
        }
        return results.get(statement).getSeries();
    }

    @Override
    public List<Point> points(Measurement m, String site, String unit, Instant from, Instant to) {
        List<Point> out = new ArrayList<>();
        for (QueryResult.Series s : series(query("SELECT * FROM " + from(m) + " WHERE " + where(site, unit, from, to)
                + " GROUP BY *"), 0)) {
            out.addAll(points(m, s));
        }
        out.sort(Comparator.comparing(Point::id).thenComparingLong(Point::timestampMs));
        return out;
    }

    private static List<Point> points(Measurement m, QueryResult.Series s) {
        Map<String, String> tags = s.getTags() == null ? Map.of() : s.getTags();
        List<String> columns = s.getColumns();
        int[] fieldColumn = new int[m.fields().size()];
        for (int f = 0; f < fieldColumn.length; f++) {
            fieldColumn[f] = columns.indexOf(m.fields().get(f).name());
        }
        List<Point> out = new ArrayList<>(s.getValues().size());
        for (List<Object> row : s.getValues()) {
            Object[] values = new Object[fieldColumn.length];
            for (int f = 0; f < fieldColumn.length; f++) {
                Object v = fieldColumn[f] < 0 ? null : row.get(fieldColumn[f]);
                values[f] = v == null ? null : switch (m.fields().get(f).type()) {
                    case DOUBLE -> ((Number) v).doubleValue();
                    case LONG -> ((Number) v).longValue();
                    case BOOLEAN -> (Boolean) v;
                    case STRING -> (String) v;
                };
            }
            out.add(new Point(m, tags.get(Measurement.SITE_TAG), tags.get(Measurement.UNIT_TAG),
                    m.hasIdTag() ? tags.getOrDefault(m.idTag(), "") : null, time(row), values));
        }
        return out;
    }

    private static long time(List<Object> row) {
        return ((Number) row.get(0)).longValue();
    }

    @Override
    public Map<String, List<Bucket>> buckets(SeriesRef s, Instant from, Instant to, Duration width) {
        long widthMs = width.toMillis();
        if (widthMs < 1) {
            throw new IllegalArgumentException("bucket width " + width + " must be at least 1 ms");
        }
        long offsetMs = Math.floorMod(from.toEpochMilli(), widthMs);
        StringBuilder q = new StringBuilder("SELECT ");
        for (int i = 0; i < s.fields().size(); i++) {
            String f = ident(s.fields().get(i));
            q.append(i == 0 ? "" : ", ").append("mean(").append(f).append("), min(").append(f).append("), max(")
                    .append(f).append("), count(").append(f).append(')');
        }
        q.append(" FROM ").append(from(s.measurement())).append(" WHERE ").append(where(s.site(), s.unit(), from, to));
        if (s.measurement().hasIdTag()) {
            q.append(" AND ").append(ident(s.measurement().idTag())).append(" = ").append(literal(s.id()));
        }
        q.append(" GROUP BY time(").append(widthMs).append("ms, ").append(offsetMs).append("ms) fill(none)");
        Map<String, List<Bucket>> out = new LinkedHashMap<>();
        s.fields().forEach(f -> out.put(f, new ArrayList<>()));
        for (QueryResult.Series series : series(query(q.toString()), 0)) {
            for (List<Object> row : series.getValues()) {
                Instant start = Instant.ofEpochMilli(time(row));
                for (int i = 0; i < s.fields().size(); i++) {
                    Object count = row.get(4 + 4 * i);
                    if (row.get(1 + 4 * i) != null && count != null && ((Number) count).longValue() > 0) {
                        out.get(s.fields().get(i)).add(new Bucket(start, num(row.get(1 + 4 * i)),
                                num(row.get(2 + 4 * i)), num(row.get(3 + 4 * i)), ((Number) count).longValue()));
                    }
                }
            }
        }
        return out;
    }

    private static double num(Object v) {
        return ((Number) v).doubleValue();
    }

    @Override
    public List<ClosureStats> closureStats(String site, String unit, Instant from, Instant to) {
        String z = ident("z");
        String range = " FROM " + from(Measurement.CLOSURE) + " WHERE " + where(site, unit, from, to);
        // Two requests: InfluxDB 1.6 answers a multi-statement query on a missing database with
        // "not executed" instead of "database not found".
        List<QueryResult.Result> all = query("SELECT count(" + z + "), mean(" + ident("residual_W") + "), mean(" + z
                + "), min(" + z + "), max(" + z + ")" + range + " GROUP BY " + ident("closure"));
        List<QueryResult.Result> outsideLimit = query("SELECT count(" + z + ")" + range + " AND (" + z + " > "
                + ClosureStats.Z_LIMIT + " OR " + z + " < -" + ClosureStats.Z_LIMIT + ") GROUP BY " + ident("closure"));
        Map<String, Long> outside = new HashMap<>();
        for (QueryResult.Series s : series(outsideLimit, 0)) {
            outside.put(s.getTags().get("closure"), ((Number) s.getValues().get(0).get(1)).longValue());
        }
        List<ClosureStats> out = new ArrayList<>();
        for (QueryResult.Series s : series(all, 0)) {
            String id = s.getTags().get("closure");
            List<Object> row = s.getValues().get(0);
            out.add(new ClosureStats(id, ((Number) row.get(1)).longValue(), num(row.get(2)), num(row.get(3)),
                    num(row.get(4)), num(row.get(5)), outside.getOrDefault(id, 0L)));
        }
        out.sort(Comparator.comparing(ClosureStats::id));
        return out;
    }

    @Override
    public List<SuspectSensor> suspects(String site, String unit, Instant from, Instant to) {
        List<SuspectSensor> out = new ArrayList<>();
        for (QueryResult.Series s : series(query("SELECT count(" + ident("suspect") + "), max(" + ident("test_value")
                + ") FROM " + from(Measurement.RECONCILIATION) + " WHERE " + where(site, unit, from, to) + " AND "
                + ident("suspect") + " = true GROUP BY " + ident("sensor")), 0)) {
            List<Object> row = s.getValues().get(0);
            out.add(new SuspectSensor(s.getTags().get("sensor"), ((Number) row.get(1)).longValue(), num(row.get(2))));
        }
        out.sort(Comparator.comparingLong(SuspectSensor::suspectCount).reversed()
                .thenComparing(Comparator.comparingDouble(SuspectSensor::maxTestValue).reversed())
                .thenComparing(SuspectSensor::sensorId));
        return out;
    }

    @Override
    public List<StoredAlarmEvent> alarmEvents(String site, String unit, Instant from, Instant to) {
        return alarms("SELECT * FROM " + from(Measurement.ALARMS) + " WHERE " + where(site, unit, from, to)
                + " GROUP BY *");
    }

    @Override
    public List<StoredAlarmEvent> lastAlarmEventsBefore(String site, String unit, Instant t) {
        return alarms("SELECT * FROM " + from(Measurement.ALARMS) + " WHERE " + ident(Measurement.SITE_TAG) + " = "
                + literal(site) + " AND " + ident(Measurement.UNIT_TAG) + " = " + literal(unit) + " AND time < "
                + t.toEpochMilli() + "ms GROUP BY * ORDER BY time DESC LIMIT 1");
    }

    private List<StoredAlarmEvent> alarms(String influxQl) {
        List<StoredAlarmEvent> out = new ArrayList<>();
        for (QueryResult.Series s : series(query(influxQl), 0)) {
            for (Point p : points(Measurement.ALARMS, s)) {
                out.add(ResultPoints.alarmEvent(p));
            }
        }
        out.sort(Comparator.comparing(StoredAlarmEvent::timestamp).thenComparing(StoredAlarmEvent::alarmId));
        return out;
    }

    @Override
    public void close() {
        influx.close();
    }
}
