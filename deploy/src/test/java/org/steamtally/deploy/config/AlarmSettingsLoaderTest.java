package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLMapper;
import com.networknt.schema.Error;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.steamtally.calc.alarm.AlarmDefinition;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmPriority;
import org.steamtally.calc.alarm.AlarmSettings;

/**
 * The {@code alarms} section of a plant description to {@link AlarmSettings}: defaults where it is
 * absent, every key read, bad values named with file and line (the bad files themselves are checked
 * line by line in {@link BadPlantDescriptionTest}, through the plant-description loader).
 */
class AlarmSettingsLoaderTest {

    private static Path resource(String name) throws Exception {
        return Path.of(AlarmSettingsLoaderTest.class.getResource(name).toURI());
    }

    @Test
    void fileWithoutAlarmsSectionGetsTheDefaults() throws Exception {
        assertEquals(AlarmSettings.DEFAULTS, AlarmSettingsLoader.load(resource("valid-minimal.yaml")));
    }

    @ParameterizedTest
    @ValueSource(strings = {"simple.yaml", "reheat.yaml", "regenerative.yaml"})
    void shippedExamplesLoadTheirAlarmSettings(String name) throws Exception {
        AlarmSettings settings = AlarmSettingsLoader.load(ExamplePlantDescriptionTest.example(name));
        assertTrue(settings.definition(AlarmKind.CLOSURE).enabled());
    }

    @Test
    void emptyAlarmsSectionGetsTheDefaults() throws Exception {
        String yaml = Files.readString(resource("valid-minimal.yaml")) + "alarms:\n";
        assertEquals(AlarmSettings.DEFAULTS, AlarmSettingsLoader.parse("x.yaml", yaml));
    }

    @Test
    void everyKeyOfTheFullSectionIsRead() throws Exception {
        AlarmSettings s = AlarmSettingsLoader.load(resource("alarms-full.yaml"));
        assertEquals(Duration.ofHours(12), s.maxShelve());
        assertEquals(new AlarmDefinition(true, AlarmPriority.HIGH, Duration.ofSeconds(15), Duration.ofMinutes(1), 3.5, 0.5),
                s.definition(AlarmKind.CLOSURE));
        assertEquals(new AlarmDefinition(true, AlarmPriority.MEDIUM, Duration.ofSeconds(10), Duration.ofSeconds(30), 1.0, 0.05),
                s.definition(AlarmKind.GLOBAL_TEST));
        // Keys not given keep the defaults.
        assertEquals(AlarmSettings.SUSPECT_DEFAULT.withLimit(2.58).withDeadband(0.3).withPriority(AlarmPriority.URGENT),
                s.definition(AlarmKind.SUSPECT_SENSOR));
        assertEquals(AlarmSettings.STALE_DEFAULT.withDelays(Duration.ZERO, Duration.ofSeconds(2))
                .withPriority(AlarmPriority.MEDIUM), s.definition(AlarmKind.STALE_SENSOR));
        assertEquals(AlarmSettings.OUT_OF_RANGE_DEFAULT.withDeadband(0.01), s.definition(AlarmKind.OUT_OF_RANGE));
        assertFalse(s.definition(AlarmKind.CALCULATION_INVALID).enabled());
        // An override starts from its kind's definition in the file, not from the built-in default.
        assertEquals(s.definition(AlarmKind.CLOSURE).withLimit(4.0), s.definitionOf(AlarmKind.CLOSURE, "closure:cycle"));
        assertEquals(AlarmPriority.LOW,
                s.definitionOf(AlarmKind.CLOSURE, "closure:condenser+cooling_water").priority());
        assertFalse(s.definitionOf(AlarmKind.STALE_SENSOR, "stale:JT-1").enabled());
        assertTrue(s.definitionOf(AlarmKind.CALCULATION_INVALID, "invalid:component:pump").enabled());
        assertEquals(Duration.ofMinutes(2),
                s.definitionOf(AlarmKind.GLOBAL_TEST, AlarmKind.GLOBAL_TEST_ID).offDelay());
        assertEquals(3.0, s.definitionOf(AlarmKind.SUSPECT_SENSOR, "suspect:FT-1").limit());
        assertEquals(AlarmSettings.SILENT_UNIT_DEFAULT.withLimit(0.9).withDeadband(0.2)
                .withDelays(Duration.ZERO, Duration.ofSeconds(10)).withPriority(AlarmPriority.HIGH),
                s.definition(AlarmKind.SILENT_UNIT));
        assertEquals(Duration.ofMinutes(1), s.definitionOf(AlarmKind.SILENT_UNIT, AlarmKind.SILENT_UNIT_ID).offDelay());
        assertEquals(8, s.overrides().size());
    }

