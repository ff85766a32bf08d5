package org.steamtally.dashboard.http;

import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.RoutingContext;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.dashboard.json.ResultJson;
import org.steamtally.dashboard.push.LiveResults;
import org.steamtally.dashboard.push.UnitStatus;

/** {@code /api/v1/units} and {@code /api/v1/units/{unit}/live}. */
final class UnitsResource {

    private final PlantDescription plant;
    private final LiveResults live;

    UnitsResource(PlantDescription plant, LiveResults live) {
        this.plant = plant;
        this.live = live;
    }

    void list(RoutingContext ctx) {
        JsonArray units = new JsonArray();
        for (UnitStatus u : live.units()) {
            units.add(new JsonObject()
                    .put("site", u.siteId())
                    .put("unit", u.unitId())
                    .put("name", u.name())
                    .put("status", u.freshness().key())
                    .put("last_result_ts", u.lastResult().map(ResultJson::timestamp).orElse(null))
                    .put("stale_after_s", u.staleAfter().toMillis() / 1000.0));
        }
        Responses.json(ctx, new JsonObject()
                .put("site", new JsonObject().put("id", plant.siteId()).put("name", plant.siteName()))
                .put("units", units));
    }

    void latest(RoutingContext ctx) {
        String unit = knownUnit(plant, ctx);
        UnitResult r = live.latest(unit).orElseThrow(() -> ApiException.notFound(
                "unit '" + unit + "' has no result yet; results arrive once its sensors report"));
        Responses.json(ctx, 200, ResultJson.write(r));
    }

    /** The path's unit id, or a 404 that names it and where the valid ones are listed. */
    static String knownUnit(PlantDescription plant, RoutingContext ctx) {
        String unit = ctx.pathParam("unit");
        if (plant.unit(unit).isEmpty()) {
            throw ApiException.notFound("unit '" + unit + "' is not in the plant description; GET /api/v1/units lists "
                    + "the units");
        }
        return unit;
    }
}
