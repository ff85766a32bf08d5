package org.steamtally.deploy;

import java.io.ByteArrayInputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import picocli.CommandLine;

/** One run of the {@code steamtally} command tree with captured standard streams. */
public record CommandRun(int status, String out, String err) {

    /** Runs {@code steamtally args...} with {@code stdin} as standard input. */
    public static CommandRun of(String stdin, String... args) {
        CommandLine commandLine = Launcher.commandLine(new ByteArrayInputStream(stdin.getBytes(StandardCharsets.UTF_8)));
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        commandLine.setOut(new PrintWriter(out));
        commandLine.setErr(new PrintWriter(err));
        int status = commandLine.execute(args);
        commandLine.getOut().flush();
        commandLine.getErr().flush();
        return new CommandRun(status, out.toString(), err.toString());
    }

    /** Runs {@code steamtally args...} with empty standard input. */
    public static CommandRun of(String[] args) {
        return of("", args);
    }
}
