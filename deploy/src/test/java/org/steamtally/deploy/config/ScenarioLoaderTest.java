package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.OptionalDouble;

import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.sim.Fault;

/**
 * Scenario files to {@link Fault} records of one unit, sizes in SI: every kind read, each unit
 * conversion checked against a hand calculation, and every kind of mistake named with its line.
 * Unit factors: NIST SP 811 (2008), appendix B (1 t = 1000 kg, 1 bar = 10⁵ Pa, 1 h = 3600 s).
 */
class ScenarioLoaderTest {

    private static final Instant RUN_START = Instant.parse("2026-12-02T00:00:00Z");
    private static PlantDescription plant;

    @BeforeAll
    static void loadPlant() throws Exception {
        plant = PlantDescriptionLoader.load(ExamplePlantDescriptionTest.example("regenerative.yaml"));
    }

    private static Path resource(String name) throws Exception {
        return Path.of(ScenarioLoaderTest.class.getResource("scenario/" + name).toURI());
    }

    private static <T extends Fault> T fault(LoadedScenario s, int index, Class<T> type) {
        return assertInstanceOf(type, s.scenario().faults().get(index));
    }

    @Test
    void everyKindOfFaultIsReadWithItsSizeInSi() throws Exception {
        LoadedScenario s = ScenarioLoader.load(resource("every-kind.yaml"), plant, RUN_START);
        Instant zero = Instant.parse("2026-12-02T06:00:00Z");
        assertEquals("unit3", s.unitId());
        assertEquals(zero, s.timeZero());
        assertEquals("every kind of fault once", s.scenario().name());
        assertEquals(10, s.scenario().faults().size());

        // FT-101 declares an expanded uncertainty of 1.25 kg/s with k = 2: σ = 0.625 kg/s, 3σ = 1.875 kg/s.
        Fault.Bias flow = fault(s, 0, Fault.Bias.class);
        assertEquals("FT-101", flow.sensorId());
        assertEquals(zero.plus(Duration.ofMinutes(10)), flow.start());
        assertEquals(Duration.ofMinutes(30), flow.duration());
        assertEquals(1.875, flow.offsetSi(), 1e-12);
        // A bias of 2 °C is a difference: 2 K, no 273.15 added.
        assertEquals(2.0, fault(s, 1, Fault.Bias.class).offsetSi(), 1e-12);
        // 1.8 t/h per hour = 0.5 kg/s per 3600 s.
        Fault.Drift drift = fault(s, 2, Fault.Drift.class);
        assertEquals(0.5 / 3600.0, drift.ratePerSecondSi(), 1e-15);
        assertEquals(Duration.ofHours(2), drift.duration());
        assertEquals(OptionalDouble.empty(), fault(s, 3, Fault.Stuck.class).valueSi());
        assertEquals(8000.0, fault(s, 4, Fault.Stuck.class).valueSi().getAsDouble(), 1e-9);
        // JT-001: expanded 0.3 MW with k = 2, σ = 0.15 MW; 10σ = 1.5 MW.
        Fault.Spikes spikes = fault(s, 5, Fault.Spikes.class);
        assertEquals(1.5e6, spikes.amplitudeSi(), 1e-6);
        assertEquals(0.01, spikes.probability(), 0.0);
        assertEquals(4.0, fault(s, 6, Fault.NoiseIncrease.class).factor(), 0.0);
        assertEquals(Duration.ofMillis(500), fault(s, 7, Fault.Dropout.class).duration());
        // A stuck reading in barg is a reading: 0.5 bar + the site's 1008 mbar = 150 800 Pa absolute.
        Fault.Stuck gauge = fault(s, 8, Fault.Stuck.class);
        assertEquals(zero, gauge.start());
        assertEquals(150_800.0, gauge.valueSi().getAsDouble(), 1e-6);
        // A bias in barg is a difference: 0.5 bar = 50 000 Pa, the atmosphere cancels.
        assertEquals(50_000.0, fault(s, 9, Fault.Bias.class).offsetSi(), 1e-6);
    }

    @Test
    void shippedExampleScenarioLoadsAgainstTheRegenerativeExample() throws Exception {
        LoadedScenario s = ScenarioLoader.load(ExamplePlantDescriptionTest.example("regenerative-faults.yaml"),
                plant, RUN_START);
        assertEquals(RUN_START, s.timeZero(), "no start in the file: the run's start is time zero");
        assertEquals(List.of("bias", "drift", "dropout"),
                s.scenario().faults().stream().map(Fault::kind).toList());
        // FT-421: expanded 4.5 t/h, k = 2 → σ = 2.25 t/h = 0.625 kg/s; 4σ = 2.5 kg/s.
        assertEquals(2.5, fault(s, 0, Fault.Bias.class).offsetSi(), 1e-12);
        // 0.6 K per hour.
        assertEquals(0.6 / 3600.0, fault(s, 1, Fault.Drift.class).ratePerSecondSi(), 1e-15);
    }

