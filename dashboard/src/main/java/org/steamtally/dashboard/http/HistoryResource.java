package org.steamtally.dashboard.http;

import io.vertx.core.Vertx;
import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.RoutingContext;
import java.time.Duration;
import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.Callable;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.dashboard.store.Bucket;
import org.steamtally.dashboard.store.ClosureStats;
import org.steamtally.dashboard.store.Measurement;
import org.steamtally.dashboard.store.SeriesRef;
import org.steamtally.dashboard.store.Shift;
import org.steamtally.dashboard.store.ShiftSummary;
import org.steamtally.dashboard.store.StoredAlarmEvent;
import org.steamtally.dashboard.store.SuspectSensor;

/**
 * {@code /api/v1/units/{unit}/trends}, {@code .../shifts} and {@code .../alarms/history}: the views
 * that read the result store. Parameters are checked on the event loop; the store's queries, which
 * block, run on a worker. Without a store the answer is 501 with a message saying so.
 */
final class HistoryResource {

    /** The series a trend can ask for, as in the OpenAPI document. */
    static final Set<String> SERIES = Set.of("thermal_efficiency", "heat_rate_kJ_per_kWh", "net_work_W",
            "closure_residual_W", "reconciled_minus_measured");

    /** Cycle fields that are series of their own. */
    private static final Set<String> CYCLE_SERIES = Set.of("thermal_efficiency", "heat_rate_kJ_per_kWh", "net_work_W");

    private static final Duration MAX_RANGE = Duration.ofDays(366);

    /** More points than a chart a few thousand pixels wide can show; the request names a wider bucket. */
    static final long MAX_BUCKETS = 5_000;

    /** Buckets per trend when the request names no width: about one per two pixels of a wide chart. */
    static final long DEFAULT_BUCKETS = 720;

    /** Shift summaries per request: a month of three shifts a day, with room. */
    static final int MAX_SHIFTS = 100;

    /** Alarm events per request; more are cut and the answer says so. */
    static final int MAX_ALARM_EVENTS = 10_000;

    /** Suspect sensors whose reconciled − measured a trend shows. */
    static final int MAX_SUSPECTS = 5;

    /** The closure band is ±k·σ with k = 2 (about 95 % of residuals when the balance holds; {@link ClosureStats#Z_LIMIT}). */
    static final double BAND_K = ClosureStats.Z_LIMIT;

    private final Vertx vertx;
    private final PlantDescription plant;
    private final Optional<DashboardSources.History> history;

    HistoryResource(Vertx vertx, PlantDescription plant, Optional<DashboardSources.History> history) {
        this.vertx = vertx;
        this.plant = plant;
        this.history = history;
    }

    // ------------------------------------------------------------------ trends

