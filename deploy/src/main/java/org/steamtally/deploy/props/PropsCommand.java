package org.steamtally.deploy.props;

import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.io.Writer;
import java.util.List;
import java.util.concurrent.Callable;
import org.steamtally.deploy.CommandFiles;
import org.steamtally.deploy.Launcher;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParentCommand;
import picocli.CommandLine.Spec;

/**
 * {@code steamtally props}: water/steam properties for every row of a CSV file. See
 * {@link PropsTable} for the file contract.
 *
 * <p>Exit status 0 when every row was computed, 1 when some rows failed (their error column says
 * why), 2 for a usage error or a file that cannot be used at all.
 */
@Command(name = "props",
        mixinStandardHelpOptions = true,
        versionProvider = org.steamtally.deploy.VersionProvider.class,
        sortOptions = false,
        description = {
                "Computes water/steam properties (IAPWS-IF97) for every row of a CSV file.",
                "",
                "The input header must name the two columns of the pair (p, T, h, s, x); other "
                        + "columns are ignored. The output has the header",
                "  p,T,h,s,v,u,cp,cv,w,x,region,error",
                "and one row per input row, in the same order. x is empty for single-phase states; "
                        + "cp, cv and w are empty for two-phase states (region 4). A row that cannot "
                        + "be computed keeps its two input values as given and says why in the error "
                        + "column; the other rows are still computed. A summary goes to standard error."},
        exitCodeListHeading = "%nExit status:%n",
        exitCodeList = {
                "0:every row computed",
                "1:some rows failed (see their error column)",
                "2:usage error, or an input or output file that cannot be used"})
public final class PropsCommand implements Callable<Integer> {

    /** What {@code --in} and {@code --out} take to mean the standard streams. */
    private static final String STANDARD_STREAM = CommandFiles.STANDARD_STREAM;

    @ParentCommand
    private Launcher launcher;

    @Spec
    private CommandSpec spec;

    @Option(names = "--given", required = true, paramLabel = "PAIR",
            converter = InputPair.Converter.class,
            description = {"The two quantities each row gives, one of:", "p,T  p,h  p,s  h,s  p,x  T,x"})
    private InputPair given;

    @Option(names = "--in", required = true, paramLabel = "FILE",
            description = "Input CSV file, or - for standard input.")
    private String in;

    @Option(names = "--out", paramLabel = "FILE", defaultValue = STANDARD_STREAM,
            description = "Output CSV file, or - for standard output (the default).")
    private String out;

    @Option(names = "--units", paramLabel = "UNITS", defaultValue = "si",
            converter = UnitSystem.Converter.class, completionCandidates = UnitSystem.OptionValues.class,
            description = {
                    "Units of input and output, one of: ${COMPLETION-CANDIDATES} (default: ${DEFAULT-VALUE}).",
                    "si: Pa, K, J/kg, J/(kg·K). engineering: kPa, °C, kJ/kg, kJ/(kg·K).",
                    "In both, v is in m³/kg, w in m/s, x is unitless; range messages quote SI values."})
    private UnitSystem units;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        PrintWriter stdout = spec.commandLine().getOut();
        try (InputStream input = openInput(); Writer output = openOutput(stdout)) {
            RowTally tally = new PropsTable(given, units).convert(input, output);
            output.flush();
            if (STANDARD_STREAM.equals(out) && stdout.checkError()) {
                return unusable(err, "cannot write to standard output");
            }
            err.println(spec.qualifiedName() + ": " + tally.summary());
            err.flush();
            return tally.failed() == 0 ? 0 : Launcher.EXIT_PARTIAL_FAILURE;
        } catch (PropsFileException e) {
            return unusable(err, e.getMessage());
        } catch (IOException e) {
            return unusable(err, "I/O error: " + CommandFiles.reason(e));
        }
    }

    private InputStream openInput() throws PropsFileException {
        try {
            return CommandFiles.openInput(in, launcher.standardInput());
        } catch (CommandFiles.UnusableFileException e) {
            throw new PropsFileException(e.getMessage());
        }
    }

    private Writer openOutput(PrintWriter stdout) throws PropsFileException {
        try {
            return CommandFiles.openOutput(out, stdout, List.of(in));
        } catch (CommandFiles.UnusableFileException e) {
            throw new PropsFileException(e.getMessage());
        }
    }

    private int unusable(PrintWriter err, String message) {
        err.println(spec.qualifiedName() + ": " + message);
        err.flush();
        return Launcher.EXIT_USAGE;
    }

}
