package org.steamtally.deploy.replay;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.Callable;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.dashboard.json.ResultCsvWriter;
import org.steamtally.dashboard.json.ResultJsonLinesWriter;
import org.steamtally.deploy.CommandFiles;
import org.steamtally.deploy.Launcher;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParentCommand;
import picocli.CommandLine.Spec;

/**
 * {@code steamtally replay}: recorded reading messages through the cycle evaluation, one result
 * record per snapshot. See {@link Replayer} for what happens to each line.
 *
 * <p>Exit status 0 when every line was good and every snapshot evaluated, 1 when some lines were bad
 * or some evaluations failed (each reported on standard error, the first
 * {@value Replayer#REPORTED_PROBLEMS}), 2 for a usage error or an input that cannot be used at all.
 */
@Command(name = "replay",
        mixinStandardHelpOptions = true,
        versionProvider = org.steamtally.deploy.VersionProvider.class,
        sortOptions = false,
        description = {
                "Replays recorded reading messages through the cycle evaluation and writes one result "
                        + "record per snapshot.",
                "",
                "Each input line is one JSON object: topic, ts (epoch milliseconds or ISO-8601 with "
                        + "offset), value, and optionally unit and quality (good, bad, uncertain). The "
                        + "topic names a sensor through the plant description; a value without a unit is "
                        + "in the sensor's declared unit. Bad lines are reported on standard error with "
                        + "their line number and skipped. A summary goes to standard error."},
        exitCodeListHeading = "%nExit status:%n",
        exitCodeList = {
                "0:every line read and every snapshot evaluated",
                "1:some lines were bad or some snapshots failed to evaluate (see standard error)",
                "2:usage error, or a file that cannot be used"})
public final class ReplayCommand implements Callable<Integer> {

    /** What {@code --in} and {@code --out} take to mean the standard streams. */
    private static final String STANDARD_STREAM = CommandFiles.STANDARD_STREAM;

    /** Output formats of {@code --format}. */
    public enum Format {
        jsonl,
        csv
    }

    private final ReplaySeams seams;

    @ParentCommand
    private Launcher launcher;

    @Spec
    private CommandSpec spec;

    @Option(names = "--config", required = true, paramLabel = "FILE",
            description = "The plant description.")
    private Path config;

    @Option(names = "--in", required = true, paramLabel = "READINGS.jsonl",
            description = "Recorded messages, one JSON object a line, or - for standard input.")
    private String in;

    @Option(names = "--out", paramLabel = "FILE", defaultValue = STANDARD_STREAM,
            description = "Where the result records go, or - for standard output (the default).")
    private String out;

    @Option(names = "--format", paramLabel = "FORMAT", defaultValue = "jsonl",
            description = {"Output format, one of: ${COMPLETION-CANDIDATES} (default: ${DEFAULT-VALUE}).",
                    "jsonl: one JSON result record a line. csv: one row a snapshot; one unit only."})
    private Format format;

    @Option(names = "--window", paramLabel = "DURATION", defaultValue = "1s", converter = DurationConverter.class,
            description = "Time between snapshots, e.g. 500ms, 1s, 1min (default: ${DEFAULT-VALUE}).")
    private Duration window;

    @Option(names = "--lateness", paramLabel = "DURATION", defaultValue = "2s", converter = DurationConverter.class,
            description = "How far a line may be out of time order and still enter its snapshot "
                    + "(default: ${DEFAULT-VALUE}).")
    private Duration lateness;

    @Option(names = "--unit", paramLabel = "ID",
            description = "Replay only this unit of the plant; needed for csv when the plant has several.")
    private String unitId;

    /** The command with the real loader, unit table and cycle model ({@link ReplaySeams#standard()}). */
    public ReplayCommand() {
        this(ReplaySeams.standard());
    }

