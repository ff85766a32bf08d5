package org.steamtally.deploy.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.time.Duration;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.deploy.config.PlantDescriptionLoader;
import org.steamtally.deploy.daemon.DaemonConfigFiles;

/** The fleet benchmark's plant description: copies of the example's unit that the daemon accepts. */
class FleetPlantTest {

    private static final Path EXAMPLE = Path.of("examples/regenerative.yaml");

    @Test
    void everyCopyHasTheExampleUnitsSensorsStatesAndComponentsUnderIdsOfItsOwn() throws Exception {
        PlantDescription example = PlantDescriptionLoader.load(EXAMPLE);
        UnitDescription template = example.units().get(0);
        FleetPlant fleet = FleetPlant.of(EXAMPLE, null, 3, "tcp://127.0.0.1:1", "100ms");

        DaemonConfigFiles files = DaemonConfigFiles.parse("fleet.yaml", fleet.yaml());
        PlantDescription plant = files.plant();
        assertEquals(List.of("unit001", "unit002", "unit003"), plant.units().stream().map(UnitDescription::id).toList());
        Set<String> sensorIds = new HashSet<>();
        Set<String> topics = new HashSet<>();
        for (UnitDescription u : plant.units()) {
            assertEquals(template.sensors().size(), u.sensors().size(), u.id());
            assertEquals(template.states().size(), u.states().size(), u.id());
            assertEquals(template.components().size(), u.components().size(), u.id());
            for (int s = 0; s < u.sensors().size(); s++) {
                Sensor copy = u.sensors().get(s);
                String original = template.sensors().get(s).id();
                assertEquals(original + "-u" + u.id().substring(4), copy.id());
                assertEquals("fernholm/" + u.id() + "/" + original, copy.topic().orElseThrow());
                assertEquals(fleet.topic(plant.units().indexOf(u), original), copy.topic().orElseThrow());
                sensorIds.add(copy.id());
                topics.add(copy.topic().orElseThrow());
            }
        }
        assertEquals(3 * template.sensors().size(), sensorIds.size(), "sensor ids unique within the site");
        assertEquals(3 * template.sensors().size(), topics.size(), "one topic per sensor");
        assertEquals(template.sensors().stream().map(Sensor::id).toList(), fleet.templateSensorIds());
    }

    @Test
    void theCollectorSectionNamesTheBrokerAndTheLatenessAskedFor() throws Exception {
        FleetPlant fleet = FleetPlant.of(EXAMPLE, null, 1, "tcp://127.0.0.1:41234", "150ms");
        CollectorSettings c = DaemonConfigFiles.parse("fleet.yaml", fleet.yaml()).collector().orElseThrow();
        assertEquals(Duration.ofMillis(150), c.allowedLateness());
        assertTrue(fleet.yaml().contains("tcp://127.0.0.1:41234"), fleet.yaml());
    }
}
