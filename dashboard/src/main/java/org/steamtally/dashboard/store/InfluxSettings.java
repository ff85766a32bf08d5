package org.steamtally.dashboard.store;

import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Map;
import java.util.Objects;
import java.util.Properties;

/**
 * Where the InfluxDB store is and how to log in: from environment variables or a properties file,
 * so that no password needs to be on a command line.
 *
 * @param url             base URL of an InfluxDB 1.x server, or of the 1.x-compatible API of a later one
 * @param database        the database (in 2.x and later: the database name mapped to a bucket)
 * @param retentionPolicy the retention policy to write to; empty for the database's default
 * @param username        empty when the server needs no login
 * @param password        empty when the server needs no login
 * @param createDatabase  whether to send {@code CREATE DATABASE} before the first write (1.x only;
 *                        needs admin rights)
 * @param timeout         connect, read and write timeout of each request
 */
public record InfluxSettings(String url, String database, String retentionPolicy, String username, String password,
        boolean createDatabase, Duration timeout) {

    /** Environment variable: the base URL, e.g. {@code http://127.0.0.1:8086}. Required. */
    public static final String URL = "STEAMTALLY_INFLUX_URL";
    /** Environment variable: the database; default {@value #DEFAULT_DATABASE}. */
    public static final String DATABASE = "STEAMTALLY_INFLUX_DATABASE";
    /** Environment variable: the retention policy; default: the database's default policy. */
    public static final String RETENTION_POLICY = "STEAMTALLY_INFLUX_RETENTION_POLICY";
    /** Environment variable: the user name. */
    public static final String USER = "STEAMTALLY_INFLUX_USER";
    /** Environment variable: the password. */
    public static final String PASSWORD = "STEAMTALLY_INFLUX_PASSWORD";
    /** Environment variable: a file whose first line is the password (preferred over {@link #PASSWORD}). */
    public static final String PASSWORD_FILE = "STEAMTALLY_INFLUX_PASSWORD_FILE";
    /** Environment variable: {@code true} to create the database if it is missing. */
    public static final String CREATE_DATABASE = "STEAMTALLY_INFLUX_CREATE_DATABASE";

    public static final String DEFAULT_DATABASE = "steamtally";
    private static final Duration DEFAULT_TIMEOUT = Duration.ofSeconds(10);

    public InfluxSettings {
        Objects.requireNonNull(url, "url");
        if (!url.startsWith("http://") && !url.startsWith("https://")) {
            throw new IllegalArgumentException("InfluxDB URL '" + url + "' must start with http:// or https://");
        }
        url = url.replaceAll("/+$", "");
        if (database == null || database.isBlank()) {
            throw new IllegalArgumentException("InfluxDB database name is empty");
        }
        retentionPolicy = retentionPolicy == null ? "" : retentionPolicy;
        username = username == null ? "" : username;
        password = password == null ? "" : password;
        if (timeout.isNegative() || timeout.isZero()) {
            throw new IllegalArgumentException("InfluxDB timeout " + timeout + " must be positive");
        }
    }

    /** A server without login, the database's default retention policy, the database created if missing. */
    public static InfluxSettings of(String url, String database) {
        return new InfluxSettings(url, database, "", "", "", true, DEFAULT_TIMEOUT);
    }

    /**
     * From environment variables ({@link #URL} and the others above).
     *
     * @throws IllegalArgumentException naming the variable that is missing or wrong
     */
    public static InfluxSettings fromEnvironment(Map<String, String> env) {
        String url = env.get(URL);
        if (url == null || url.isBlank()) {
            throw new IllegalArgumentException(URL + " is not set; expected the InfluxDB base URL, e.g."
                    + " http://127.0.0.1:8086");
        }
        String password = env.getOrDefault(PASSWORD, "");
        String file = env.get(PASSWORD_FILE);
        if (file != null && !file.isBlank()) {
            password = readPassword(Path.of(file), PASSWORD_FILE);
        }
        return new InfluxSettings(url.trim(), env.getOrDefault(DATABASE, DEFAULT_DATABASE),
                env.getOrDefault(RETENTION_POLICY, ""), env.getOrDefault(USER, ""), password,
                Boolean.parseBoolean(env.getOrDefault(CREATE_DATABASE, "false")), DEFAULT_TIMEOUT);
    }

    /**
     * From a properties file with the keys {@code url}, {@code database}, {@code retention_policy},
     * {@code user}, {@code password} or {@code password_file}, {@code create_database}.
     */
    public static InfluxSettings fromFile(Path file) throws IOException {
        Properties p = new Properties();
        try (Reader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            p.load(r);
        }
        String url = p.getProperty("url");
        if (url == null || url.isBlank()) {
            throw new IllegalArgumentException(file + ": key 'url' is missing; expected the InfluxDB base URL");
        }
        String password = p.getProperty("password", "");
        String pf = p.getProperty("password_file");
        if (pf != null && !pf.isBlank()) {
            password = readPassword(file.resolveSibling(pf), file + ": password_file");
        }
        return new InfluxSettings(url.trim(), p.getProperty("database", DEFAULT_DATABASE),
                p.getProperty("retention_policy", ""), p.getProperty("user", ""), password,
                Boolean.parseBoolean(p.getProperty("create_database", "false")), DEFAULT_TIMEOUT);
    }

    private static String readPassword(Path file, String from) {
        try {
            String text = Files.readString(file, StandardCharsets.UTF_8);
            int eol = text.indexOf('\n');
            return (eol < 0 ? text : text.substring(0, eol)).strip();
        } catch (IOException e) {
            throw new IllegalArgumentException(from + " names " + file + ", which cannot be read: " + e.getMessage(), e);
        }
    }

    @Override
    public String toString() {
        return "InfluxSettings[url=" + url + ", database=" + database + ", retentionPolicy=" + retentionPolicy
                + ", username=" + username + ", password=" + (password.isEmpty() ? "" : "***") + "]";
    }
}
