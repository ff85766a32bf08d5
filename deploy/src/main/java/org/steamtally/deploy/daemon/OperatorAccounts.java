package org.steamtally.deploy.daemon;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.steamtally.dashboard.security.Role;
import org.steamtally.dashboard.security.UserAccount;

/**
 * The dashboard's accounts for {@code run}, from the file named by {@value #USERS_FILE}: one account
 * a line, {@code name role hash}, separated by spaces; role {@code viewer} or {@code operator}; the
 * hash as {@code steamtally hash-password} prints it (PBKDF2-HMAC-SHA256). Blank lines and lines
 * starting with {@code #} are skipped. Passwords themselves are never read from the environment.
 */
public final class OperatorAccounts {

    /** Environment variable naming the accounts file. */
    public static final String USERS_FILE = "STEAMTALLY_USERS_FILE";

    private OperatorAccounts() {
    }

    /**
     * The accounts, or none when the variable is not set (then nobody can log in and the alarms can
     * only be watched).
     *
     * @throws IllegalArgumentException naming the file and line that is wrong
     */
    public static List<UserAccount> fromEnvironment(Map<String, String> env) throws IOException {
        String file = env.get(USERS_FILE);
        if (file == null || file.isBlank()) {
            return List.of();
        }
        return read(Path.of(file.trim()));
    }

    /** Reads an accounts file (format above). */
    public static List<UserAccount> read(Path file) throws IOException {
        List<UserAccount> out = new ArrayList<>();
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i).strip();
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            String[] f = line.split("\\s+");
            String where = file + " line " + (i + 1);
            if (f.length != 3) {
                throw new IllegalArgumentException(where + ": expected 'name role hash', found " + f.length
                        + " fields");
            }
            Role role = switch (f[1].toLowerCase(Locale.ROOT)) {
                case "viewer" -> Role.VIEWER;
                case "operator" -> Role.OPERATOR;
                default -> throw new IllegalArgumentException(where + ": role '" + f[1]
                        + "' is not viewer or operator");
            };
            try {
                out.add(new UserAccount(f[0], role, f[2]));
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(where + ": " + e.getMessage(), e);
            }
        }
        return out;
    }
}
