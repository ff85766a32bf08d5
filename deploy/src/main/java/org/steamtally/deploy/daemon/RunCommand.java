package org.steamtally.deploy.daemon;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.nio.file.Files;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.dashboard.http.DashboardConfig;
import org.steamtally.dashboard.security.UserAccount;
import org.steamtally.deploy.Launcher;
import org.steamtally.deploy.config.PlantDescriptionException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code steamtally run}: the daemon, until SIGTERM or SIGINT. */
@Command(name = "run",
        mixinStandardHelpOptions = true,
        versionProvider = org.steamtally.deploy.VersionProvider.class,
        sortOptions = false,
        description = {
                "Runs the monitoring daemon: MQTT collector, cycle evaluation, reconciliation and alarms, "
                        + "result store and dashboard, until stopped by SIGTERM (graceful: intake stops, "
                        + "snapshots in hand finish, the store is flushed, the MQTT session is closed).",
                "",
                "Environment: STEAMTALLY_USERS_FILE (dashboard accounts, 'name role hash' a line); "
                        + "STEAMTALLY_HTTP_HOST (default of --http-host); STEAMTALLY_DASHBOARD_TLS_CERT_FILE and "
                        + "STEAMTALLY_DASHBOARD_TLS_KEY_FILE (PEM files, the dashboard then speaks HTTPS); "
                        + "STEAMTALLY_INFLUX_URL and the other STEAMTALLY_INFLUX_* variables for InfluxDB "
                        + "instead of the embedded store; secrets the collector section refers to."},
        exitCodeListHeading = "%nExit status:%n",
        exitCodeList = {"0:stopped on request", "2:usage error or unusable configuration"})
public final class RunCommand implements Callable<Integer> {

    /** Default of {@code --http-host}. */
    public static final String HTTP_HOST = "STEAMTALLY_HTTP_HOST";
    /** PEM certificate chain of the dashboard when it speaks HTTPS itself; set together with the key. */
    public static final String TLS_CERT_FILE = "STEAMTALLY_DASHBOARD_TLS_CERT_FILE";
    /** PEM private key belonging to {@link #TLS_CERT_FILE}. */
    public static final String TLS_KEY_FILE = "STEAMTALLY_DASHBOARD_TLS_KEY_FILE";

    @Spec
    private CommandSpec spec;

    @Option(names = "--config", required = true, paramLabel = "FILE",
            description = "The plant description with its collector (and optional alarms) section.")
    private Path config;

    @Option(names = "--data-dir", paramLabel = "DIR", defaultValue = "data",
            description = "Embedded store, journal and alarm state (default: ${DEFAULT-VALUE}).")
    private Path dataDir;

    @Option(names = "--http-port", paramLabel = "N", defaultValue = "8080",
            description = "Dashboard port on 127.0.0.1 (default: ${DEFAULT-VALUE}); 0 for any free port.")
    private int httpPort;

    /** The container image sets the variable to 0.0.0.0, so that a published port reaches the dashboard. */
    @Option(names = "--http-host", paramLabel = "HOST", defaultValue = "${env:" + HTTP_HOST + ":-127.0.0.1}",
            description = "Dashboard address to listen on (default: " + HTTP_HOST + " if set, else 127.0.0.1).")
    private String httpHost;

    @Override
    public Integer call() throws Exception {
        PrintWriter err = spec.commandLine().getErr();
        PrintWriter out = spec.commandLine().getOut();
        DaemonConfigFiles files;
        List<UserAccount> users;
        Optional<DashboardConfig.Tls> tls;
        try {
            tls = dashboardTls(System.getenv());
            files = DaemonConfigFiles.load(config);
            users = OperatorAccounts.fromEnvironment(System.getenv());
        } catch (PlantDescriptionException | IllegalArgumentException | java.io.IOException e) {
            err.println("run: " + e.getMessage());
            return Launcher.EXIT_USAGE;
        }
        if (files.collector().isEmpty()) {
            err.println("run: " + config + " has no 'collector' section; the daemon needs one to know its broker"
                    + " (docs/PLANT_DESCRIPTION.md)");
            return Launcher.EXIT_USAGE;
        }
        CollectorSettings collector = files.collector().get();
        if (httpPort < 0 || httpPort > 65_535) {
            err.println("run: --http-port " + httpPort + " must lie within 0 to 65535");
            return Launcher.EXIT_USAGE;
        }
        DashboardConfig dashboard = new DashboardConfig(httpHost, httpPort,
                DashboardConfig.defaults().anonymousViewing(), tls,
                DashboardConfig.defaults().sessionIdle(), DashboardConfig.defaults().maxLoginFailures(),
                DashboardConfig.defaults().loginWindow());
        Daemon daemon = new Daemon(new Daemon.Config(files.plant(), files.alarms(), collector, dataDir, dashboard,
                users, System.getenv(), Clock.systemUTC(), files.window()));
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            daemon.close();
            stopped.countDown();
        }, "steamtally-shutdown"));
        try {
            daemon.start();
        } catch (java.io.IOException | RuntimeException e) {
            // The hook closes whatever did start (store, collector) as the JVM exits.
            err.println("run: could not start: " + e.getMessage());
            return Launcher.EXIT_USAGE;
        }
        if (users.isEmpty()) {
            err.println("run: no dashboard accounts (" + OperatorAccounts.USERS_FILE
                    + " not set): alarms can be watched but not acknowledged or shelved");
        }
        out.println("steamtally running; dashboard at " + (tls.isPresent() ? "https://" : "http://") + httpHost + ":" + daemon.httpPort());
        out.flush();
        stopped.await();
        return 0;
    }

    /**
     * The dashboard's own HTTPS from {@link #TLS_CERT_FILE} and {@link #TLS_KEY_FILE}: both set and
     * readable, or neither (plain HTTP, e.g. behind a TLS-terminating proxy).
     *
     * @throws IllegalArgumentException naming the variable when only one is set or its file cannot be read
     */
    static Optional<DashboardConfig.Tls> dashboardTls(Map<String, String> environment) {
        String cert = blankToNull(environment.get(TLS_CERT_FILE));
        String key = blankToNull(environment.get(TLS_KEY_FILE));
        if (cert == null && key == null) {
            return Optional.empty();
        }
        if (cert == null || key == null) {
            throw new IllegalArgumentException((cert == null ? TLS_CERT_FILE : TLS_KEY_FILE) + " is not set but "
                    + (cert == null ? TLS_KEY_FILE : TLS_CERT_FILE) + " is; HTTPS needs both PEM files, or neither"
                    + " for plain HTTP");
        }
        for (Map.Entry<String, String> e : Map.of(TLS_CERT_FILE, cert, TLS_KEY_FILE, key).entrySet()) {
            if (!Files.isReadable(Path.of(e.getValue()))) {
                throw new IllegalArgumentException(e.getKey() + "=" + e.getValue() + " is not a readable file"
                        + " (expected a PEM file)");
            }
        }
        return Optional.of(new DashboardConfig.Tls(Path.of(cert), Path.of(key)));
    }

    private static String blankToNull(String s) {
        return s == null || s.isBlank() ? null : s;
    }
}
