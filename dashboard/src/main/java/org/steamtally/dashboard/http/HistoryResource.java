package org.steamtally.dashboard.http;

import io.vertx.ext.web.RoutingContext;
import java.time.Duration;
import java.time.Instant;
import java.time.format.DateTimeParseException;
import java.util.List;
import java.util.Set;
import org.steamtally.calc.plant.PlantDescription;

/**
 * {@code /api/v1/units/{unit}/trends} and {@code /api/v1/units/{unit}/shifts}: their parameters are
 * checked now, and until a store is connected the answer is 501 with a message saying so.
 */
final class HistoryResource {

    /** The series a trend can ask for, as in the OpenAPI document. */
    static final Set<String> SERIES = Set.of("thermal_efficiency", "heat_rate_kJ_per_kWh", "net_work_W",
            "closure_residual_W", "reconciled_minus_measured");

    private static final Duration MAX_RANGE = Duration.ofDays(366);

    private final PlantDescription plant;

    HistoryResource(PlantDescription plant) {
        this.plant = plant;
    }

    void trends(RoutingContext ctx) {
        UnitsResource.knownUnit(plant, ctx);
        String series = ctx.queryParams().get("series");
        if (series == null || series.isBlank()) {
            throw ApiException.badRequest("query parameter 'series' is required, one or more of " + sorted(SERIES)
                    + " separated by commas");
        }
        for (String s : series.split(",")) {
            if (!SERIES.contains(s)) {
                throw ApiException.badRequest("unknown series '" + s + "'; expected one of " + sorted(SERIES));
            }
        }
        range(ctx);
        String bucket = ctx.queryParams().get("bucket");
        if (bucket != null) {
            try {
                Duration b = Duration.parse(bucket);
                if (b.isNegative() || b.isZero()) {
                    throw ApiException.badRequest("query parameter 'bucket' must be positive, was " + bucket);
                }
            } catch (DateTimeParseException e) {
                throw ApiException.badRequest("query parameter 'bucket' must be an ISO-8601 duration such as PT1M, was '"
                        + bucket + "'");
            }
        }
        throw notConnected("trends");
    }

    void shifts(RoutingContext ctx) {
        UnitsResource.knownUnit(plant, ctx);
        range(ctx);
        String format = ctx.queryParams().get("format");
        if (format != null && !format.equals("json") && !format.equals("csv")) {
            throw ApiException.badRequest("query parameter 'format' must be 'json' or 'csv', was '" + format + "'");
        }
        throw notConnected("shift summaries");
    }

    private static void range(RoutingContext ctx) {
        Instant from = instant(ctx, "from");
        Instant to = instant(ctx, "to");
        if (!from.isBefore(to)) {
            throw ApiException.badRequest("'from' (" + from + ") must be before 'to' (" + to + ")");
        }
        if (Duration.between(from, to).compareTo(MAX_RANGE) > 0) {
            throw ApiException.badRequest("the range from " + from + " to " + to + " is longer than 366 days");
        }
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

    private static ApiException notConnected(String what) {
        return new ApiException(501, "no result store is connected to this dashboard, so " + what
                + " are not available; the live views work without one");
    }

    private static List<String> sorted(Set<String> s) {
        return s.stream().sorted().toList();
    }
}
