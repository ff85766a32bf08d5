package org.steamtally.deploy;

import java.io.BufferedWriter;
import java.io.InputStream;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.util.Objects;
import java.util.concurrent.Callable;
import org.steamtally.deploy.props.PropsCommand;
import org.steamtally.deploy.replay.ReplayCommand;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.HelpCommand;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Spec;

/**
 * The {@code steamtally} command: the entry point of {@code steamtally.jar}. It only dispatches to
 * its subcommands; a new subcommand is one more line in the {@code subcommands} list below.
 *
 * <p>Exit status: 0 success, 1 the command ran but some of its work failed (e.g. rows of a file),
 * 2 usage error or unusable input.
 */
@Command(name = "steamtally",
        mixinStandardHelpOptions = true,
        versionProvider = VersionProvider.class,
        description = "Advisory performance monitoring for Rankine-cycle steam power units.",
        synopsisSubcommandLabel = "COMMAND",
        commandListHeading = "%nCommands:%n",
        exitCodeListHeading = "%nExit status:%n",
        exitCodeList = {
                "0:success",
                "1:the command ran but part of its work failed",
                "2:usage error or unusable input"},
        subcommands = {
                HelpCommand.class,
                PropsCommand.class,
                ReplayCommand.class,
                org.steamtally.deploy.daemon.RunCommand.class,
                org.steamtally.deploy.daemon.DemoCommand.class,
                org.steamtally.deploy.daemon.CheckConfigCommand.class,
                org.steamtally.deploy.daemon.SimulateCommand.class,
                org.steamtally.deploy.daemon.HashPasswordCommand.class,
        })
public final class Launcher implements Callable<Integer> {

    /** Exit status for a command whose work partly failed, e.g. some rows of an input file. */
    public static final int EXIT_PARTIAL_FAILURE = 1;

    /** Exit status for a usage error or input that cannot be used at all. */
    public static final int EXIT_USAGE = 2;

    /** Large enough that a million-row CSV reaches the OS in few writes. */
    private static final int STDOUT_BUFFER_CHARS = 1 << 16;

    private final InputStream standardInput;

    @Spec
    private CommandSpec spec;

    private Launcher(InputStream standardInput) {
        this.standardInput = Objects.requireNonNull(standardInput, "standardInput");
    }

    /** Runs {@code steamtally} with the process's standard streams and exits with its status. */
    public static void main(String[] args) {
        CommandLine commandLine = commandLine(System.in);
        PrintWriter out = new PrintWriter(new BufferedWriter(
                new OutputStreamWriter(System.out, StandardCharsets.UTF_8), STDOUT_BUFFER_CHARS));
        PrintWriter err = new PrintWriter(new OutputStreamWriter(System.err, StandardCharsets.UTF_8), true);
        commandLine.setOut(out);
        commandLine.setErr(err);
        int status = commandLine.execute(args);
        out.flush();
        err.flush();
        System.exit(status);
    }

    /**
     * The configured command tree, reading standard input from {@code standardInput}. Output and
     * error writers are picocli's defaults until the caller sets them.
     */
    public static CommandLine commandLine(InputStream standardInput) {
        CommandLine commandLine = new CommandLine(new Launcher(standardInput));
        commandLine.setParameterExceptionHandler(Launcher::reportUsageError);
        return commandLine;
    }

    /** What {@code -} as an input file name reads from. */
    public InputStream standardInput() {
        return standardInput;
    }

    /** Without a subcommand there is nothing to do: that is a usage error. */
    @Override
    public Integer call() {
        throw new ParameterException(spec.commandLine(), "Missing command: give one of "
                + String.join(", ", spec.subcommands().keySet()));
    }

    /**
     * A short message and a pointer to the help, rather than picocli's default of the full usage,
     * which buries the one line that says what was wrong.
     */
    private static int reportUsageError(ParameterException ex, String[] args) {
        CommandLine failed = ex.getCommandLine();
        PrintWriter err = failed.getErr();
        err.println(failed.getCommandSpec().qualifiedName() + ": " + ex.getMessage());
        if (!CommandLine.UnmatchedArgumentException.printSuggestions(ex, err)) {
            err.println("Try '" + failed.getCommandSpec().qualifiedName() + " --help' for usage.");
        }
        err.flush();
        return EXIT_USAGE;
    }
}
