package org.steamtally.deploy.daemon;

import io.vertx.core.Handler;
import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.Router;
import io.vertx.ext.web.RoutingContext;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.sim.Fault;
import org.steamtally.dashboard.http.ApiException;
import org.steamtally.dashboard.http.DashboardServer;
import org.steamtally.dashboard.http.Responses;

/**
 * The demo's fault injection, registered only by {@code demo}: {@code GET /api/v1/demo} (the sensors
 * that can be disturbed and the faults so far) and {@code POST /api/v1/demo/faults} with
 * {@code {"sensor": "FT-421", "kind": "bias", "size_sigma": 8, "duration_s": 300}} (operator login and
 * CSRF token, as for alarm actions). Sizes are in multiples of the sensor's standard uncertainty, so
 * one request means the same on a pressure and a flow.
 */
public final class DemoFaults implements DashboardServer.Extension {

    /** Longest fault the demo accepts: an hour is plenty to watch an alarm come and go. */
    public static final Duration MAX_DURATION = Duration.ofHours(1);
    static final List<String> KINDS = List.of("bias", "drift", "stuck", "spikes", "noise", "dropout");

    private final Map<String, PlantSimulation> simulations;
    private final Clock clock;

    /** @param simulations the simulated units by unit id */
    public DemoFaults(Map<String, PlantSimulation> simulations, Clock clock) {
        this.simulations = Map.copyOf(simulations);
        this.clock = clock;
    }

    @Override
    public void register(Router router, Handler<RoutingContext> operator) {
        router.get("/api/v1/demo").handler(this::describe);
        router.post("/api/v1/demo/faults").handler(operator).handler(this::inject);
    }

    private void describe(RoutingContext ctx) {
        JsonArray units = new JsonArray();
        simulations.forEach((id, sim) -> {
            JsonArray sensors = new JsonArray();
            sim.unit().sensors().stream().filter(s -> s.topic().isPresent()).forEach(s -> sensors.add(s.id()));
            JsonArray faults = new JsonArray();
            sim.simulator().faults().forEach(f -> faults.add(new JsonObject().put("sensor", f.sensorId())
                    .put("kind", f.kind()).put("start", f.start().toString())
                    .put("end", f.start().plus(f.duration()).toString())));
            units.add(new JsonObject().put("unit", id).put("sensors", sensors).put("faults", faults));
        });
        ctx.response().putHeader("Content-Type", "application/json; charset=utf-8")
                .end(Responses.safe(new JsonObject().put("kinds", new JsonArray(KINDS)).put("units", units).encode()));
    }

    private void inject(RoutingContext ctx) {
        JsonObject body;
        try {
            body = ctx.body().asJsonObject();
        } catch (RuntimeException e) {
            throw new ApiException(400, "the body must be a JSON object with sensor, kind, size_sigma and duration_s");
        }
        if (body == null) {
            throw new ApiException(400, "the body must be a JSON object with sensor, kind, size_sigma and duration_s");
        }
        Fault fault = fault(body, clock.instant());
        PlantSimulation sim = simulations.values().stream()
                .filter(s -> s.unit().sensor(fault.sensorId()).isPresent()).findFirst().orElseThrow();
        sim.simulator().addFault(fault);
        ctx.response().setStatusCode(201).putHeader("Content-Type", "application/json; charset=utf-8")
                .end(Responses.safe(new JsonObject().put("unit", sim.unit().id()).put("sensor", fault.sensorId())
                        .put("kind", fault.kind()).put("start", fault.start().toString())
                        .put("end", fault.start().plus(fault.duration()).toString()).encode()));
    }

    /** The fault a request asks for, starting at {@code now}; a 400 naming the field when it is wrong. */
    Fault fault(JsonObject body, Instant now) {
        String sensorId = text(body, "sensor");
        PlantSimulation sim = simulations.values().stream().filter(s -> s.unit().sensor(sensorId).isPresent())
                .findFirst().orElseThrow(() -> new ApiException(400, "sensor '" + sensorId
                        + "' is not a sensor of the simulated plant; GET /api/v1/demo lists them"));
        Sensor sensor = sim.unit().sensor(sensorId).orElseThrow();
        String kind = text(body, "kind").toLowerCase(Locale.ROOT);
        if (!KINDS.contains(kind)) {
            throw new ApiException(400, "kind '" + kind + "' is not one of " + KINDS);
        }
        double durationS = number(body, "duration_s", 1, MAX_DURATION.toSeconds());
        Duration duration = Duration.ofMillis(Math.round(durationS * 1000));
        double sigma = sim.simulator().sigmaOf(sensor.id());
        return switch (kind) {
            case "bias" -> new Fault.Bias(sensorId, now, duration, number(body, "size_sigma", -1000, 1000) * sigma);
            case "drift" -> new Fault.Drift(sensorId, now, duration,
                    number(body, "size_sigma", -1000, 1000) * sigma / 60.0);
            case "stuck" -> new Fault.Stuck(sensorId, now, duration, OptionalDouble.empty());
            case "spikes" -> new Fault.Spikes(sensorId, now, duration, number(body, "size_sigma", 0.1, 1000) * sigma,
                    0.1);
            case "noise" -> new Fault.NoiseIncrease(sensorId, now, duration, number(body, "size_sigma", 0, 1000));
            default -> new Fault.Dropout(sensorId, now, duration);
        };
    }

    private static String text(JsonObject body, String field) {
        Object v = body.getValue(field);
        if (!(v instanceof String s) || s.isBlank()) {
            throw new ApiException(400, "'" + field + "' must be a non-empty string");
        }
        return s;
    }

    private static double number(JsonObject body, String field, double min, double max) {
        Object v = body.getValue(field);
        if (!(v instanceof Number n) || !Double.isFinite(n.doubleValue()) || n.doubleValue() < min
                || n.doubleValue() > max) {
            throw new ApiException(400, "'" + field + "' must be a number from " + min + " to " + max + ", was " + v);
        }
        return n.doubleValue();
    }
}
