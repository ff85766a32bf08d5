package org.steamtally.deploy.replay;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.deploy.CommandRun;
import org.steamtally.deploy.Launcher;
import org.steamtally.dashboard.json.ResultJson;
import picocli.CommandLine;

class ReplayCommandTest {

    /** 2026-12-01T00:00:00Z in epoch milliseconds. */
    private static final long T0 = Instant.parse("2026-12-01T00:00:00Z").toEpochMilli();

    @TempDir
    Path dir;

    private Path config;

    private CommandRun replay(PlantDescription plant, String readings, String... options) throws IOException {
        config = dir.resolve("plant.yaml");
        Files.writeString(config, "# read by the fake plant source, which ignores it\n");
        Path in = dir.resolve("readings.jsonl");
        Files.writeString(in, readings, StandardCharsets.UTF_8);
        List<String> args = new ArrayList<>(List.of("--config", config.toString(), "--in", in.toString()));
        args.addAll(List.of(options));
        CommandLine commandLine = new CommandLine(new ReplayCommand(ReplayFakes.seams(plant)));
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        commandLine.setOut(new PrintWriter(out));
        commandLine.setErr(new PrintWriter(err));
        int status = commandLine.execute(args.toArray(new String[0]));
        commandLine.getOut().flush();
        commandLine.getErr().flush();
        return new CommandRun(status, out.toString(), err.toString());
    }

    private static String line(String unit, String sensor, long ts, String value) {
        return "{\"topic\":\"northfield/" + unit + "/" + sensor + "\",\"ts\":" + ts + ",\"value\":" + value + "}\n";
    }

    /** Both sensors of unit2 every 500 ms for {@code seconds}, pressure in MPa, temperature in K. */
    private static String steadyReadings(int seconds) {
        StringBuilder s = new StringBuilder();
        for (int i = 0; i < 2 * seconds; i++) {
            long ts = T0 + 500L * i;
            s.append(line("unit2", "PT-101", ts, "14." + i));
            s.append(line("unit2", "TT-101", ts, "808.15"));
        }
        return s.toString();
    }

    private static List<UnitResult> records(String jsonl) {
        List<UnitResult> out = new ArrayList<>();
        for (String l : jsonl.split("\n")) {
            if (!l.isBlank()) {
                out.add(ResultJson.read(l));
            }
        }
        return out;
    }

