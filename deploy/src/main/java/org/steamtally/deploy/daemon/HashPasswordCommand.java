package org.steamtally.deploy.daemon;

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.Callable;
import org.steamtally.dashboard.security.PasswordHash;
import org.steamtally.deploy.Launcher;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/** {@code steamtally hash-password}: the hash of a password for the accounts file. */
@Command(name = "hash-password",
        mixinStandardHelpOptions = true,
        versionProvider = org.steamtally.deploy.VersionProvider.class,
        description = {"Reads one password from standard input (first line) and prints its PBKDF2-HMAC-SHA256 hash "
                + "for a line 'name role hash' of the file named by STEAMTALLY_USERS_FILE."})
public final class HashPasswordCommand implements Callable<Integer> {

    @Spec
    private CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        BufferedReader in = new BufferedReader(new InputStreamReader(System.in, StandardCharsets.UTF_8));
        String line = in.readLine();
        if (line == null || line.isEmpty()) {
            spec.commandLine().getErr().println("hash-password: expected a password on the first line of standard input");
            return Launcher.EXIT_USAGE;
        }
        out.println(PasswordHash.create(line.toCharArray()));
        out.flush();
        return 0;
    }
}
