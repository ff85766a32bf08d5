package org.steamtally.dashboard.view;

import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UnitDescription;

/**
 * The plant description as the dashboard shows it: what the schematic and the plant view need, built
 * field by field from an allow-list. Anything not named here never leaves the server, so connection
 * details that a later plant description may carry (broker addresses, credentials) cannot leak, and
 * the MQTT topics, which map the plant's messaging, are left out on purpose.
 */
public final class PlantJson {

    private PlantJson() {
    }

    public static JsonObject plant(PlantDescription plant) {
        JsonArray units = new JsonArray();
        plant.units().forEach(u -> units.add(unit(u)));
        return new JsonObject()
                .put("site", new JsonObject().put("id", plant.siteId()).put("name", plant.siteName())
                        .put("atmospheric_pressure_Pa", plant.atmosphericPressurePa()))
                .put("units", units);
    }

    public static JsonObject unit(UnitDescription u) {
        JsonArray sensors = new JsonArray();
        for (Sensor s : u.sensors()) {
            sensors.add(new JsonObject()
                    .put("id", s.id())
                    .put("quantity", s.quantity().key())
                    .put("engineering_unit", s.engineeringUnit())
                    .put("si_unit", s.quantity().siUnit())
                    .put("standard_uncertainty_si", s.standardUncertaintySi())
                    .put("range_min_si", s.rangeMinSi())
                    .put("range_max_si", s.rangeMaxSi())
                    .put("max_age_s", s.maxAge().toMillis() / 1000.0));
        }
        JsonArray states = new JsonArray();
        for (StateDefinition d : u.states()) {
            JsonObject st = new JsonObject().put("id", d.id()).put("reference", d.isReference());
            fix(st, d.fix());
            st.put("flow_sensor", d.flowSensor().orElse(null));
            states.add(st);
        }
        JsonArray components = new JsonArray();
        for (Component c : u.components()) {
            JsonObject co = new JsonObject().put("id", c.id()).put("type", c.type())
                    .put("inlets", new JsonArray(c.inlets())).put("outlets", new JsonArray(c.outlets()));
            if (c instanceof Component.Generator g) {
                co.put("turbines", new JsonArray(g.turbines())).put("power_sensor", g.powerSensor());
            }
            components.add(co);
        }
        return new JsonObject().put("id", u.id()).put("name", u.name())
                .put("dead_state", new JsonObject().put("T_K", u.deadState().temperatureK())
                        .put("p_Pa", u.deadState().pressurePa()))
                .put("states", states).put("components", components).put("sensors", sensors);
    }

    private static void fix(JsonObject st, StateFix fix) {
        if (fix instanceof StateFix.MeasuredPressureTemperature f) {
            st.put("fix", "measured_p_T").put("pressure_sensor", f.pressureSensor())
                    .put("temperature_sensor", f.temperatureSensor());
        } else if (fix instanceof StateFix.SaturatedLiquid f) {
            st.put("fix", "saturated_liquid").put("pressure_sensor", f.pressureSensor());
        } else if (fix instanceof StateFix.SaturatedVapour f) {
            st.put("fix", "saturated_vapour").put("pressure_sensor", f.pressureSensor());
        } else if (fix instanceof StateFix.PressureQuality f) {
            st.put("fix", "pressure_quality").put("pressure_sensor", f.pressureSensor()).put("x", f.quality());
        } else if (fix instanceof StateFix.EnergyBalance f) {
            st.put("fix", "energy_balance").put("pressure_sensor", f.pressureSensor())
                    .put("balance_component", f.componentId());
        } else if (fix instanceof StateFix.Isentropic f) {
            st.put("fix", "isentropic").put("from_state", f.fromState()).put("pressure_of_state", f.pressureOfState());
        }
    }
}
