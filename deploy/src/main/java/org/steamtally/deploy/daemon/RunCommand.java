package org.steamtally.deploy.daemon;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.util.List;
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
                        + "STEAMTALLY_INFLUX_URL and the other STEAMTALLY_INFLUX_* variables for InfluxDB "
                        + "instead of the embedded store; secrets the collector section refers to."},
        exitCodeListHeading = "%nExit status:%n",
        exitCodeList = {"0:stopped on request", "2:usage error or unusable configuration"})
public final class RunCommand implements Callable<Integer> {

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

    @Option(names = "--http-host", paramLabel = "HOST", defaultValue = "127.0.0.1",
            description = "Dashboard address to listen on (default: ${DEFAULT-VALUE}).")
    private String httpHost;

    @Override
    public Integer call() throws Exception {
        PrintWriter err = spec.commandLine().getErr();
        PrintWriter out = spec.commandLine().getOut();
        DaemonConfigFiles files;
        List<UserAccount> users;
        try {
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
                DashboardConfig.defaults().anonymousViewing(), DashboardConfig.defaults().tls(),
                DashboardConfig.defaults().sessionIdle(), DashboardConfig.defaults().maxLoginFailures(),
                DashboardConfig.defaults().loginWindow());
        Daemon daemon = new Daemon(new Daemon.Config(files.plant(), files.alarms(), collector, dataDir, dashboard,
                users, System.getenv(), Clock.systemUTC()));
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
        out.println("steamtally running; dashboard at http://" + httpHost + ":" + daemon.httpPort());
        out.flush();
        stopped.await();
        return 0;
    }
}
