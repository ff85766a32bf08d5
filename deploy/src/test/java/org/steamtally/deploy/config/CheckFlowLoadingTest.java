package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.StateDefinition;

/** The regenerative example names its feedwater meter as the feedwater's check flow. */
class CheckFlowLoadingTest {

    @Test
    void feedwaterCheckFlowOfTheRegenerativeExampleIsLoaded() throws Exception {
        Path inModule = Path.of("examples", "regenerative.yaml");
        Path file = Files.exists(inModule) ? inModule : Path.of("deploy", "examples", "regenerative.yaml");
        PlantDescription plant = PlantDescriptionLoader.load(file);
        StateDefinition feedwater = plant.units().get(0).state("feedwater").orElseThrow();
        assertEquals(Optional.of("FT-421"), feedwater.checkFlowSensor());
        assertEquals(Optional.empty(), plant.units().get(0).state("main_steam").orElseThrow().checkFlowSensor());
    }
}
