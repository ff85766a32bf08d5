package org.steamtally.deploy;

import java.io.FilterInputStream;
import java.io.FilterWriter;
import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.InvalidPathException;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;

/**
 * The input and output files of the file-based subcommands: {@code -} is standard input or output,
 * which belong to the process and are never closed here; an output file may not be one of the inputs,
 * which opening it would empty; and a file that cannot be used gets a message that says why.
 */
public final class CommandFiles {

    /** What {@code --in} and {@code --out} take to mean the standard streams. */
    public static final String STANDARD_STREAM = "-";

    private CommandFiles() {
    }

    /** A file named on the command line cannot be used; the message is meant for the user. */
    public static final class UnusableFileException extends Exception {
        public UnusableFileException(String message) {
            super(message);
        }
    }

    /** {@code in} as a stream: the file, or standard input left open on close. */
    public static InputStream openInput(String in, InputStream standardInput) throws UnusableFileException {
        if (STANDARD_STREAM.equals(in)) {
            return new FilterInputStream(standardInput) {
                @Override
                public void close() {
                    // Standard input belongs to the process, not to the command.
                }
            };
        }
        try {
            return Files.newInputStream(Path.of(in));
        } catch (IOException | InvalidPathException e) {
            throw new UnusableFileException("cannot read input file '" + in + "': " + reason(e));
        }
    }

    /**
     * {@code out} as a UTF-8 writer: the file, or standard output flushed but not closed on close.
     *
     * @param inputs the files the command reads, none of which {@code out} may name
     */
    public static Writer openOutput(String out, PrintWriter standardOutput, List<String> inputs)
            throws UnusableFileException {
        if (STANDARD_STREAM.equals(out)) {
            return new FilterWriter(standardOutput) {
                @Override
                public void close() {
                    // Standard output belongs to the process; it is flushed, not closed.
                }
            };
        }
        try {
            Path outPath = Path.of(out);
            if (Files.exists(outPath)) {
                for (String input : inputs) {
                    if (!STANDARD_STREAM.equals(input) && Files.exists(Path.of(input))
                            && Files.isSameFile(Path.of(input), outPath)) {
                        throw new UnusableFileException("--out names the input file '" + input
                                + "'; it would be emptied before it is read");
                    }
                }
            }
            return Files.newBufferedWriter(outPath, StandardCharsets.UTF_8);
        } catch (IOException | InvalidPathException e) {
            throw new UnusableFileException("cannot write output file '" + out + "': " + reason(e));
        }
    }

    /** The JDK's file exceptions carry only the path as their message; say what went wrong. */
    public static String reason(Exception e) {
        if (e instanceof NoSuchFileException) {
            return "no such file";
        }
        if (e instanceof AccessDeniedException) {
            return "permission denied";
        }
        return e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
    }
}
