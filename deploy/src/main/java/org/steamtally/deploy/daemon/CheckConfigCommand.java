package org.steamtally.deploy.daemon;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.deploy.Launcher;
import org.steamtally.deploy.config.PlantDescriptionException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code steamtally check-config}: validates a configuration and reports which sensors can be checked. */
@Command(name = "check-config",
        mixinStandardHelpOptions = true,
        versionProvider = org.steamtally.deploy.VersionProvider.class,
        description = {
                "Validates a plant description with its alarms and collector sections and prints, per unit, "
                        + "which sensors the reconciliation can check (redundant), which it cannot (just "
                        + "determined) and which unmeasured quantities it can estimate."},
        exitCodeListHeading = "%nExit status:%n",
        exitCodeList = {"0:valid", "1:valid, but a unit could not be reconciled for the report",
                "2:invalid or unreadable (every problem is listed)"})
public final class CheckConfigCommand implements Callable<Integer> {

    @Spec
    private CommandSpec spec;

    @Option(names = "--config", required = true, paramLabel = "FILE", description = "The plant description.")
    private Path config;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        DaemonConfigFiles files;
        try {
            files = DaemonConfigFiles.load(config);
        } catch (PlantDescriptionException e) {
            err.println("check-config: " + e.getMessage());
            return Launcher.EXIT_USAGE;
        }
        out.println(config + ": valid; site " + files.plant().siteId() + ", " + files.plant().units().size()
                + " unit(s); collector section " + (files.collector().isPresent() ? "present" : "absent (run needs one)"));
        int status = 0;
        for (UnitDescription unit : files.plant().units()) {
            try {
                RedundancyReport.print(RedundancyReport.of(files.plant(), unit), out);
            } catch (RuntimeException e) {
                err.println("check-config: unit " + unit.id() + ": no redundancy report: " + e.getMessage());
                status = Launcher.EXIT_PARTIAL_FAILURE;
            }
        }
        out.flush();
        return status;
    }
}