    void trends(RoutingContext ctx) {
        String unit = UnitsResource.knownUnit(plant, ctx);
        String seriesParam = ctx.queryParams().get("series");
        if (seriesParam == null || seriesParam.isBlank()) {
            throw ApiException.badRequest("query parameter 'series' is required, one or more of " + sorted(SERIES)
                    + " separated by commas");
        }
        Set<String> series = new LinkedHashSet<>();
        for (String s : seriesParam.split(",")) {
            if (!SERIES.contains(s)) {
                throw ApiException.badRequest("query parameter 'series': unknown series '" + s + "'; expected one of "
                        + sorted(SERIES));
            }
            series.add(s);
        }
        Instant[] range = range(ctx);
        Instant from = range[0];
        Instant to = range[1];
        Duration span = Duration.between(from, to);
        String bucketParam = ctx.queryParams().get("bucket");
        Duration bucket;
        if (bucketParam == null) {
            long ms = Math.max(1000, ceilDiv(span.toMillis(), DEFAULT_BUCKETS));
            bucket = Duration.ofSeconds(ceilDiv(ms, 1000));
        } else {
            try {
                bucket = Duration.parse(bucketParam);
            } catch (DateTimeParseException e) {
                throw ApiException.badRequest("query parameter 'bucket' must be an ISO-8601 duration such as PT1M, was '"
                        + bucketParam + "'");
            }
            if (bucket.isNegative() || bucket.isZero()) {
                throw ApiException.badRequest("query parameter 'bucket' must be positive, was " + bucketParam);
            }
            if (bucket.toMillis() < 1000) {
                throw ApiException.badRequest("query parameter 'bucket' must be at least PT1S, was " + bucketParam);
            }
            long count = ceilDiv(span.toMillis(), bucket.toMillis());
            if (count > MAX_BUCKETS) {
                Duration least = Duration.ofSeconds(ceilDiv(ceilDiv(span.toMillis(), MAX_BUCKETS), 1000));
                throw ApiException.badRequest("query parameter 'bucket' " + bucketParam + " gives " + count
                        + " buckets from " + from + " to " + to + "; at most " + MAX_BUCKETS
                        + " are served, so choose a bucket of at least " + least + " or a shorter range");
            }
        }
        String closure = Optional.ofNullable(ctx.queryParams().get("closure")).orElse("cycle");
        DashboardSources.History h = store("trends are");
        String site = plant.siteId();
        Duration width = bucket;
        blocking(ctx, () -> {
            JsonObject out = new JsonObject();
            if (series.stream().anyMatch(CYCLE_SERIES::contains)) {
                String[] fields = series.stream().filter(CYCLE_SERIES::contains).toArray(String[]::new);
                Map<String, List<Bucket>> b = h.store().series(SeriesRef.cycle(site, unit, fields), from, to, width);
                for (String f : fields) {
                    out.put(f, new JsonObject().put("unit", cycleUnit(f)).put("buckets", buckets(b.get(f))));
                }
            }
            if (series.contains("closure_residual_W")) {
                Map<String, List<Bucket>> b = h.store().series(
                        SeriesRef.of(Measurement.CLOSURE, site, unit, closure, "residual_W", "sigma_W"), from, to, width);
                out.put("closure_residual_W", new JsonObject().put("closure", closure).put("unit", "W")
                        .put("k", BAND_K).put("buckets", closureBuckets(b.get("residual_W"), b.get("sigma_W"))));
            }
            if (series.contains("reconciled_minus_measured")) {
                JsonArray sensors = new JsonArray();
                List<SuspectSensor> suspects = h.store().suspects(site, unit, from, to);
                for (SuspectSensor s : suspects.subList(0, Math.min(MAX_SUSPECTS, suspects.size()))) {
                    Map<String, List<Bucket>> b = h.store().series(SeriesRef.of(Measurement.RECONCILIATION, site, unit,
                            s.sensorId(), "reconciled", "measured"), from, to, width);
                    sensors.add(new JsonObject().put("sensor", s.sensorId()).put("suspect_count", s.suspectCount())
                            .put("max_test_value", s.maxTestValue())
                            .put("unit", plant.unit(unit).flatMap(u -> u.sensors().stream()
                                    .filter(x -> x.id().equals(s.sensorId())).findFirst())
                                    .map(x -> x.quantity().siUnit()).orElse(null))
                            .put("buckets", differenceBuckets(b.get("reconciled"), b.get("measured"))));
                }
                out.put("reconciled_minus_measured", new JsonObject().put("sensors", sensors));
            }
            return new JsonObject().put("site", site).put("unit", unit).put("from", from.toString())
                    .put("to", to.toString()).put("bucket", width.toString()).put("bucket_s", width.toMillis() / 1000.0)
                    .put("series", out);
        });
    }

    private static String cycleUnit(String field) {
        return switch (field) {
            case "net_work_W" -> "W";
            case "heat_rate_kJ_per_kWh" -> "kJ/kWh";
            default -> "1";
        };
    }

    private static JsonArray buckets(List<Bucket> list) {
        JsonArray a = new JsonArray();
        for (Bucket b : list == null ? List.<Bucket>of() : list) {
            a.add(new JsonObject().put("t", b.start().toString()).put("mean", b.mean()).put("min", b.min())
                    .put("max", b.max()).put("count", b.count()));
        }
        return a;
    }

