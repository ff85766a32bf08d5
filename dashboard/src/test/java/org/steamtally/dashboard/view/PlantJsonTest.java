package org.steamtally.dashboard.view;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

import io.vertx.core.json.JsonObject;
import java.time.Duration;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.dashboard.fixture.FernholmTestPlant;

class PlantJsonTest {

    @Test
    void sensorTopicsAreLeftOutOfThePlantView() {
        UnitDescription u = new FernholmTestPlant().plant().units().get(0);
        Sensor withTopic = new Sensor("PT-101", Quantity.PRESSURE, "MPa", 1e4, UncertaintyBasis.STANDARD, 0, 20e6,
                Duration.ofSeconds(5), Optional.of("fernholm/unit3/PT-101"));
        UnitDescription unit = new UnitDescription(u.id(), u.name(), List.of(withTopic), u.states(), u.components(),
                u.deadState());
        String json = PlantJson.plant(new PlantDescription("fernholm", "Fernholm", 100_800.0, List.of(unit))).encode();
        assertFalse(json.contains("fernholm/unit3"), json);
        assertFalse(json.contains("topic"), json);
        JsonObject sensor = new JsonObject(json).getJsonArray("units").getJsonObject(0).getJsonArray("sensors")
                .getJsonObject(0);
        assertEquals("PT-101", sensor.getString("id"));
        assertEquals(5.0, sensor.getDouble("max_age_s"));
    }
}
