package org.steamtally.dashboard.http;

import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import org.steamtally.dashboard.alarm.AlarmView;
import org.steamtally.dashboard.json.ResultJson;

/** The JSON form of an alarm, shared by the alarms list and the live stream. */
public final class AlarmJson {

    private AlarmJson() {
    }

    public static JsonObject of(AlarmView a) {
        return new JsonObject()
                .put("id", a.id())
                .put("unit", a.unitId())
                .put("priority", a.priority().key())
                .put("state", a.state().key())
                .put("message", a.message())
                .put("since", ResultJson.timestamp(a.since()))
                .put("sensor", a.sensorId().orElse(null))
                .put("bias_si", a.biasSi().isPresent() ? a.biasSi().getAsDouble() : null)
                .put("bias_unit", a.biasUnit().orElse(null))
                .put("balances", new JsonArray(a.balances()))
                .put("shelved_until", a.shelvedUntil().map(ResultJson::timestamp).orElse(null))
                .put("shelve_reason", a.shelveReason().orElse(null));
    }
}