    /** Residual buckets with the mean σ of the same bucket, for the ±k·σ band. */
    private static JsonArray closureBuckets(List<Bucket> residual, List<Bucket> sigma) {
        Map<Instant, Bucket> s = byStart(sigma);
        JsonArray a = new JsonArray();
        for (Bucket b : residual == null ? List.<Bucket>of() : residual) {
            JsonObject o = new JsonObject().put("t", b.start().toString()).put("mean", b.mean()).put("min", b.min())
                    .put("max", b.max()).put("count", b.count());
            Bucket sb = s.get(b.start());
            o.put("sigma_mean", sb == null ? null : sb.mean());
            a.add(o);
        }
        return a;
    }

    /**
     * Mean reconciled less mean measured per bucket. Both fields are in every sensor point, so the
     * difference of the means is the mean of the differences; its extremes are not known and not given.
     */
    private static JsonArray differenceBuckets(List<Bucket> reconciled, List<Bucket> measured) {
        Map<Instant, Bucket> m = byStart(measured);
        JsonArray a = new JsonArray();
        for (Bucket r : reconciled == null ? List.<Bucket>of() : reconciled) {
            Bucket mb = m.get(r.start());
            if (mb != null) {
                a.add(new JsonObject().put("t", r.start().toString()).put("mean", r.mean() - mb.mean())
                        .put("count", r.count()));
            }
        }
        return a;
    }

    private static Map<Instant, Bucket> byStart(List<Bucket> list) {
        Map<Instant, Bucket> m = new LinkedHashMap<>();
        for (Bucket b : list == null ? List.<Bucket>of() : list) {
            m.put(b.start(), b);
        }
        return m;
    }

    // ------------------------------------------------------------------ shifts

    void shifts(RoutingContext ctx) {
        String unit = UnitsResource.knownUnit(plant, ctx);
        Instant[] range = range(ctx);
        String format = Optional.ofNullable(ctx.queryParams().get("format")).orElse("json");
        if (!format.equals("json") && !format.equals("csv")) {
            throw ApiException.badRequest("query parameter 'format' must be 'json' or 'csv', was '" + format + "'");
        }
        DashboardSources.History h = store("shift summaries are");
        // Every shift that starts in the range; those that have not started by the store's clock are
        // dropped once summarised (their summary ends where they start).
        List<Shift> shifts = new ArrayList<>();
        Shift s = h.shifts().shiftContaining(range[0]);
        if (s.start().isBefore(range[0])) {
            s = h.shifts().next(s);
        }
        while (s.start().isBefore(range[1])) {
            if (shifts.size() == MAX_SHIFTS) {
                throw ApiException.badRequest("the range from " + range[0] + " to " + range[1] + " holds more than "
                        + MAX_SHIFTS + " shifts; ask for a shorter range ('from', 'to')");
            }
            shifts.add(s);
            s = h.shifts().next(s);
        }
        String site = plant.siteId();
        String zone = h.shifts().zone().getId();
        if (format.equals("csv")) {
            String file = "steamtally-" + fileSafe(site) + "-" + fileSafe(unit) + "-shifts-" + fileStamp(range[0]) + "-"
                    + fileStamp(range[1]) + ".csv";
            vertx.executeBlocking(() -> ShiftCsv.write(summaries(h, site, unit, shifts), zone), false)
                    .onSuccess(csv -> ctx.response().putHeader("Content-Type", "text/csv; charset=utf-8")
                            .putHeader("Content-Disposition", "attachment; filename=\"" + file + "\"").end(csv))
                    .onFailure(ctx::fail);
            return;
        }
        blocking(ctx, () -> {
            JsonArray a = new JsonArray();
            for (ShiftSummary sum : summaries(h, site, unit, shifts)) {
                a.add(ShiftJson.write(sum));
            }
            return new JsonObject().put("site", site).put("unit", unit).put("zone", zone)
                    .put("from", range[0].toString()).put("to", range[1].toString()).put("shifts", a);
        });
    }

