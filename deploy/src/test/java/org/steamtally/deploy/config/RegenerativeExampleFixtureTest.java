package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.net.URL;
import java.net.URLClassLoader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.function.Executable;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;

/**
 * The shipped regenerative example, as the loader reads it, is the unit calc's tests, detection
 * harness and benchmarks use: calc's test fixture {@code RegenerativeExample} transcribes the file
 * by hand (calc cannot read YAML), and this test keeps the two in step — sensor ids and order,
 * quantities, SI uncertainties and ranges, duplicate transmitters, states and components.
 *
 * <p>The fixture lives in calc's test classes, which are not on deploy's class path; they are
 * compiled before deploy's tests in the same reactor build, so they are loaded from calc's build
 * directory, with deploy's class path as parent so that both sides share calc's main classes.
 */
class RegenerativeExampleFixtureTest {

    private static Path module(String first, String... more) {
        Path inModule = Path.of(first, more);
        return Files.exists(inModule) ? inModule : Path.of("deploy").resolve(inModule);
    }

    private static UnitDescription fixture() throws Exception {
        Path classes = Files.exists(Path.of("..", "calc", "target", "test-classes"))
                ? Path.of("..", "calc", "target", "test-classes") : Path.of("calc", "target", "test-classes");
        assertTrue(Files.isDirectory(classes.resolve("org/steamtally/calc/fixture")),
                "calc's test classes are not built at " + classes.toAbsolutePath() + ": build calc's tests first");
        try (URLClassLoader loader = new URLClassLoader(new URL[] {classes.toUri().toURL()},
                RegenerativeExampleFixtureTest.class.getClassLoader())) {
            Class<?> c = loader.loadClass("org.steamtally.calc.fixture.RegenerativeExample");
            return (UnitDescription) c.getMethod("unit").invoke(null);
        }
    }

    @Test
    void loadedExampleEqualsCalcsTranscriptionOfIt() throws Exception {
        UnitDescription loaded = PlantDescriptionLoader.load(module("examples", "regenerative.yaml")).units().get(0);
        UnitDescription fixture = fixture();
        List<Executable> checks = new ArrayList<>();
        checks.add(() -> assertEquals(fixture.sensors().stream().map(Sensor::id).toList(),
                loaded.sensors().stream().map(Sensor::id).toList(), "sensor ids in order"));
        for (Sensor f : fixture.sensors()) {
            loaded.sensor(f.id()).ifPresent(l -> {
                double tol = 1e-12 * Math.max(Math.abs(f.rangeMaxSi()), 1.0);
                checks.add(() -> assertEquals(f.quantity(), l.quantity(), f.id() + " quantity"));
                checks.add(() -> assertEquals(f.standardUncertaintySi(), l.standardUncertaintySi(),
                        1e-12 * f.standardUncertaintySi(), f.id() + " standard uncertainty, SI"));
                checks.add(() -> assertEquals(f.rangeMinSi(), l.rangeMinSi(), tol, f.id() + " range min, SI"));
                checks.add(() -> assertEquals(f.rangeMaxSi(), l.rangeMaxSi(), tol, f.id() + " range max, SI"));
                checks.add(() -> assertEquals(f.maxAge(), l.maxAge(), f.id() + " max age"));
                checks.add(() -> assertEquals(f.topic(), l.topic(), f.id() + " topic"));
                checks.add(() -> assertEquals(f.sameMeasurandAs(), l.sameMeasurandAs(), f.id() + " same measurand"));
            });
        }
        checks.add(() -> assertEquals(fixture.states(), loaded.states(), "states"));
        checks.add(() -> assertEquals(fixture.components().size(), loaded.components().size(), "component count"));
        for (int k = 0; k < Math.min(fixture.components().size(), loaded.components().size()); k++) {
            int i = k;
            checks.add(() -> assertEquals(fixture.components().get(i).toString(), loaded.components().get(i).toString(),
                    "component " + i));
        }
        checks.add(() -> assertEquals(57, loaded.sensors().size(), "36 primaries and 21 duplicate transmitters"));
        assertAll(checks);
    }
}
