package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.steamtally.calc.alarm.AlarmDefinition;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmPriority;
import org.steamtally.calc.alarm.AlarmSettings;

/**
 * The {@code window} subsection of the alarms section: the window channel's settings, their
 * defaults (the limits calibrated in docs/DETECTION.md) and the problems a bad value gives.
 */
class WindowChannelSettingsLoaderTest {

    private static Path resource(String name) throws Exception {
        return Path.of(WindowChannelSettingsLoaderTest.class.getResource(name).toURI());
    }

    private static String minimal() throws Exception {
        return Files.readString(resource("valid-minimal.yaml"));
    }

    @Test
    void aFileWithoutAlarmsSectionGetsTheCalibratedWindowChannel() throws Exception {
        WindowChannelSettings w = AlarmSettingsLoader.loadWindow(resource("valid-minimal.yaml"));
        assertEquals(WindowChannelSettings.DEFAULTS, w);
        assertTrue(w.enabled());
        assertEquals(Duration.ofSeconds(50), w.length());
        // docs/DETECTION.md, limits for window means: closure |z| 4.5, global test 3.0 × quantile,
        // suspect |test value| 4.0; delays and deadbands as the per-snapshot defaults.
        assertEquals(AlarmSettings.CLOSURE_DEFAULT.withLimit(4.5), w.alarms().definition(AlarmKind.CLOSURE));
        assertEquals(AlarmSettings.GLOBAL_TEST_DEFAULT.withLimit(3.0), w.alarms().definition(AlarmKind.GLOBAL_TEST));
        assertEquals(AlarmSettings.SUSPECT_DEFAULT.withLimit(4.0), w.alarms().definition(AlarmKind.SUSPECT_SENSOR));
        for (AlarmKind kind : AlarmKind.values()) {
            assertEquals(WindowChannelSettings.KINDS.contains(kind), w.alarms().definition(kind).enabled(), kind.key());
        }
    }

    @Test
    void theWindowAlarmsMayBeShelvedAsLongAsTheSectionsMaxShelveSays() throws Exception {
        WindowChannelSettings w = AlarmSettingsLoader.parseWindow("x.yaml", minimal() + "alarms:\n  max_shelve: 4h\n");
        assertEquals(Duration.ofHours(4), w.alarms().maxShelve());
        assertEquals(WindowChannelSettings.LENGTH_DEFAULT, w.length());
    }

    @Test
    void everyKeyOfTheWindowSubsectionIsRead() throws Exception {
        WindowChannelSettings w = AlarmSettingsLoader.loadWindow(resource("alarms-full.yaml"));
        assertTrue(w.enabled());
        assertEquals(Duration.ofSeconds(40), w.length());
        assertEquals(5.0, w.alarms().definition(AlarmKind.CLOSURE).limit());
        AlarmDefinition g = w.alarms().definition(AlarmKind.GLOBAL_TEST);
        assertEquals(3.5, g.limit());
        assertEquals(AlarmPriority.HIGH, g.priority());
        AlarmDefinition s = w.alarms().definition(AlarmKind.SUSPECT_SENSOR);
        assertEquals(4.2, s.limit());
        assertEquals(0.3, s.deadband());
        assertEquals(Duration.ofSeconds(90), s.offDelay());
        assertEquals(Duration.ofHours(12), w.alarms().maxShelve());
        // The per-snapshot settings of the same file are not touched by the window's.
        assertEquals(3.5, AlarmSettingsLoader.load(resource("alarms-full.yaml")).definition(AlarmKind.CLOSURE).limit());
    }

    @Test
    void theShareAWindowMustHoldIsReadAndDefaultsToNinetyPercent() throws Exception {
        assertEquals(0.9, WindowChannelSettings.DEFAULTS.minGoodShare());
        WindowChannelSettings w = AlarmSettingsLoader.parseWindow("x.yaml",
                minimal() + "alarms:\n  window: {min_good_share: 0.8}\n");
        assertEquals(0.8, w.minGoodShare());
        assertEquals(0.8, w.rule(Duration.ofSeconds(1)).minGoodShare());
        assertEquals(WindowChannelSettings.LENGTH_DEFAULT, w.length());
    }

    @Test
    void theChannelCanBeSwitchedOff() throws Exception {
        WindowChannelSettings w = AlarmSettingsLoader.parseWindow("x.yaml",
                minimal() + "alarms:\n  window: {enabled: false}\n");
        assertFalse(w.enabled());
    }