    @Test
    void eachSnapshotGivesOneResultRecordInTimeOrder() throws IOException {
        CommandRun run = replay(ReplayFakes.plant("unit2"), steadyReadings(3));
        List<UnitResult> results = records(run.out());
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertEquals(List.of(Instant.ofEpochMilli(T0), Instant.ofEpochMilli(T0 + 1_000),
                        Instant.ofEpochMilli(T0 + 2_000)), results.stream().map(UnitResult::timestamp).toList()),
                () -> assertEquals("northfield", results.get(0).site()),
                () -> assertEquals("unit2", results.get(0).unit()));
    }

    @Test
    void valuesAreConvertedToSiAndTheNewestReadingAtOrBeforeTheSnapshotIsUsed() throws IOException {
        List<UnitResult> results = records(replay(ReplayFakes.plant("unit2"), steadyReadings(2)).out());
        // The reading at T0 + 1 s is the third pressure, 14.2 MPa.
        assertEquals(14.2e6, results.get(1).states().get(0).pressurePa().getAsDouble(), 1e-6);
    }

    @Test
    void windowSetsTheTimeBetweenSnapshots() throws IOException {
        CommandRun run = replay(ReplayFakes.plant("unit2"), steadyReadings(3), "--window", "500ms");
        assertEquals(6, records(run.out()).size(), run.err());
    }

    @Test
    void summaryCountsLinesAndSnapshotsWithInvalidStates() throws IOException {
        // Only the pressure arrives for the first second, so the first snapshot has an invalid state.
        String readings = line("unit2", "PT-101", T0, "14.0") + line("unit2", "TT-101", T0 + 1_000, "808.15")
                + line("unit2", "PT-101", T0 + 1_000, "14.1") + line("unit2", "PT-101", T0 + 2_000, "14.2");
        CommandRun run = replay(ReplayFakes.plant("unit2"), readings);
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertTrue(run.err().contains("replay: read 4 lines: 4 good, 0 bad; 3 snapshots: "
                        + "2 with all states valid, 1 with invalid states"), run.err()));
    }

    @Test
    void badLinesAreReportedWithTheirLineNumberAndSkipped() throws IOException {
        String readings = line("unit2", "PT-101", T0, "14.0")
                + "{\"topic\":\"northfield/unit2/PT-101\",\"ts\":" + T0 + ",\"value\":\"high\"}\n"
                + "\n"
                + "not json\n"
                + line("unit9", "PT-101", T0, "14.0")
                + "{\"topic\":\"northfield/unit2/PT-101\",\"value\":14.0}\n"
                + "{\"topic\":\"northfield/unit2/PT-101\",\"ts\":" + T0 + ",\"value\":14.0,\"unit\":\"psi\"}\n"
                + line("unit2", "TT-101", T0, "808.15");
        CommandRun run = replay(ReplayFakes.plant("unit2"), readings);
        assertAll(
                () -> assertEquals(Launcher.EXIT_PARTIAL_FAILURE, run.status()),
                () -> assertTrue(run.err().contains("replay: line 2: NOT_NUMERIC"), run.err()),
                () -> assertTrue(run.err().contains("replay: line 4: not JSON"), run.err()),
                () -> assertTrue(run.err().contains("replay: line 5: topic 'northfield/unit9/PT-101' is not a sensor"),
                        run.err()),
                () -> assertTrue(run.err().contains("replay: line 6: no ts"), run.err()),
                () -> assertTrue(run.err().contains("replay: line 7: sensor PT-101: unit 'psi'"), run.err()),
                () -> assertTrue(run.err().contains("read 7 lines: 2 good, 5 bad (first on line 2)"), run.err()),
                () -> assertEquals(1, records(run.out()).size(), "the run goes on past bad lines"));
    }

    @Test
    void onlyTheFirstTwentyProblemsAreShownThenTheirCount() throws IOException {
        StringBuilder readings = new StringBuilder(line("unit2", "PT-101", T0, "14.0"));
        for (int i = 0; i < 25; i++) {
            readings.append("garbage ").append(i).append('\n');
        }
        CommandRun run = replay(ReplayFakes.plant("unit2"), readings.toString());
        long shown = run.err().lines().filter(l -> l.contains(": not JSON")).count();
        assertAll(
                () -> assertEquals(20, shown),
                () -> assertTrue(run.err().contains("replay: 5 more problems not shown"), run.err()),
                () -> assertTrue(run.err().contains("26 lines: 1 good, 25 bad"), run.err()));
    }

    @Test
    void badQualityAndDuplicateReadingsAreGoodLinesButNotUsed() throws IOException {
        String readings = line("unit2", "PT-101", T0, "14.0") + line("unit2", "PT-101", T0, "14.0")
                + "{\"topic\":\"northfield/unit2/TT-101\",\"ts\":" + T0 + ",\"value\":808.15,\"quality\":\"bad\"}\n";
        CommandRun run = replay(ReplayFakes.plant("unit2"), readings);
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertTrue(run.err().contains("3 good, 0 bad, 2 readings not used"), run.err()),
                () -> assertFalse(records(run.out()).get(0).states().get(0).valid()));
    }

    @Test
    void severalUnitsAreAlignedSeparatelyAndWrittenInTimeOrder() throws IOException {
        String readings = line("unit1", "PT-101", T0, "10.0") + line("unit1", "TT-101", T0, "800")
                + line("unit2", "PT-101", T0 + 500, "14.0") + line("unit2", "TT-101", T0 + 500, "808.15")
                + line("unit1", "PT-101", T0 + 2_000, "10.1") + line("unit2", "PT-101", T0 + 2_000, "14.1");
        List<UnitResult> results = records(replay(ReplayFakes.plant("unit1", "unit2"), readings).out());
        List<String> order = results.stream().map(r -> r.unit() + "@" + (r.timestamp().toEpochMilli() - T0)).toList();
        assertEquals(List.of("unit1@0", "unit1@1000", "unit2@1000", "unit1@2000", "unit2@2000"), order);
    }

    @Test
    void evaluationThatFailsIsReportedAndTheRunGoesOn() throws IOException {
        Path in = dir.resolve("readings.jsonl");
        Files.writeString(in, steadyReadings(3));
        PlantDescription plant = ReplayFakes.plant("unit2");
        ReplaySeams seams = new ReplaySeams(path -> plant, ReplayFakes::toSi, (site, unit) -> {
            UnitEvaluator real = ReplayFakes.evaluator(site, unit);
            return snapshot -> {
                if (snapshot.timestamp().toEpochMilli() == T0 + 1_000) {
                    throw new IllegalStateException("iteration did not converge");
                }
                return real.evaluate(snapshot);
            };
        });
        CommandLine commandLine = new CommandLine(new ReplayCommand(seams));
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        commandLine.setOut(new PrintWriter(out, true));
        commandLine.setErr(new PrintWriter(err, true));
        int status = commandLine.execute("--config", "plant.yaml", "--in", in.toString());
        assertAll(
                () -> assertEquals(Launcher.EXIT_PARTIAL_FAILURE, status),
                () -> assertTrue(err.toString().contains("unit unit2 at 2026-12-01T00:00:01Z: evaluation failed: "
                        + "iteration did not converge"), err.toString()),
                () -> assertTrue(err.toString().contains("2 snapshots: 2 with all states valid, 0 with invalid states, "
                        + "1 failed to evaluate"), err.toString()),
                () -> assertEquals(2, records(out.toString()).size()));
    }

    @Test
    void csvHasAHeaderAndOneRowPerSnapshot() throws IOException {
        CommandRun run = replay(ReplayFakes.plant("unit2"), steadyReadings(2), "--format", "csv");
        String[] lines = run.out().split("\n");
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertEquals(3, lines.length),
                () -> assertTrue(lines[0].startsWith("ts,site,unit,cycle.heat_added_W,"), lines[0]),
                () -> assertTrue(lines[0].contains(",state.main_steam.p_Pa,"), lines[0]),
                () -> assertTrue(lines[1].startsWith("2026-12-01T00:00:00.000Z,northfield,unit2,"), lines[1]));
    }

    @Test
    void csvOfAPlantWithSeveralUnitsNeedsTheUnitOption() throws IOException {
        CommandRun refused = replay(ReplayFakes.plant("unit1", "unit2"), steadyReadings(1), "--format", "csv");
        CommandRun chosen = replay(ReplayFakes.plant("unit1", "unit2"), steadyReadings(1), "--format", "csv",
                "--unit", "unit2");
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, refused.status()),
                () -> assertTrue(refused.err().contains("choose one with --unit"), refused.err()),
                () -> assertEquals(0, chosen.status(), chosen.err()),
                () -> assertEquals(2, chosen.out().split("\n").length, chosen.out()));
    }

    @Test
    void outputFileReceivesTheRecords() throws IOException {
        Path out = dir.resolve("results.jsonl");
        CommandRun run = replay(ReplayFakes.plant("unit2"), steadyReadings(2), "--out", out.toString());
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertEquals("", run.out()),
                () -> assertEquals(2, records(Files.readString(out)).size()));
    }

    @Test
    void unknownUnitOptionIsAUsageError() throws IOException {
        CommandRun run = replay(ReplayFakes.plant("unit2"), steadyReadings(1), "--unit", "unit7");
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("--unit unit7: the plant description has no such unit; it has unit unit2"),
                        run.err()));
    }

    @Test
    void plantDescriptionThatCannotBeLoadedIsAUsageErrorWithItsMessage() throws IOException {
        Path in = dir.resolve("readings.jsonl");
        Files.writeString(in, steadyReadings(1));
        ReplaySeams failing = new ReplaySeams(path -> {
            throw new IllegalArgumentException("unit1: state main_steam names unknown sensor PT-999");
        }, ReplayFakes::toSi, ReplayFakes::evaluator);
        CommandLine commandLine = new CommandLine(new ReplayCommand(failing));
        StringWriter err = new StringWriter();
        commandLine.setErr(new PrintWriter(err, true));
        int status = commandLine.execute("--config", "plant.yaml", "--in", in.toString());
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, status),
                () -> assertTrue(err.toString().contains("cannot use plant description 'plant.yaml': unit1: state "
                        + "main_steam names unknown sensor PT-999"), err.toString()));
    }

    @Test
    void missingInputFileIsAUsageError() throws IOException {
        config = dir.resolve("plant.yaml");
        Files.writeString(config, "");
        CommandLine commandLine = new CommandLine(new ReplayCommand(ReplayFakes.seams(ReplayFakes.plant("unit2"))));
        StringWriter err = new StringWriter();
        commandLine.setErr(new PrintWriter(err, true));
        int status = commandLine.execute("--config", config.toString(), "--in", dir.resolve("none.jsonl").toString());
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, status),
                () -> assertTrue(err.toString().contains("cannot read input file"), err.toString()),
                () -> assertTrue(err.toString().contains("no such file"), err.toString()));
    }

    @Test
    void launcherListsReplayAndNamesAMissingPlantDescription() {
        CommandRun help = CommandRun.of(new String[] {"--help"});
        CommandRun run = CommandRun.of(new String[] {"replay", "--config", "no-such-plant.yaml", "--in", "-"});
        assertAll(
                () -> assertTrue(help.out().contains("replay"), help.out()),
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("no-such-plant.yaml"), run.err()));
    }
}
