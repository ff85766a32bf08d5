package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.deploy.CommandRun;

/** check-config says whether the window channel runs, over how long and with which alarm limits. */
class CheckConfigWindowTest {

    @TempDir
    Path dir;

    @Test
    void theShippedExampleRunsTheWindowChannelWithTheCalibratedLimits() throws Exception {
        Path file = dir.resolve("regenerative.yaml");
        Files.writeString(file, Demo.exampleText());
        CommandRun run = CommandRun.of(new String[] {"check-config", "--config", file.toString()});
        assertEquals(0, run.status(), run.err());
        // docs/DETECTION.md: 50 s, closure 4.5, suspect 4.0, and the global-test factor 1.85 the example sets for
        // its 26 redundancy degrees.
        assertTrue(run.out().contains("window channel: mean of the last 50 s; alarm limits closure |z| 4.5, global test"
                + " 1.85 x chi-square quantile, suspect sensor |test value| 4.0"), run.out());
    }

    @Test
    void aChannelSwitchedOffIsSaidToBeOff() throws Exception {
        Path file = dir.resolve("off.yaml");
        Files.writeString(file, withWindow("enabled: false"));
        CommandRun run = CommandRun.of(new String[] {"check-config", "--config", file.toString()});
        assertEquals(0, run.status(), run.err());
        assertTrue(run.out().contains("window channel: off (alarms.window.enabled: false)"), run.out());
    }

    @Test
    void aBadWindowLengthFailsTheCheckNamingTheValue() throws Exception {
        Path file = dir.resolve("bad.yaml");
        Files.writeString(file, withWindow("length: 30min"));
        CommandRun run = CommandRun.of(new String[] {"check-config", "--config", file.toString()});
        assertTrue(run.status() != 0);
        assertTrue(run.err().contains("length of alarms.window must be between 2s and 10min, not \"30min\""), run.err());
    }

    @Test
    void aSecondAlarmsSectionIsAnErrorNotASilentOverride() throws Exception {
        Path file = dir.resolve("twice.yaml");
        Files.writeString(file, Demo.exampleText() + "\nalarms:\n  window: {enabled: false}\n");
        CommandRun run = CommandRun.of(new String[] {"check-config", "--config", file.toString()});
        assertTrue(run.status() != 0, run.out());
        assertTrue(run.err().contains("key \"alarms\" appears twice in the plant description"), run.err());
    }

    /** The shipped example with its window subsection's one setting replaced by {@code setting}. */
    private static String withWindow(String setting) throws java.io.IOException {
        String example = Demo.exampleText();
        String shipped = "    global_test: {limit: 1.85}";
        assertTrue(example.contains(shipped), "the example sets the window's global-test factor");
        return example.replace(shipped, "    " + setting);
    }
}