    @Test
    void sectionBesideAPlantDescriptionIsReadAndTheDescriptionStillLoads() throws Exception {
        String text = Files.readString(ExamplePlantDescriptionTest.example("regenerative.yaml"))
                + "\nscenario:\n  name: dropout only\n  faults:\n"
                + "    - {sensor: PT-151, kind: dropout, start: 1min, duration: 2min}\n";
        LoadedScenario s = ScenarioLoader.parse("combined.yaml", text, plant, RUN_START);
        assertEquals("unit3", s.unitId(), "the one unit of the plant is taken when none is named");
        assertEquals(RUN_START.plusSeconds(60), s.scenario().faults().get(0).start());
        assertEquals(plant, PlantDescriptionLoader.parse("combined.yaml", text));
    }

    @Test
    void emptyFaultListIsARunWithoutFaults() throws Exception {
        LoadedScenario s = ScenarioLoader.parse("x.yaml", "scenario: {name: baseline, faults: []}\n", plant, RUN_START);
        assertTrue(s.scenario().faults().isEmpty());
    }

    @Test
    void everyMistakeOfABadFileIsNamedWithItsLine() throws Exception {
        ScenarioException e = assertThrows(ScenarioException.class,
                () -> ScenarioLoader.load(resource("bad-faults.yaml"), plant, RUN_START));
        List<Integer> lines = e.problems().stream().map(ConfigProblem::line).toList();
        assertEquals(List.of(4, 5, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17), lines, e.getMessage());
        String m = e.getMessage();
        assertTrue(m.startsWith("scenario "), m);
        assertTrue(m.contains("bad-faults.yaml:4:10: the scenario's start must be an ISO-8601 instant"), m);
        assertTrue(m.contains("unknown key \"colour\""), m);
        assertTrue(m.contains("sensor \"FT-999\" of faults[0] is not a sensor of unit unit3"), m);
        assertTrue(m.contains("sensor TT-101 measures temperature"), m);
        assertTrue(m.contains("per of the rate of faults[2] (FT-421) must be s, min or h, not \"week\""), m);
        assertTrue(m.contains("kind \"freeze\" of faults[3] is none of bias, drift, stuck, spikes, noise, dropout"), m);
        assertTrue(m.contains("must lie above 0 and at most 1, was 1.5"), m);
        assertTrue(m.contains("the duration of faults[5] (TT-502) must be a duration with its unit"), m);
        assertTrue(m.contains("the start of faults[6] (FT-900) must be a duration with its unit"), m);
        assertTrue(m.contains("faults[7] (FT-101): a bias fault needs the key \"size\""), m);
        assertTrue(m.contains("a dropout fault has no \"size\""), m);
        assertTrue(m.contains("is either {sigma: k} or {value, unit}, not both"), m);
        assertTrue(m.contains("faults[10] must be a mapping"), m);
    }

    @Test
    void unitNotInThePlantIsNamedWithTheUnitsThereAre() {
        ScenarioException e = assertThrows(ScenarioException.class, () -> ScenarioLoader.parse("u.yaml",
                "scenario: {name: x, unit: unit9, faults: []}\n", plant, RUN_START));
        assertEquals("u.yaml:1:27: unit \"unit9\" is not a unit of site fernholm (its units: unit3)",
                e.problems().get(0).toString());
    }

    @Test
    void fileWithoutScenarioSectionSaysSo() {
        ScenarioException e = assertThrows(ScenarioException.class,
                () -> ScenarioLoader.parse("p.yaml", "site: {id: x}\n", plant, RUN_START));
        assertTrue(e.getMessage().contains("has no scenario section"), e.getMessage());
    }

    @Test
    void textThatIsNoYamlIsPlacedAtItsLine() {
        ScenarioException e = assertThrows(ScenarioException.class,
                () -> ScenarioLoader.parse("n.yaml", "scenario:\n  name: [unclosed\n", plant, RUN_START));
        assertEquals(1, e.problems().size());
        assertTrue(e.problems().get(0).line() >= 2, e.getMessage());
        assertTrue(e.problems().get(0).message().startsWith("not valid YAML"), e.getMessage());
    }

    @Test
    void emptyFileAndMissingFileAreProblemsNotCrashes() throws Exception {
        ScenarioException empty = assertThrows(ScenarioException.class,
                () -> ScenarioLoader.parse("e.yaml", "", plant, RUN_START));
        assertTrue(empty.getMessage().contains("is empty"), empty.getMessage());
        Path missing = Files.createTempDirectory("scenario").resolve("absent.yaml");
        ScenarioException gone = assertThrows(ScenarioException.class,
                () -> ScenarioLoader.load(missing, plant, RUN_START));
        assertTrue(gone.getMessage().contains("cannot be read"), gone.getMessage());
    }
}
