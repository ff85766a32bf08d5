package org.steamtally.deploy.daemon;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.Optional;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import org.steamtally.deploy.Launcher;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code steamtally demo}: the whole daemon on a simulated plant, no external services. */
@Command(name = "demo",
        mixinStandardHelpOptions = true,
        versionProvider = org.steamtally.deploy.VersionProvider.class,
        sortOptions = false,
        description = {
                "Runs the daemon on the simulated regenerative example unit (the fictional site fernholm): "
                        + "an embedded MQTT broker, the simulator publishing once a second, the embedded "
                        + "store and the dashboard, whose page then offers a panel to inject sensor faults. "
                        + "Stop with Ctrl-C."},
        exitCodeListHeading = "%nExit status:%n",
        exitCodeList = {"0:stopped on request", "2:usage error, or the demo could not start"})
public final class DemoCommand implements Callable<Integer> {

    @Spec
    private CommandSpec spec;

    @Option(names = "--http-port", paramLabel = "N", defaultValue = "8080",
            description = "Dashboard port on 127.0.0.1 (default: ${DEFAULT-VALUE}); 0 for any free port.")
    private int httpPort;

    @Option(names = "--data-dir", paramLabel = "DIR",
            description = "Where the demo keeps its store (default: a new temporary directory).")
    private Path dataDir;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (httpPort < 0 || httpPort > 65_535) {
            err.println("demo: --http-port " + httpPort + " must lie within 0 to 65535");
            return Launcher.EXIT_USAGE;
        }
        Path dir = dataDir != null ? dataDir : Files.createTempDirectory("steamtally-demo-");
        Demo demo;
        try {
            demo = Demo.start(httpPort, dir, Optional.empty(), System.getenv(), Clock.systemUTC());
        } catch (Exception e) {
            err.println("demo: could not start: " + e.getMessage());
            return Launcher.EXIT_USAGE;
        }
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            demo.close();
            stopped.countDown();
        }, "steamtally-demo-shutdown"));
        out.println("steamtally demo: dashboard at " + demo.address());
        out.println("  operator login for the fault panel and alarm actions: " + Demo.OPERATOR + " / "
                + demo.operatorPassword());
        out.println("  data directory: " + dir);
        out.println("  advisory only: not a protection or control system. Stop with Ctrl-C.");
        out.flush();
        stopped.await();
        return 0;
    }
}