    /** The command with the given seams. */
    public ReplayCommand(ReplaySeams seams) {
        this.seams = Objects.requireNonNull(seams, "seams");
    }

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        PrintWriter stdout = spec.commandLine().getOut();
        try {
            checkDurations();
            PlantDescription plant = loadPlant();
            List<UnitDescription> units = selectUnits(plant);
            List<UnitEvaluator> evaluators = new ArrayList<>();
            for (UnitDescription unit : units) {
                try {
                    evaluators.add(seams.evaluatorFactory().compile(plant.siteId(), unit));
                } catch (IllegalArgumentException e) {
                    throw new ReplayInputException("unit " + unit.id() + " cannot be evaluated: " + e.getMessage());
                }
            }
            Replayer replayer = new Replayer(units, plant.atmosphericPressurePa(), window, lateness, seams.unitConverter(),
                    evaluators);
            if (!replayer.hasTopics()) {
                throw new ReplayInputException("no sensor of " + describe(units) + " in '" + config
                        + "' has a topic, so no line can be matched");
            }
            ReplayTally tally;
            try (BufferedReader input = openInput(); Writer output = openOutput(stdout)) {
                tally = run(replayer, input, output, err);
                output.flush();
            }
            if (STANDARD_STREAM.equals(out) && stdout.checkError()) {
                return unusable(err, "cannot write to standard output");
            }
            err.println(spec.qualifiedName() + ": " + tally.summary());
            err.flush();
            return tally.complete() ? 0 : Launcher.EXIT_PARTIAL_FAILURE;
        } catch (ReplayInputException e) {
            return unusable(err, e.getMessage());
        } catch (IOException e) {
            return unusable(err, "I/O error: " + CommandFiles.reason(e));
        }
    }

    private ReplayTally run(Replayer replayer, BufferedReader input, Writer output, PrintWriter err)
            throws IOException {
        String prefix = spec.qualifiedName() + ": ";
        if (format == Format.csv) {
            ResultCsvWriter csv = new ResultCsvWriter(output);
            return replayer.run(input, csv::write, message -> err.println(prefix + message));
        }
        ResultJsonLinesWriter jsonl = new ResultJsonLinesWriter(output);
        return replayer.run(input, jsonl::write, message -> err.println(prefix + message));
    }

    private void checkDurations() throws ReplayInputException {
        if (window.toMillis() < 1 || !window.equals(Duration.ofMillis(window.toMillis()))) {
            throw new ReplayInputException("--window must be whole milliseconds, at least 1ms, was " + window);
        }
        if (lateness.isNegative() || !lateness.equals(Duration.ofMillis(lateness.toMillis()))) {
            throw new ReplayInputException("--lateness must be whole milliseconds, at least 0, was " + lateness);
        }
    }

    private PlantDescription loadPlant() throws ReplayInputException {
        try {
            return Objects.requireNonNull(seams.plantSource().load(config), "plant description");
        } catch (Exception e) {
            throw new ReplayInputException("cannot use plant description '" + config + "': " + CommandFiles.reason(e));
        }
    }

    private List<UnitDescription> selectUnits(PlantDescription plant) throws ReplayInputException {
        if (unitId != null) {
            UnitDescription unit = plant.unit(unitId).orElseThrow(() -> new ReplayInputException(
                    "--unit " + unitId + ": the plant description has no such unit; it has " + describe(plant.units())));
            return List.of(unit);
        }
        if (plant.units().isEmpty()) {
            throw new ReplayInputException("the plant description in '" + config + "' has no units");
        }
        if (format == Format.csv && plant.units().size() > 1) {
            throw new ReplayInputException("csv holds one unit and the plant has " + describe(plant.units())
                    + "; choose one with --unit");
        }
        return plant.units();
    }

    private static String describe(List<UnitDescription> units) {
        List<String> ids = new ArrayList<>();
        for (UnitDescription u : units) {
            ids.add(u.id());
        }
        return (ids.size() == 1 ? "unit " : "units ") + String.join(", ", ids);
    }

    private BufferedReader openInput() throws ReplayInputException {
        InputStream stdin = launcher == null ? System.in : launcher.standardInput();
        try {
            return new BufferedReader(new InputStreamReader(CommandFiles.openInput(in, stdin), StandardCharsets.UTF_8));
        } catch (CommandFiles.UnusableFileException e) {
            throw new ReplayInputException(e.getMessage());
        }
    }

    private Writer openOutput(PrintWriter stdout) throws ReplayInputException {
        try {
            return CommandFiles.openOutput(out, stdout, List.of(in, config.toString()));
        } catch (CommandFiles.UnusableFileException e) {
            throw new ReplayInputException(e.getMessage());
        }
    }

    private int unusable(PrintWriter err, String message) {
        err.println(spec.qualifiedName() + ": " + message);
        err.flush();
        return Launcher.EXIT_USAGE;
    }

}
