package org.steamtally.dashboard.http;

import io.vertx.ext.web.RoutingContext;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.dashboard.view.PlantJson;

/** {@code /api/v1/plant}: the plant description, read-only, from an allow-list of fields. */
final class PlantResource {

    private final String body;

    PlantResource(PlantDescription plant) {
        this.body = PlantJson.plant(plant).encode();
    }

    void get(RoutingContext ctx) {
        Responses.json(ctx, 200, body);
    }
}
