package org.steamtally.dashboard.http;

import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import java.util.OptionalDouble;
import org.steamtally.dashboard.store.ClosureStats;
import org.steamtally.dashboard.store.ShiftSummary;
import org.steamtally.dashboard.store.SuspectSensor;

/** A shift summary as JSON: snake_case names with the unit in the name, empty figures as null. */
final class ShiftJson {

    private ShiftJson() {
    }

    static JsonObject write(ShiftSummary s) {
        JsonArray closures = new JsonArray();
        for (ClosureStats c : s.closures()) {
            closures.add(new JsonObject().put("id", c.id()).put("count", c.count())
                    .put("mean_residual_W", c.meanResidualW()).put("mean_z", c.meanZ()).put("min_z", c.minZ())
                    .put("max_z", c.maxZ()).put("max_abs_z", c.maxAbsZ()).put("count_outside", c.countOutside())
                    .put("fraction_outside", c.fractionOutside()));
        }
        JsonArray suspects = new JsonArray();
        for (SuspectSensor x : s.topSuspects()) {
            suspects.add(new JsonObject().put("sensor", x.sensorId()).put("suspect_count", x.suspectCount())
                    .put("max_test_value", x.maxTestValue()));
        }
        double lengthS = s.shift().length().toMillis() / 1000.0;
        double summarisedS = java.time.Duration.between(s.shift().start(), s.until()).toMillis() / 1000.0;
        return new JsonObject()
                .put("shift", s.shift().name())
                .put("date", s.shift().date().toString())
                .put("start", s.shift().start().toString())
                .put("end", s.shift().end().toString())
                .put("until", s.until().toString())
                .put("length_s", lengthS)
                .put("running", s.until().isBefore(s.shift().end()))
                .put("energy_in_MWh", s.energyInMWh())
                .put("energy_out_MWh", s.energyOutMWh())
                .put("efficiency_from_energy", value(s.efficiencyFromEnergy()))
                .put("mean_thermal_efficiency", value(s.meanEfficiency()))
                .put("worst_thermal_efficiency", value(s.worstEfficiency()))
                .put("mean_heat_rate_kJ_per_kWh", value(s.meanHeatRateKJPerKWh()))
                .put("worst_heat_rate_kJ_per_kWh", value(s.worstHeatRateKJPerKWh()))
                .put("covered_s", s.covered().toMillis() / 1000.0)
                .put("coverage", summarisedS > 0 ? Math.min(1.0, s.covered().toMillis() / 1000.0 / summarisedS) : null)
                .put("alarms_active_s", s.alarmsActive().toMillis() / 1000.0)
                .put("closures", closures)
                .put("top_suspects", suspects);
    }

    static Double value(OptionalDouble v) {
        return v.isPresent() ? v.getAsDouble() : null;
    }
}
