package org.steamtally.dashboard.http;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import io.vertx.core.Context;
import io.vertx.core.Vertx;
import io.vertx.core.http.HttpServerResponse;
import io.vertx.ext.web.RoutingContext;
import java.util.concurrent.atomic.AtomicInteger;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.dashboard.alarm.AlarmBoard;
import org.steamtally.dashboard.json.ResultJson;
import org.steamtally.dashboard.push.LiveResults;
import org.steamtally.dashboard.push.ServerSentEvents;

/**
 * {@code /api/v1/units/{unit}/stream}: Server-Sent Events with the unit's result records
 * ({@code event: result}, the result JSON) and alarm changes ({@code event: alarm}). The latest result,
 * when there is one, is sent first. A client that cannot keep up misses results rather than delaying
 * the others: each is a full record, so the next one replaces what was missed.
 */
final class StreamResource {

    private static final long KEEPALIVE_MS = 15_000;

    private final Vertx vertx;
    private final PlantDescription plant;
    private final LiveResults live;
    private final AlarmBoard alarms;
    private final AtomicInteger clients;
    private final Counter sentResults;
    private final Counter sentAlarms;
    private final Counter dropped;

    StreamResource(Vertx vertx, PlantDescription plant, LiveResults live, AlarmBoard alarms, MeterRegistry meters) {
        this.vertx = vertx;
        this.plant = plant;
        this.live = live;
        this.alarms = alarms;
        this.clients = meters.gauge("steamtally.dashboard.stream.clients", new AtomicInteger());
        this.sentResults = meters.counter("steamtally.dashboard.stream.events", "type", "result");
        this.sentAlarms = meters.counter("steamtally.dashboard.stream.events", "type", "alarm");
        this.dropped = meters.counter("steamtally.dashboard.stream.dropped");
    }

    void open(RoutingContext ctx) {
        String unit = UnitsResource.knownUnit(plant, ctx);
        HttpServerResponse resp = ctx.response();
        resp.setChunked(true)
                .putHeader("Content-Type", "text/event-stream; charset=utf-8")
                .putHeader("Cache-Control", "no-store")
                .putHeader("X-Accel-Buffering", "no");
        resp.write(ServerSentEvents.comment("stream of unit " + unit));
        Context context = vertx.getOrCreateContext();
        clients.incrementAndGet();

        live.latest(unit).ifPresent(r -> send(resp, "result", ResultJson.write(r), sentResults));
        LiveResults.Subscription results = live.subscribe(unit, r -> {
            String json = ResultJson.write(r);
            context.runOnContext(v -> send(resp, "result", json, sentResults));
        });
        LiveResults.Subscription alarmChanges = alarms.subscribe(unit, a -> {
            String json = AlarmJson.of(a).encode();
            context.runOnContext(v -> send(resp, "alarm", json, sentAlarms));
        });
        long timer = vertx.setPeriodic(KEEPALIVE_MS, id -> {
            if (!resp.closed() && !resp.writeQueueFull()) {
                resp.write(ServerSentEvents.comment("keepalive"));
            }
        });
        resp.closeHandler(v -> {
            results.close();
            alarmChanges.close();
            vertx.cancelTimer(timer);
            clients.decrementAndGet();
        });
    }

    private void send(HttpServerResponse resp, String event, String json, Counter counter) {
        if (resp.closed()) {
            return;
        }
        if (resp.writeQueueFull()) {
            dropped.increment();
            return;
        }
        resp.write(ServerSentEvents.event(event, Responses.safe(json)));
        counter.increment();
    }
}
