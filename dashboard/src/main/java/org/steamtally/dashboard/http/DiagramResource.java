package org.steamtally.dashboard.http;

import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.RoutingContext;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.dashboard.push.LiveResults;
import org.steamtally.dashboard.view.TsDiagram;

/**
 * {@code /api/v1/units/{unit}/ts-diagram}: the saturation dome and the isobars of the unit's present
 * pressures (those of its latest result's states), computed with IF97 for the page to draw.
 */
final class DiagramResource {

    /** Pressures closer than this fraction draw as one line. */
    private static final double PRESSURE_GAP = 0.08;

    private final PlantDescription plant;
    private final LiveResults live;
    private final JsonArray dome;
    private final Map<Double, JsonObject> isobars = new ConcurrentHashMap<>();

    DiagramResource(PlantDescription plant, LiveResults live) {
        this.plant = plant;
        this.live = live;
        this.dome = points(TsDiagram.dome());
    }

    void get(RoutingContext ctx) {
        String unit = UnitsResource.knownUnit(plant, ctx);
        List<Double> pressures = new ArrayList<>();
        live.latest(unit).ifPresent(r -> {
            for (StateResult s : r.states()) {
                s.pressurePa().ifPresent(pressures::add);
            }
        });
        JsonArray lines = new JsonArray();
        for (double p : TsDiagram.distinctPressures(pressures, PRESSURE_GAP)) {
            // Rounded to three significant digits so that a drifting pressure reuses its line.
            double key = Double.parseDouble(String.format(java.util.Locale.ROOT, "%.3g", p));
            if (key < 700.0 || key > 100e6) {
                continue;
            }
            lines.add(isobars.computeIfAbsent(key, k -> {
                TsDiagram.Isobar i = TsDiagram.isobar(k);
                return new JsonObject().put("p_Pa", k).put("points", points(i.points()));
            }));
        }
        Responses.json(ctx, new JsonObject().put("unit", unit).put("dome", dome).put("isobars", lines));
    }

    private static JsonArray points(List<TsDiagram.Point> pts) {
        JsonArray a = new JsonArray();
        for (TsDiagram.Point p : pts) {
            a.add(new JsonArray().add(round(p.entropyJPerKgK())).add(round(p.temperatureK())));
        }
        return a;
    }

    /** Six significant digits: far finer than a pixel on any screen, and a third of the bytes. */
    private static double round(double v) {
        return Double.parseDouble(String.format(java.util.Locale.ROOT, "%.6g", v));
    }
}
