package org.steamtally.dashboard.http;

import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.MeterRegistry;
import io.vertx.core.Context;
import io.vertx.core.Vertx;
import io.vertx.core.http.HttpServerResponse;
import io.vertx.ext.web.RoutingContext;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;
import org.steamtally.calc.cycle.UnitResult;
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
    private final AtomicReference<Encoded> lastEncoded = new AtomicReference<>();

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

        live.latest(unit).ifPresent(r -> sendEvent(resp, encoded(r), sentResults));
        LiveResults.Subscription results = live.subscribe(unit, r -> {
            String event = encoded(r);
            context.runOnContext(v -> sendEvent(resp, event, sentResults));
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
        sendEvent(resp, ServerSentEvents.event(event, Responses.safe(json)), counter);
    }

    private void sendEvent(HttpServerResponse resp, String event, Counter counter) {
        if (resp.closed()) {
            return;
        }
        if (resp.writeQueueFull()) {
            dropped.increment();
            return;
        }
        resp.write(event);
        counter.increment();
    }

    /**
     * The result's event text, written once per result however many clients watch the unit: the
     * listeners of one result run one after another on the publishing thread, so the last encoded
     * result is the one they ask for.
     */
    private String encoded(UnitResult r) {
        Encoded last = lastEncoded.get();
        if (last != null && last.result() == r) {
            return last.event();
        }
        String event = ServerSentEvents.event("result", Responses.safe(ResultJson.write(r)));
        lastEncoded.set(new Encoded(r, event));
        return event;
    }

    private record Encoded(UnitResult result, String event) {
    }
}
