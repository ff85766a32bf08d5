package org.steamtally.deploy.daemon;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.steamtally.calc.alarm.AlarmDefinition;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.deploy.config.WindowChannelSettings;
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
        out.println(windowLine(files.window()));
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

    /** One line on the window channel: off, or its length and the limits of its three alarm kinds. */
    static String windowLine(WindowChannelSettings w) {
        if (!w.enabled()) {
            return "window channel: off (alarms.window.enabled: false)";
        }
        return String.format(java.util.Locale.ROOT,
                "window channel: mean of the last %d s; alarm limits closure |z| %s, global test %s x chi-square"
                        + " quantile, suspect sensor |test value| %s",
                w.length().toSeconds(), limit(w, AlarmKind.CLOSURE), limit(w, AlarmKind.GLOBAL_TEST),
                limit(w, AlarmKind.SUSPECT_SENSOR));
    }

    private static String limit(WindowChannelSettings w, AlarmKind kind) {
        AlarmDefinition d = w.alarms().definition(kind);
        return d.enabled() ? Double.toString(d.limit()) : "(off)";
    }
}
