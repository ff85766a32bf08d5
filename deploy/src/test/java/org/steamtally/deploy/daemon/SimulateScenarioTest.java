package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.sim.Fault;
import org.steamtally.deploy.Launcher;
import picocli.CommandLine;

/**
 * {@code simulate --scenario}: the shipped fault scenario of the regenerative example reaches the
 * simulator that would publish, and a bad scenario stops the command before it connects anywhere.
 */
class SimulateScenarioTest {

    private static final Instant RUN_START = Instant.parse("2026-12-02T06:00:00Z");

    private static Path example(String name) {
        Path inModule = Path.of("examples", name);
        return Files.exists(inModule) ? inModule : Path.of("deploy", "examples", name);
    }

    @Test
    void theShippedScenarioPutsItsThreeFaultsIntoTheSimulatorOfItsUnit() throws Exception {
        DaemonConfigFiles files = DaemonConfigFiles.load(example("regenerative.yaml"));
        SimulateCommand.Prepared prepared = SimulateCommand.prepare(files, null,
                example("regenerative-faults.yaml"), 1, RUN_START);
        assertEquals("unit3", prepared.unit().id(), "the scenario's unit");
        List<Fault> faults = prepared.simulator().faults();
        assertEquals(List.of("FT-421", "TT-502", "PT-151"), faults.stream().map(Fault::sensorId).toList());
        // The file gives no start: fault starts count from the run's start (2 min, 40 min, 50 min).
        assertEquals(RUN_START.plus(Duration.ofMinutes(2)), faults.get(0).start());
        assertTrue(faults.get(0) instanceof Fault.Bias);
        // PT-151 drops out from minute 50 to 52: the simulator then sends no reading of it.
        assertTrue(prepared.simulator().step(RUN_START.plus(Duration.ofMinutes(51))).readings().stream()
                .noneMatch(r -> r.sensorId().equals("PT-151")));
    }

    @Test
    void withoutAScenarioTheSimulatorHasNoFaults() throws Exception {
        DaemonConfigFiles files = DaemonConfigFiles.load(example("regenerative.yaml"));
        SimulateCommand.Prepared prepared = SimulateCommand.prepare(files, null, null, 1, RUN_START);
        assertTrue(prepared.simulator().faults().isEmpty());
        assertTrue(prepared.scenario().isEmpty());
    }

    @Test
    void aUnitOtherThanTheScenariosIsRefusedNamingBoth() throws Exception {
        DaemonConfigFiles files = DaemonConfigFiles.load(example("regenerative.yaml"));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> SimulateCommand.prepare(
                files, "unit9", example("regenerative-faults.yaml"), 1, RUN_START));
        assertTrue(e.getMessage().contains("unit9") && e.getMessage().contains("unit3"), e.getMessage());
    }

    @Test
    void aScenarioNamingAnUnknownSensorStopsTheCommandBeforeItConnects(@TempDir Path dir) throws Exception {
        Path bad = Files.writeString(dir.resolve("bad.yaml"), "scenario:\n  name: x\n  unit: unit3\n  faults:\n"
                + "    - {sensor: XX-999, kind: dropout, start: 1min, duration: 1min}\n");
        StringWriter err = new StringWriter();
        CommandLine cmd = new CommandLine(new SimulateCommand());
        cmd.setErr(new PrintWriter(err));
        cmd.setOut(new PrintWriter(new StringWriter()));
        // Port 9 (discard) on loopback: never reached, the scenario is read first.
        int status = cmd.execute("--config", example("regenerative.yaml").toString(), "--broker",
                "tcp://127.0.0.1:9", "--scenario", bad.toString());
        assertEquals(Launcher.EXIT_USAGE, status);
        assertTrue(err.toString().contains("XX-999"), err.toString());
    }
}
