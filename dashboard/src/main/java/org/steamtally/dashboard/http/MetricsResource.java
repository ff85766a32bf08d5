package org.steamtally.dashboard.http;

import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import io.vertx.ext.web.RoutingContext;

/** {@code /metrics}: every meter of the registry in the Prometheus text format. */
final class MetricsResource {

    /** Prometheus text exposition format 0.0.4. */
    private static final String CONTENT_TYPE = "text/plain; version=0.0.4; charset=utf-8";

    private final PrometheusMeterRegistry registry;

    MetricsResource(PrometheusMeterRegistry registry) {
        this.registry = registry;
    }

    void get(RoutingContext ctx) {
        ctx.response().putHeader("Content-Type", CONTENT_TYPE).end(registry.scrape());
    }
}
