package org.steamtally.dashboard.http;

import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.RoutingContext;
import java.time.Duration;
import java.time.InstantSource;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.dashboard.alarm.AlarmBoard;
import org.steamtally.dashboard.alarm.AlarmView;
import org.steamtally.dashboard.security.AuditEntry;
import org.steamtally.dashboard.security.AuditLog;
import org.steamtally.dashboard.security.Session;

/**
 * {@code /api/v1/units/{unit}/alarms} (list) and {@code /api/v1/alarms/{id}/…} (acknowledge, shelve,
 * unshelve). The actions run only behind {@link Access#operator}; each writes one audit entry.
 */
final class AlarmsResource {

    private final PlantDescription plant;
    private final AlarmBoard board;
    private final AuditLog audit;
    private final InstantSource clock;

    AlarmsResource(PlantDescription plant, AlarmBoard board, AuditLog audit, InstantSource clock) {
        this.plant = plant;
        this.board = board;
        this.audit = audit;
        this.clock = clock;
    }

    void list(RoutingContext ctx) {
        String unit = UnitsResource.knownUnit(plant, ctx);
        JsonArray out = new JsonArray();
        board.list(unit).forEach(a -> out.add(AlarmJson.of(a)));
        Responses.json(ctx, new JsonObject().put("unit", unit).put("alarms", out));
    }

    void acknowledge(RoutingContext ctx) {
        Session s = Access.session(ctx).orElseThrow();
        String id = ctx.pathParam("id");
        AlarmView a = board.acknowledge(id, s.user());
        audit.record(new AuditEntry(clock.instant(), s.user(), "alarm.acknowledge", id, ""));
        Responses.json(ctx, AlarmJson.of(a));
    }

    void shelve(RoutingContext ctx) {
        Session s = Access.session(ctx).orElseThrow();
        String id = ctx.pathParam("id");
        JsonObject body = Bodies.object(ctx);
        double minutes = Bodies.requiredNumber(body, "duration_min");
        if (!(minutes >= 1 && minutes <= 24 * 60) || minutes != Math.rint(minutes)) {
            throw ApiException.badRequest("field 'duration_min' must be a whole number of minutes from 1 to 1440, was "
                    + minutes);
        }
        String reason = Bodies.requiredString(body, "reason", 500);
        AlarmView a = board.shelve(id, Duration.ofMinutes((long) minutes), reason, s.user());
        audit.record(new AuditEntry(clock.instant(), s.user(), "alarm.shelve", id,
                (long) minutes + " min: " + reason));
        Responses.json(ctx, AlarmJson.of(a));
    }

    void unshelve(RoutingContext ctx) {
        Session s = Access.session(ctx).orElseThrow();
        String id = ctx.pathParam("id");
        AlarmView a = board.unshelve(id, s.user());
        audit.record(new AuditEntry(clock.instant(), s.user(), "alarm.unshelve", id, ""));
        Responses.json(ctx, AlarmJson.of(a));
    }
}