    @Test
    void fullSectionPassesThePlantDescriptionLoaderToo() throws Exception {
        PlantDescriptionLoader.load(resource("alarms-full.yaml"));
    }

    @Test
    void badSectionFailsWithFileLineAndColumnOfEachProblem() throws Exception {
        Path file = resource("bad/alarms-bad-settings.yaml");
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class, () -> AlarmSettingsLoader.load(file));
        assertEquals(16, e.problems().size(), e.getMessage());
        List<String> lines = Files.readAllLines(file);
        int closureLine = lines.indexOf("  closure: {limit: 3, deadband: 3.5}  # expect: alarms.closure: deadband 3.5"
                + " must be below the limit 3.0") + 1;
        assertTrue(e.getMessage().contains(file + ":" + closureLine + ":12: alarms.closure: deadband 3.5 must be below"
                + " the limit 3.0, else the alarm could never clear"), e.getMessage());
    }

    @Test
    void signalAlarmsAreReadWithTheirLimitsAndPerSensorOverrides() throws Exception {
        AlarmSettings s = AlarmSettingsLoader.load(resource("alarms-full.yaml"));
        assertEquals(AlarmSettings.FROZEN_DEFAULT.withLimit(120.0).withDelays(Duration.ZERO, Duration.ofSeconds(20)),
                s.definition(AlarmKind.FROZEN_SENSOR));
        assertEquals(AlarmSettings.ERRATIC_DEFAULT.withLimit(1.2).withPriority(AlarmPriority.MEDIUM),
                s.definition(AlarmKind.ERRATIC_SENSOR));
        assertEquals(900.0, s.definitionOf(AlarmKind.FROZEN_SENSOR, "frozen:FT-1").limit());
        assertEquals(120.0, s.definitionOf(AlarmKind.FROZEN_SENSOR, "frozen:JT-1").limit());
    }

    @Test
    void signalCheckSettingsAreReadWithNoiseAndResolutionInTheSensorsOwnUnit() throws Exception {
        AlarmSettings s = AlarmSettingsLoader.load(resource("alarms-full.yaml"));
        assertEquals(120, s.signal().windowReadings());
        assertEquals(600, s.signal().warmUpReadings());
        assertEquals(7200, s.signal().learningReadings());
        // PT-2 is declared in kPa: 0.02 kPa = 20 Pa, 0.001 kPa = 1 Pa; TT-1 in Cel: a difference, 0.05 K
        assertEquals(20.0, s.signal().declaredNoiseSi().get("PT-2"), 1e-12);
        assertEquals(1.0, s.signal().resolutionSi().get("PT-2"), 1e-12);
        assertEquals(0.05, s.signal().declaredNoiseSi().get("TT-1"), 1e-12);
        assertEquals(java.util.Map.of("PT-2", 1.0), s.signal().resolutionSi());
    }

    @Test
    void badSignalCheckSettingsNameTheValue() throws Exception {
        String base = Files.readString(resource("alarms-full.yaml"));
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class, () -> AlarmSettingsLoader.parse(
                "x.yaml", base.replace("{id: PT-2, noise: 0.02,", "{id: PT-2, noise: -0.02,")));
        assertTrue(e.getMessage().contains("noise of PT-2 in alarms.signal_check must be positive"), e.getMessage());
        assertTrue(e.getMessage().contains("was -0.02"), e.getMessage());
        e = assertThrows(PlantDescriptionException.class, () -> AlarmSettingsLoader.parse("x.yaml",
                base.replace("{id: TT-1, noise: 0.05}", "{id: TT-99, noise: 0.05}")));
        assertTrue(e.getMessage().contains("alarms.signal_check.sensors: no sensor \"TT-99\" is declared"), e.getMessage());
        e = assertThrows(PlantDescriptionException.class, () -> AlarmSettingsLoader.parse("x.yaml",
                base.replace("window: 120", "window: 2")));
        assertTrue(e.getMessage().contains("the scatter window must hold 3 to 100000 readings, was 2"), e.getMessage());
        e = assertThrows(PlantDescriptionException.class, () -> AlarmSettingsLoader.parse("x.yaml",
                base.replace("warm_up: 600", "warm_up: 10min")));
        assertTrue(e.getMessage().contains("warm_up of alarms.signal_check must be a whole number of readings"),
                e.getMessage());
        assertTrue(e.getMessage().contains("10min"), e.getMessage());
    }

    @Test
    void silentUnitAlarmSlowerThanTheStaleAlarmsIsRefusedNamingBothDelays() throws Exception {
        String base = Files.readString(resource("valid-minimal.yaml"));
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> AlarmSettingsLoader.parse("x.yaml", base + "alarms:\n  stale_sensor: {on_delay: 2s}\n"));
        assertTrue(e.getMessage().contains("alarms.silent_unit: on_delay 5s is longer than the on_delay 2s of"
                + " alarms.stale_sensor, so a silent unit's stale_sensor alarms would be raised before it suppresses them;"
                + " give silent_unit an on_delay of at most 2s"), e.getMessage());
        AlarmSettings s = AlarmSettingsLoader.parse("x.yaml",
                base + "alarms:\n  stale_sensor: {on_delay: 2s}\n  silent_unit: {on_delay: 2s}\n");
        assertEquals(Duration.ofSeconds(2), s.definition(AlarmKind.SILENT_UNIT).onDelay());
        AlarmSettingsLoader.parse("x.yaml",
                base + "alarms:\n  stale_sensor: {on_delay: 2s}\n  silent_unit: {enabled: false}\n");
        e = assertThrows(PlantDescriptionException.class,
                () -> AlarmSettingsLoader.parse("x.yaml", base + "alarms:\n  calculation_invalid: {on_delay: 500ms}\n"));
        assertTrue(e.getMessage().contains("on_delay 5s is longer than the on_delay 500ms of alarms.calculation_invalid"),
                e.getMessage());
    }

    @Test
    void badSignalAlarmSettingsNameTheValueAndTheSensor() throws Exception {
        String base = Files.readString(resource("valid-minimal.yaml"));
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> AlarmSettingsLoader.parse("x.yaml", base + "alarms:\n  frozen_sensor: {limit: -5}\n"));
        assertTrue(e.getMessage().contains("limit of alarms.frozen_sensor must be positive, was -5.0"), e.getMessage());
        e = assertThrows(PlantDescriptionException.class,
                () -> AlarmSettingsLoader.parse("x.yaml", base + "alarms:\n  erratic_sensor: {limit: often}\n"));
        assertTrue(e.getMessage().contains("limit of alarms.erratic_sensor must be a number"), e.getMessage());
        assertTrue(e.getMessage().contains("often"), e.getMessage());
        e = assertThrows(PlantDescriptionException.class, () -> AlarmSettingsLoader.parse("x.yaml",
                base + "alarms:\n  overrides:\n    - {id: \"erratic:PT-99\", limit: 2}\n"));
        assertTrue(e.getMessage().contains("alarm id \"erratic:PT-99\": no sensor \"PT-99\" is declared"), e.getMessage());
    }

    @Test
    void deadbandAndLimitMayComeInEitherOrder() throws Exception {
        String yaml = Files.readString(resource("valid-minimal.yaml"))
                + "alarms:\n  closure: {limit: 0.4, deadband: 0.1}\n  suspect_sensor: {deadband: 0.1, limit: 0.2}\n";
        AlarmSettings s = AlarmSettingsLoader.parse("x.yaml", yaml);
        assertEquals(0.4, s.definition(AlarmKind.CLOSURE).limit());
        assertEquals(0.2, s.definition(AlarmKind.SUSPECT_SENSOR).limit());
    }

    @Test
    void notYamlIsOneProblemWithItsLine() {
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> AlarmSettingsLoader.parse("x.yaml", "alarms: {closure: [\n"));
        assertEquals(1, e.problems().size());
        assertTrue(e.problems().get(0).line() > 0, e.getMessage());
    }

    // ---- the JSON Schema

    private static List<Error> validate(String yaml) throws IOException {
        Path schemaFile = Files.exists(Path.of("..", "docs", "plant-description.schema.json"))
                ? Path.of("..", "docs", "plant-description.schema.json") : Path.of("docs", "plant-description.schema.json");
        var schema = SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_2020_12)
                .getSchema(new ObjectMapper().readTree(schemaFile.toFile()));
        return schema.validate(new YAMLMapper().readTree(yaml));
    }

    @Test
    void fullSectionSatisfiesTheSchema() throws Exception {
        assertEquals(List.of(), validate(Files.readString(resource("alarms-full.yaml"))));
    }

    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {
        "unknown kind|closure: {limit: 3.5,|closures: {limit: 3.5,",
        "unknown priority|priority: urgent}|priority: critical}",
        "limit on a yes/no kind|stale_sensor: {on_delay: 0s,|stale_sensor: {limit: 2, on_delay: 0s,",
        "duration without unit|max_shelve: 12h|max_shelve: 12",
        "override without id|- {id: \"suspect:FT-1\", limit: 3}|- {limit: 3}",
        "override id of no kind|- {id: \"closure:cycle\", limit: 4}|- {id: \"cycle\", limit: 4}",
        "unknown key in the window subsection|    length: 40s|    lenght: 40s",
        "per-snapshot kind in the window subsection|    length: 40s|    stale_sensor: {on_delay: 1s}",
        "signal-check window as a duration|window: 120|window: 2min",
        "signal-check sensor without id|- {id: TT-1, noise: 0.05}|- {noise: 0.05}",
    })
    void malformedSectionIsRejectedByTheSchema(String testCase) throws Exception {
        String[] parts = testCase.split("\\|");
        String text = Files.readString(resource("alarms-full.yaml"));
        assertTrue(text.contains(parts[1]), parts[0]);
        assertFalse(validate(text.replace(parts[1], parts[2])).isEmpty(), parts[0]);
    }

    @Test
    void defaultsAreWhatDocsAlarmsSays() {
        // docs/ALARMS.md, "Defaults": one row per kind.
        Map<AlarmKind, String> documented = Map.of(
                AlarmKind.CLOSURE, "medium 10s 30s 3.0 0.5",
                AlarmKind.GLOBAL_TEST, "medium 10s 30s 1.0 0.1",
                AlarmKind.SUSPECT_SENSOR, "high 10s 60s 1.96 0.25",
                AlarmKind.STALE_SENSOR, "low 5s 5s 0.0 0.0",
                AlarmKind.OUT_OF_RANGE, "medium 5s 10s 0.0 0.02",
                AlarmKind.CALCULATION_INVALID, "low 10s 10s 0.0 0.0",
                AlarmKind.FROZEN_SENSOR, "medium 0s 10s 60.0 0.0",
                AlarmKind.ERRATIC_SENSOR, "low 5s 30s 1.0 0.1",
                AlarmKind.SILENT_UNIT, "medium 5s 10s 1.0 0.0");
        documented.forEach((kind, row) -> {
            AlarmDefinition d = AlarmSettings.DEFAULTS.definition(kind);
            assertEquals(row, d.priority().key() + " " + d.onDelay().toSeconds() + "s " + d.offDelay().toSeconds() + "s "
                    + d.limit() + " " + d.deadband(), kind.key());
        });
    }
}
