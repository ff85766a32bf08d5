package org.steamtally.deploy.replay;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.MetricsBasis;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.steam.Steam;
import org.steamtally.calc.steam.SteamState;
import org.steamtally.dashboard.json.ResultJson;
import org.steamtally.deploy.CommandRun;

/**
 * The whole calculation path from a recording to result records, on the shipped example
 * {@code deploy/examples/simple.yaml}: a consistent operating point of our own is built here by hand
 * (chosen turbine and pump efficiencies, a generator and motor as declared, cooling water sized to the
 * condenser duty), written as the messages its instruments would send, in their declared units,
 * replayed through the launcher, and the cycle figures compared with the hand computation.
 */
class SimpleExampleReplayTest {

    /** The operating point (our own numbers, a 40 MW class non-reheat unit). */
    private static final double MAIN_STEAM_PA = 9.0e6;
    private static final double MAIN_STEAM_K = 783.15;
    private static final double FLOW_KG_PER_S = 35.0;
    private static final double CONDENSER_PA = 7.0e3;
    private static final double FEED_PA = 10.5e6;
    private static final double TURBINE_EFFICIENCY = 0.86;
    private static final double PUMP_EFFICIENCY = 0.78;
    /** As declared in simple.yaml. */
    private static final double GENERATOR_EFFICIENCY = 0.975;
    private static final double MOTOR_EFFICIENCY = 0.95;
    private static final double BOILER_EFFICIENCY = 0.89;
    private static final double HEATING_VALUE_J_PER_KG = 25.1e6;
    private static final double ATMOSPHERE_PA = 100.8e3;
    private static final double COOLING_WATER_PA = 1.5e5 + ATMOSPHERE_PA;
    private static final double COOLING_WATER_IN_K = 291.15;
    private static final double COOLING_WATER_OUT_K = 300.15;

    private final SteamState mainSteam = Steam.statePT(MAIN_STEAM_PA, MAIN_STEAM_K);
    private final SteamState condensate = Steam.statePX(CONDENSER_PA, 0.0);
    private final double exhaustH = mainSteam.enthalpyJPerKg() - TURBINE_EFFICIENCY
            * (mainSteam.enthalpyJPerKg() - Steam.statePS(CONDENSER_PA, mainSteam.entropyJPerKgK()).enthalpyJPerKg());
    private final double feedH = condensate.enthalpyJPerKg()
            + (Steam.statePS(FEED_PA, condensate.entropyJPerKgK()).enthalpyJPerKg() - condensate.enthalpyJPerKg())
            / PUMP_EFFICIENCY;
    private final SteamState feedwater = Steam.statePH(FEED_PA, feedH);

    private final double heatAdded = FLOW_KG_PER_S * (mainSteam.enthalpyJPerKg() - feedH);
    private final double turbineWork = FLOW_KG_PER_S * (mainSteam.enthalpyJPerKg() - exhaustH);
    private final double pumpWork = FLOW_KG_PER_S * (feedH - condensate.enthalpyJPerKg());
    private final double heatRejected = FLOW_KG_PER_S * (exhaustH - condensate.enthalpyJPerKg());
    private final double coolingWaterFlow = heatRejected / (Steam.enthalpyPT(COOLING_WATER_PA, COOLING_WATER_OUT_K)
            - Steam.enthalpyPT(COOLING_WATER_PA, COOLING_WATER_IN_K));

    @Test
    void replayOfAConsistentRecordingReproducesTheHandComputedCycle(@TempDir Path dir) throws IOException {
        Path readings = dir.resolve("readings.jsonl");
        Files.writeString(readings, recording(5));
        Path results = dir.resolve("results.jsonl");
        CommandRun run = CommandRun.of(new String[] {"replay", "--config", "examples/simple.yaml",
                "--in", readings.toString(), "--out", results.toString()});
        assertEquals(0, run.status(), run.err());
        List<String> lines = Files.readAllLines(results);
        assertTrue(lines.size() >= 3, "snapshots: " + lines.size() + "\n" + run.err());
        UnitResult result = ResultJson.read(lines.get(lines.size() - 1));

        double netWork = turbineWork - pumpWork;
        double efficiency = netWork / heatAdded;
        // The recording carries the values to 9 significant digits and the exhaust enthalpy is
        // recovered from the cooling-water balance, so the figures agree to about 1e-7 relative;
        // 1e-6 leaves room and is far below any modelling error worth catching.
        double tolerance = 1e-6;
        assertAll(
                () -> assertRelative(heatAdded, result.cycle().heatAddedW().getAsDouble(), tolerance, "heat added"),
                () -> assertRelative(turbineWork, result.cycle().turbineWorkW().getAsDouble(), tolerance, "turbine work"),
                () -> assertRelative(pumpWork, result.cycle().pumpWorkW().getAsDouble(), 1e-4, "pump work"),
                () -> assertRelative(efficiency, result.cycle().thermalEfficiency().getAsDouble(), tolerance, "efficiency"),
                () -> assertRelative(3600.0 / efficiency, result.cycle().heatRateKJPerKWh().getAsDouble(), tolerance,
                        "heat rate"),
                () -> assertRelative(pumpWork / turbineWork, result.cycle().backWorkRatio().getAsDouble(), 1e-4,
                        "back-work ratio"),
                // generator, fuel and motor check the balances; the cooling water fixes the exhaust
                () -> assertEquals("passed", result.reconciliation().status(), result.reconciliation().toString()),
                () -> assertEquals(3, result.reconciliation().redundancy()),
                () -> assertEquals(MetricsBasis.RECONCILED, result.metricsBasis()));
        for (ClosureResult closure : result.closure()) {
            // A consistent recording closes every balance: |z| far below 1.
            assertTrue(Math.abs(closure.z()) < 0.01, closure.toString());
        }
        assertFalse(result.closure().isEmpty(), "the example has independent measurements to close on");
    }

