package org.steamtally.deploy.sim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.Set;
import java.util.stream.Collectors;

import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.sim.SimulatedReading;
import org.steamtally.calc.sim.SimulatedSample;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.deploy.config.LoadedScenario;
import org.steamtally.deploy.config.PlantDescriptionLoader;
import org.steamtally.deploy.config.ScenarioLoader;

/**
 * The shipped scenario (deploy/examples/regenerative-faults.yaml) drives the simulator of the
 * regenerative example as its comments say: without noise, each reading differs from the truth by
 * exactly the fault's effect, and only while the fault is active.
 */
class ShippedScenarioTest {

    private static final Instant RUN_START = Instant.parse("2026-12-02T00:00:00Z");

    @Test
    void faultsOfTheShippedScenarioShowInTheSimulatedReadingsWhileActive() throws Exception {
        PlantDescription plant = PlantDescriptionLoader.load(example("regenerative.yaml"));
        LoadedScenario loaded = ScenarioLoader.load(example("regenerative-faults.yaml"), plant, RUN_START);
        Simulator sim = Simulator.builder(TruthModel.of(plant.units().get(0), ExampleDesignPoints.regenerative()))
                .seed(1).noiseFactor(0.0).scenario(loaded.scenario()).build();

        // FT-421 biased by 4σ = 2.5 kg/s from minute 2 to minute 32 (σ from the declared 4.5 t/h, k = 2).
        assertEquals(0.0, offset(sim.step(RUN_START.plus(Duration.ofMinutes(1))), "FT-421"), 1e-9);
        assertEquals(2.5, offset(sim.step(RUN_START.plus(Duration.ofMinutes(10))), "FT-421"), 1e-9);
        assertEquals(0.0, offset(sim.step(RUN_START.plus(Duration.ofMinutes(32))), "FT-421"), 1e-9);
        // TT-502 drifts 0.6 K/h from minute 40: 0.3 K after half an hour.
        assertEquals(0.3, offset(sim.step(RUN_START.plus(Duration.ofMinutes(70))), "TT-502"), 1e-9);
        // PT-151 sends nothing from minute 50 to minute 52.
        assertFalse(sensors(sim.step(RUN_START.plus(Duration.ofMinutes(51)))).contains("PT-151"));
        assertTrue(sensors(sim.step(RUN_START.plus(Duration.ofMinutes(52)))).contains("PT-151"));
    }

    private static Path example(String name) {
        Path inModule = Path.of("examples", name);
        return Files.exists(inModule) ? inModule : Path.of("deploy", "examples", name);
    }

    private static double offset(SimulatedSample sample, String sensor) {
        double reading = sample.readings().stream().filter(r -> r.sensorId().equals(sensor)).findFirst()
                .orElseThrow().valueSi();
        return reading - sample.truth().valueSi(sensor);
    }

    private static Set<String> sensors(SimulatedSample sample) {
        return sample.readings().stream().map(SimulatedReading::sensorId).collect(Collectors.toSet());
    }
}