    private static List<ShiftSummary> summaries(DashboardSources.History h, String site, String unit,
            List<Shift> shifts) {
        List<ShiftSummary> out = new ArrayList<>(shifts.size());
        for (Shift s : shifts) {
            ShiftSummary sum = h.store().shiftSummary(site, unit, s);
            if (sum.until().isAfter(s.start())) {
                out.add(sum);
            }
        }
        return out;
    }

    /** Letters, digits, dot, dash and underscore; anything else becomes an underscore. */
    static String fileSafe(String s) {
        return s.replaceAll("[^A-Za-z0-9._-]", "_");
    }

    private static String fileStamp(Instant t) {
        return t.toString().replace(":", "").replace("-", "").replaceAll("\\.\\d+", "");
    }

    // ------------------------------------------------------------------ alarm history

    void alarmHistory(RoutingContext ctx) {
        String unit = UnitsResource.knownUnit(plant, ctx);
        Instant[] range = range(ctx);
        DashboardSources.History h = store("alarm history is");
        String site = plant.siteId();
        blocking(ctx, () -> {
            List<StoredAlarmEvent> events = h.store().alarmHistory(site, unit, range[0], range[1]);
            JsonArray a = new JsonArray();
            for (StoredAlarmEvent e : events.subList(0, Math.min(events.size(), MAX_ALARM_EVENTS))) {
                a.add(new JsonObject().put("ts", e.timestamp().toString()).put("alarm", e.alarmId())
                        .put("kind", e.kind()).put("priority", e.priority()).put("old_state", e.oldState())
                        .put("new_state", e.newState()).put("active", e.active())
                        .put("value", e.value().isPresent() ? e.value().getAsDouble() : null)
                        .put("limit", e.limit().isPresent() ? e.limit().getAsDouble() : null)
                        .put("user", e.user().orElse(null)).put("note", e.note().orElse(null)));
            }
            return new JsonObject().put("site", site).put("unit", unit).put("from", range[0].toString())
                    .put("to", range[1].toString()).put("truncated", events.size() > MAX_ALARM_EVENTS)
                    .put("events", a);
        });
    }

    // ------------------------------------------------------------------ common

    private DashboardSources.History store(String what) {
        return history.orElseThrow(() -> new ApiException(501, "no result store is connected to this dashboard, so "
                + what + " not available; the live views work without one"));
    }

    private void blocking(RoutingContext ctx, Callable<JsonObject> query) {
        vertx.executeBlocking(query, false).onSuccess(body -> Responses.json(ctx, body)).onFailure(ctx::fail);
    }

    private static Instant[] range(RoutingContext ctx) {
        Instant from = instant(ctx, "from");
        Instant to = instant(ctx, "to");
        if (!from.isBefore(to)) {
            throw ApiException.badRequest("query parameter 'from' (" + from + ") must be before 'to' (" + to + ")");
        }
        if (Duration.between(from, to).compareTo(MAX_RANGE) > 0) {
            throw ApiException.badRequest("the range from " + from + " to " + to + " is longer than 366 days");
        }
        return new Instant[] {from, to};
    }

    private static Instant instant(RoutingContext ctx, String name) {
        String v = ctx.queryParams().get(name);
        if (v == null) {
            throw ApiException.badRequest("query parameter '" + name + "' is required, an ISO-8601 instant such as "
                    + "2026-12-01T06:00:00Z");
        }
        try {
            return Instant.parse(v);
        } catch (DateTimeParseException e) {
            throw ApiException.badRequest("query parameter '" + name + "' must be an ISO-8601 instant such as "
                    + "2026-12-01T06:00:00Z, was '" + v + "'");
        }
    }

    private static long ceilDiv(long a, long b) {
        return -Math.floorDiv(-a, b);
    }

    private static List<String> sorted(Set<String> s) {
        return s.stream().sorted().toList();
    }
}
