package org.steamtally.deploy;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class LauncherTest {

    @Test
    void helpListsThePropsCommandAndExitsZero() {
        CommandRun run = CommandRun.of(new String[] {"--help"});
        assertAll(
                () -> assertEquals(0, run.status()),
                () -> assertTrue(run.out().contains("Usage: steamtally"), run.out()),
                () -> assertTrue(run.out().contains("props"), run.out()));
    }

    @Test
    void versionNamesTheProjectVersionAndExitsZero() {
        CommandRun run = CommandRun.of(new String[] {"--version"});
        String version = VersionProvider.projectVersion();
        assertAll(
                () -> assertEquals(0, run.status()),
                () -> assertFalse(version.contains("${"), "version.properties was not filtered: " + version),
                () -> assertTrue(run.out().startsWith("steamtally " + version + System.lineSeparator()), run.out()));
    }

    @Test
    void noCommandIsAUsageError() {
        CommandRun run = CommandRun.of(new String[0]);
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("Missing command"), run.err()),
                () -> assertTrue(run.err().contains("props"), run.err()));
    }

    @Test
    void misspeltCommandIsAUsageErrorThatSuggestsTheRightOne() {
        CommandRun run = CommandRun.of(new String[] {"prop"});
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("steamtally props"), run.err()),
                () -> assertFalse(run.err().contains("Exception"), run.err()));
    }

    @Test
    void helpCommandShowsASubcommandsUsage() {
        CommandRun run = CommandRun.of(new String[] {"help", "props"});
        assertAll(
                () -> assertEquals(0, run.status()),
                () -> assertTrue(run.out().contains("Usage: steamtally props"), run.out()));
    }
}