    @Test
    void aLengthOfWholeSnapshotPeriodsGivesThatManySnapshots() {
        assertEquals(50, WindowChannelSettings.DEFAULTS.snapshots(Duration.ofSeconds(1)));
        assertEquals(100, WindowChannelSettings.DEFAULTS.snapshots(Duration.ofMillis(500)));
        // 50 s over 3 s is 16.7: the nearest whole count.
        assertEquals(17, WindowChannelSettings.DEFAULTS.snapshots(Duration.ofSeconds(3)));
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        "length without unit|length: 45|length of alarms.window must be a duration with its unit, e.g. 0s, 500ms, 10s, 2min or 8h, more than zero, not \"45\"",
        "length too long|length: 20min|length of alarms.window must be between 2s and 10min, not \"20min\"",
        "length too short|length: 1s|length of alarms.window must be between 2s and 10min, not \"1s\"",
        "negative limit|closure: {limit: -1}|limit of alarms.window.closure must be positive, was -1.0",
        "deadband above the limit|suspect_sensor: {limit: 4, deadband: 5}|alarms.window.suspect_sensor: deadband 5.0 must be below the limit 4.0",
        "enabled not a flag|enabled: maybe|enabled of alarms.window must be true or false, not \"maybe\"",
        "a per-snapshot kind|stale_sensor: {on_delay: 1s}|alarms.window: stale_sensor alarms are not raised on window means (the per-snapshot channel raises them); allowed here: enabled, length, min_good_share, closure, global_test, suspect_sensor",
        "unknown key|lenght: 50s|unknown key \"lenght\" in alarms.window (allowed: enabled, length, min_good_share, closure, global_test, suspect_sensor)",
        "share above one|min_good_share: 1.5|min_good_share of alarms.window must be above 0 and at most 1, was 1.5",
        "share of zero|min_good_share: 0|min_good_share of alarms.window must be above 0 and at most 1, was 0.0",
        "share not a number|min_good_share: most|min_good_share of alarms.window must be a number, not \"most\"",
        "priority of no kind|global_test: {priority: critical}|priority of alarms.window.global_test must be one of low, medium, high, urgent, not \"critical\"",
    })
    void aBadValueIsReportedWithItsPlaceTheValueAndWhatWasExpected(String name, String entry, String expected)
            throws Exception {
        String yaml = minimal() + "alarms:\n  window:\n    " + entry + "\n";
        int line = (int) minimal().lines().count() + 3;
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> AlarmSettingsLoader.parseWindow("x.yaml", yaml), name);
        assertEquals(1, e.problems().size(), e.getMessage());
        ConfigProblem p = e.problems().get(0);
        assertEquals(line, p.line(), e.getMessage());
        assertTrue(p.message().contains(expected), "expected «" + expected + "» in «" + p.message() + "»");
        // The same file fails the plant-description loader and the per-snapshot settings too: one
        // bad section fails the file as a whole.
        assertThrows(PlantDescriptionException.class, () -> AlarmSettingsLoader.parse("x.yaml", yaml), name);
        PlantDescriptionException whole = assertThrows(PlantDescriptionException.class,
                () -> PlantDescriptionLoader.parse("x.yaml", yaml), name);
        assertTrue(whole.getMessage().contains(expected), whole.getMessage());
    }

    @Test
    void theSettingsRefuseAnEnabledPerSnapshotKindAndALengthOutOfRange() {
        AlarmSettings withStale = AlarmSettings.DEFAULTS;
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new WindowChannelSettings(true, Duration.ofSeconds(50), withStale));
        assertTrue(e.getMessage().contains("raises no stale_sensor alarms"), e.getMessage());
        IllegalArgumentException l = assertThrows(IllegalArgumentException.class,
                () -> new WindowChannelSettings(true, Duration.ofHours(1), WindowChannelSettings.DEFAULTS.alarms()));
        assertTrue(l.getMessage().contains("between 2 s and 10 min, was PT1H"), l.getMessage());
    }

    @Test
    void theShippedExamplesRunTheWindowChannel() throws Exception {
        for (String name : List.of("simple.yaml", "reheat.yaml", "regenerative.yaml")) {
            assertTrue(AlarmSettingsLoader.loadWindow(ExamplePlantDescriptionTest.example(name)).enabled(), name);
        }
    }
}
