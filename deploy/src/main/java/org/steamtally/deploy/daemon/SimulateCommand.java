package org.steamtally.deploy.daemon;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.DesignPoint;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.mqtt.PublisherOptions;
import org.steamtally.collector.mqtt.ReadingPublishers;
import org.steamtally.deploy.Launcher;
import org.steamtally.deploy.config.LoadedScenario;
import org.steamtally.deploy.config.PlantDescriptionException;
import org.steamtally.deploy.config.ScenarioException;
import org.steamtally.deploy.config.ScenarioLoader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code steamtally simulate}: simulated readings to a real broker, for commissioning and load tests. */
@Command(name = "simulate",
        mixinStandardHelpOptions = true,
        versionProvider = org.steamtally.deploy.VersionProvider.class,
        sortOptions = false,
        description = {"Publishes simulated readings of a unit (its design point, with instrument noise) to an "
                + "MQTT broker, each stamped with the wall-clock time, until stopped; with --scenario, the "
                + "scenario's instrument faults are applied. Only the shipped example units have a design "
                + "point so far."},
        exitCodeListHeading = "%nExit status:%n",
        exitCodeList = {"0:stopped on request", "2:usage error, unusable configuration or broker"})
public final class SimulateCommand implements Callable<Integer> {

    @Spec
    private CommandSpec spec;

    @Option(names = "--config", required = true, paramLabel = "FILE", description = "The plant description.")
    private Path config;

    @Option(names = "--broker", required = true, paramLabel = "URL", description = "e.g. tcp://127.0.0.1:1883")
    private String broker;

    @Option(names = "--unit", paramLabel = "ID", description = "The unit to simulate (default: the first).")
    private String unitId;

    @Option(names = "--scenario", paramLabel = "FILE", description = "A fault scenario (docs/SIMULATOR.md); its faults start counting from now "
                    + "unless it gives a start; its unit is the one simulated unless --unit says otherwise.")
    private Path scenario;

    @Option(names = "--rate", paramLabel = "HZ", defaultValue = "1",
            description = "Steps a second, each publishing every sensor once (default: ${DEFAULT-VALUE}).")
    private double rate;

    @Option(names = "--protocol", paramLabel = "VERSION", defaultValue = "5",
            description = "MQTT protocol, 5 or 3.1.1 (default: ${DEFAULT-VALUE}).")
    private String protocol;

    @Option(names = "--seed", paramLabel = "N", defaultValue = "1", description = "Noise seed (default: ${DEFAULT-VALUE}).")
    private long seed;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (!(rate > 0 && rate <= 1000)) {
            err.println("simulate: --rate " + rate + " must lie in (0, 1000] steps a second");
            return Launcher.EXIT_USAGE;
        }
        MqttProtocol p = MqttProtocol.fromLabel(protocol).orElse(null);
        if (p == null) {
            err.println("simulate: --protocol '" + protocol + "' is not 5 or 3.1.1");
            return Launcher.EXIT_USAGE;
        }
        DaemonConfigFiles files;
        try {
            files = DaemonConfigFiles.load(config);
        } catch (PlantDescriptionException e) {
            err.println("simulate: " + e.getMessage());
            return Launcher.EXIT_USAGE;
        }
        Instant runStart = Clock.systemUTC().instant();
        Prepared prepared;
        try {
            prepared = prepare(files, unitId, scenario, seed, runStart);
        } catch (IllegalArgumentException e) {
            err.println("simulate: " + e.getMessage());
            return Launcher.EXIT_USAGE;
        }
        UnitDescription unit = prepared.unit();
        Simulator simulator = prepared.simulator();
        PlantSimulation sim;
        try {
            sim = new PlantSimulation(unit, simulator, ReadingPublishers.connect(new PublisherOptions(List.of(broker),
                    p, "steamtally-simulate-" + unit.id(), PublisherOptions.DEFAULT_WINDOW, true, false)),
                    Clock.systemUTC());
        } catch (IllegalStateException | IllegalArgumentException e) {
            err.println("simulate: cannot connect to " + broker + ": " + e.getMessage());
            return Launcher.EXIT_USAGE;
        }
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            sim.close();
            stopped.countDown();
        }, "steamtally-simulate-shutdown"));
        sim.startPeriodic(Duration.ofNanos((long) (1e9 / rate)));
        out.println("simulate: unit " + unit.id() + " publishing to " + broker + " at " + rate
                + " steps a second" + prepared.scenario().map(l -> ", scenario '" + l.scenario().name() + "' with "
                + l.scenario().faults().size() + " faults from " + l.timeZero()).orElse("")
                + "; stop with Ctrl-C");
        out.flush();
        stopped.await();
        return 0;
    }

    /** What {@code simulate} publishes: the unit, its simulator with the scenario's faults, the scenario read. */
    record Prepared(UnitDescription unit, Simulator simulator, Optional<LoadedScenario> scenario) {
    }

    /**
     * Builds the simulator of one unit of a plant description, with the faults of a scenario file when
     * one is given; nothing is connected yet.
     *
     * @param unitId   the unit asked for, or null: the scenario's unit, else the first
     * @param scenario the scenario file, or null for a fault-free run
     * @param runStart time zero of fault starts when the scenario gives no {@code start}
     * @throws IllegalArgumentException naming the unit or listing the scenario's problems
     */
    static Prepared prepare(DaemonConfigFiles files, String unitId, Path scenario, long seed, Instant runStart) {
        Optional<LoadedScenario> loaded = Optional.empty();
        if (scenario != null) {
            try {
                loaded = Optional.of(ScenarioLoader.load(scenario, files.plant(), runStart));
            } catch (ScenarioException e) {
                throw new IllegalArgumentException(e.getMessage(), e);
            }
        }
        String wanted = unitId != null ? unitId
                : loaded.map(LoadedScenario::unitId).orElse(files.plant().units().get(0).id());
        if (loaded.isPresent() && !loaded.get().unitId().equals(wanted)) {
            throw new IllegalArgumentException("--unit " + wanted + " but the scenario " + scenario
                    + " is for unit " + loaded.get().unitId());
        }
        UnitDescription unit = files.plant().unit(wanted).orElseThrow(
                () -> new IllegalArgumentException("no unit '" + wanted + "' in the plant description"));
        DesignPoint design = ExampleDesignPoints.forUnit(files.plant().siteId(), unit.id()).orElseThrow(
                () -> new IllegalArgumentException("no design point known for unit " + unit.id() + " of site "
                        + files.plant().siteId() + "; only the shipped examples have one so far"));
        Simulator.Builder builder = Simulator.builder(TruthModel.of(unit, design)).seed(seed);
        loaded.ifPresent(l -> builder.scenario(l.scenario()));
        return new Prepared(unit, builder.build(), loaded);
    }
}
