package org.steamtally.dashboard.http;

import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.RoutingContext;
import org.steamtally.dashboard.push.LiveResults;
import org.steamtally.dashboard.push.UnitStatus;

/**
 * {@code /health/live} (the server answers) and {@code /health/ready} (every unit has a fresh
 * result); {@code /health} gives both.
 */
final class HealthResource {

    private final LiveResults live;

    HealthResource(LiveResults live) {
        this.live = live;
    }

    void liveness(RoutingContext ctx) {
        Responses.json(ctx, new JsonObject().put("status", "up"));
    }

    void readiness(RoutingContext ctx) {
        JsonObject body = readinessBody();
        Responses.json(ctx, body.getBoolean("ready") ? 200 : 503, body.encode());
    }

    void both(RoutingContext ctx) {
        JsonObject ready = readinessBody();
        Responses.json(ctx, ready.getBoolean("ready") ? 200 : 503,
                new JsonObject().put("live", new JsonObject().put("status", "up")).put("ready", ready).encode());
    }

    private JsonObject readinessBody() {
        JsonObject units = new JsonObject();
        boolean ready = true;
        for (UnitStatus u : live.units()) {
            units.put(u.unitId(), u.freshness().key());
            ready &= u.freshness() == UnitStatus.Freshness.LIVE;
        }
        return new JsonObject().put("ready", ready).put("units", units);
    }
}