    @Test
    void aBiasedGeneratorReadingShowsInTheTurbineAndCycleResiduals(@TempDir Path dir) throws IOException {
        double bias = 0.02;
        Path readings = dir.resolve("readings.jsonl");
        Files.writeString(readings, recording(5, 1.0 + bias));
        Path results = dir.resolve("results.jsonl");
        CommandRun run = CommandRun.of(new String[] {"replay", "--config", "examples/simple.yaml",
                "--in", readings.toString(), "--out", results.toString()});
        assertEquals(0, run.status(), run.err());
        List<String> lines = Files.readAllLines(results);
        UnitResult result = ResultJson.read(lines.get(lines.size() - 1));
        // The residual is steam side minus independent measurement: W_turbine − P_el / η_gen, which a
        // generator reading (1 + b) times too high makes −b · W_turbine; the cycle residual, which
        // takes its net work from the generator, moves by the same amount.
        double expected = -bias * turbineWork;
        ClosureResult turbine = closure(result, "turbine+generator");
        ClosureResult cycle = closure(result, "cycle");
        assertAll(
                () -> assertRelative(expected, turbine.residualW(), 1e-4, "turbine+generator residual"),
                () -> assertRelative(expected, cycle.residualW(), 1e-4, "cycle residual"),
                () -> assertEquals(turbine.residualW() / turbine.sigmaW(), turbine.z(), 1e-12, "z = r / sigma"),
                // With the exhaust enthalpy taken from the cooling-water balance, u(r) is dominated by
                // the cooling-water flow (1 % standard) and the 9 K rise (0.1 K per RTD): about
                // 1.5 MW here, so a 2 % generator bias (0.8 MW) stays below one sigma. The number is
                // the instruments' verdict, not the software's.
                () -> assertTrue(turbine.sigmaW() > 1.0e6 && turbine.sigmaW() < 2.0e6, turbine.toString()));
    }

    private static ClosureResult closure(UnitResult result, String id) {
        return result.closure().stream().filter(c -> c.id().equals(id)).findFirst()
                .orElseThrow(() -> new AssertionError("no closure " + id + " in " + result.closure()));
    }

    private String recording(int seconds) {
        return recording(seconds, 1.0);
    }

    /** One message per sensor per second, in the units simple.yaml declares for each. */
    private String recording(int seconds, double generatorFactor) {
        double generatorMW = turbineWork * GENERATOR_EFFICIENCY / 1e6 * generatorFactor;
        double motorKW = pumpWork / MOTOR_EFFICIENCY / 1e3;
        double fuel = heatAdded / (BOILER_EFFICIENCY * HEATING_VALUE_J_PER_KG);
        StringBuilder out = new StringBuilder();
        long start = 1_764_633_600_000L;
        for (int s = 0; s < seconds; s++) {
            long ts = start + 1000L * s;
            message(out, "PT-101", ts, MAIN_STEAM_PA / 1e6);
            message(out, "TT-101", ts, MAIN_STEAM_K - 273.15);
            message(out, "FT-101", ts, FLOW_KG_PER_S * 3.6);
            message(out, "PT-301", ts, CONDENSER_PA / 1e3);
            message(out, "PT-302", ts, CONDENSER_PA / 1e3);
            message(out, "PT-401", ts, FEED_PA / 1e5);
            message(out, "TT-401", ts, feedwater.temperatureK() - 273.15);
            message(out, "FT-501", ts, coolingWaterFlow);
            message(out, "TT-501", ts, COOLING_WATER_IN_K - 273.15);
            message(out, "TT-502", ts, COOLING_WATER_OUT_K - 273.15);
            message(out, "FT-900", ts, fuel);
            message(out, "JT-001", ts, generatorMW);
            message(out, "JT-401", ts, motorKW);
        }
        return out.toString();
    }

    private static void message(StringBuilder out, String tag, long ts, double value) {
        out.append("{\"topic\":\"fernholm/unit1/").append(tag).append("\",\"ts\":").append(ts)
                .append(",\"value\":").append(String.format(java.util.Locale.ROOT, "%.9g", value)).append("}\n");
    }

    private static void assertRelative(double expected, double actual, double tolerance, String what) {
        assertEquals(expected, actual, tolerance * Math.abs(expected), what);
    }
}
