package org.steamtally.dashboard.http;

import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import io.vertx.core.Vertx;
import io.vertx.ext.web.RoutingContext;

/**
 * {@code /metrics}: every meter of the registry in the Prometheus text format. The text is written on
 * a worker thread, not the event loop: with a hundred units the registry holds meters of thousands of
 * sensors and writing them took seconds on a loaded machine, during which no live stream was served
 * (docs/PERFORMANCE.md, fleet benchmark).
 */
final class MetricsResource {

    /** Prometheus text exposition format 0.0.4. */
    private static final String CONTENT_TYPE = "text/plain; version=0.0.4; charset=utf-8";

    private final Vertx vertx;
    private final PrometheusMeterRegistry registry;

    MetricsResource(Vertx vertx, PrometheusMeterRegistry registry) {
        this.vertx = vertx;
        this.registry = registry;
    }

    void get(RoutingContext ctx) {
        // unordered: concurrent scrapes need not queue behind each other
        vertx.executeBlocking(registry::scrape, false)
                .onSuccess(text -> ctx.response().putHeader("Content-Type", CONTENT_TYPE).end(text))
                .onFailure(ctx::fail);
    }
}
