package org.steamtally.deploy.sim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.steamtally.calc.cycle.ClosureResult;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.DesignPoint;
import org.steamtally.calc.sim.OperatingConditions;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.calc.sim.TruthPoint;
import org.steamtally.calc.steam.Steam;
import org.steamtally.deploy.config.PlantDescriptionLoader;

/**
 * The simulator's truth, read without noise, closes every balance the cycle model checks on each
 * shipped example, at the design point and away from it, and the model's cycle figures are the
 * truth's own.
 */
class ShippedExamplesTruthTest {

    /**
     * |z| below this: the truth closes to rounding. A residual of 1e-6 σ is about 0.3 W against a
     * generator closure of σ ≈ 0.3 MW, while a mis-modelled balance shows up at 1e-3 σ or more.
     */
    private static final double Z_TOLERANCE = 1e-6;
    /** Cycle figures are sums of a dozen products m·h of order 1e8 W: rounding is far below 1e-9. */
    private static final double RELATIVE_TOLERANCE = 1e-9;

    static Stream<Arguments> cases() {
        List<OperatingConditions> points = List.of(OperatingConditions.DESIGN,
                new OperatingConditions(0.6, 4.0), new OperatingConditions(0.3, -5.0));
        return Stream.of(
                // cycle, generator, feed-pump motor, fuel; the cooling water fixes the exhaust
                Arguments.of("simple.yaml", ExampleDesignPoints.simple(), 4),
                Arguments.of("reheat.yaml", ExampleDesignPoints.reheat(), 4),
                // and the condensate-pump motor
                Arguments.of("regenerative.yaml", ExampleDesignPoints.regenerative(), 5))
                .flatMap(a -> points.stream().map(p -> Arguments.of(a.get()[0], a.get()[1], p, a.get()[2])));
    }

    private static Path example(String name) {
        Path inModule = Path.of("examples", name);
        return Files.exists(inModule) ? inModule : Path.of("deploy", "examples", name);
    }

    @ParameterizedTest(name = "{0} at {2}")
    @MethodSource("cases")
    void noiseFreeTruthClosesEveryBalanceTheCycleModelChecks(String file, DesignPoint design,
                                                              OperatingConditions at, int closures)
            throws Exception {
        PlantDescription plant = PlantDescriptionLoader.load(example(file));
        UnitDescription unit = plant.units().get(0);
        TruthPoint truth = TruthModel.of(unit, design).at(at);
        for (Sensor s : unit.sensors()) {
            double v = truth.valueSi(s.id());
            assertTrue(s.isPlausible(v), s.id() + " reads " + v + " outside its range " + s.rangeMinSi() + " to "
                    + s.rangeMaxSi());
        }
        UnitResult result = CycleModel.compile(plant.siteId(), unit)
                .evaluate(Snapshot.allGood(Instant.parse("2026-12-02T06:00:00Z"), unit.id(), truth.sensorValuesSi()));

        for (StateResult s : result.states()) {
            assertTrue(s.valid(), "state " + s.id() + ": " + s.reason());
        }
        for (ComponentResult c : result.components()) {
            assertTrue(c.valid(), "component " + c.id() + ": " + c.reason());
        }
        assertEquals(closures, result.closure().size(), result.closure().toString());
        Map<String, Double> expected = truth.expectedResidualsW();
        for (ClosureResult c : result.closure()) {
            double z = (c.residualW() - expected.getOrDefault(c.id(), 0.0)) / c.sigmaW();
            assertTrue(Math.abs(z) < Z_TOLERANCE, c.id() + ": residual " + c.residualW() + " W, z " + c.z());
        }
        assertClose(truth.figures().heatAddedW(), result.cycle().heatAddedW().orElseThrow(), "heat added");
        assertClose(truth.figures().heatRejectedW(), result.cycle().heatRejectedW().orElseThrow(), "heat rejected");
        assertClose(truth.figures().turbineWorkW(), result.cycle().turbineWorkW().orElseThrow(), "turbine work");
        assertClose(truth.figures().pumpWorkW(), result.cycle().pumpWorkW().orElseThrow(), "pump work");
        assertClose(truth.figures().thermalEfficiency(), result.cycle().thermalEfficiency().orElseThrow(),
                "thermal efficiency");
        for (StateResult s : result.states()) {
            if (s.massFlowKgPerS().isPresent()) {
                assertClose(truth.state(s.id()).massFlowKgPerS(), s.massFlowKgPerS().getAsDouble(), "flow of " + s.id());
                assertClose(truth.state(s.id()).enthalpyJPerKg(), s.enthalpyJPerKg().getAsDouble(), "h of " + s.id());
            }
        }
    }

    @Test
    void heaterShellsFollowTheirExtractionAndKeepTheirTerminalTemperatureDifferenceAtPartLoad() throws Exception {
        UnitDescription unit = PlantDescriptionLoader.load(example("regenerative.yaml")).units().get(0);
        TruthModel model = TruthModel.of(unit, ExampleDesignPoints.regenerative());
        TruthPoint design = model.atDesign();
        TruthPoint low = model.at(new OperatingConditions(0.4, 0.0));
        // HP heater: shell (PT-431) keeps its design ratio to the HP extraction (PT-111).
        assertEquals(design.valueSi("PT-431") / design.valueSi("PT-111"), low.valueSi("PT-431") / low.valueSi("PT-111"),
                1e-12);
        // The feedwater leaving it (TT-421) stays the design distance below the shell's saturation temperature.
        double ttdDesign = Steam.saturationTemperature(design.valueSi("PT-431")) - design.valueSi("TT-421");
        double ttdLow = Steam.saturationTemperature(low.valueSi("PT-431")) - low.valueSi("TT-421");
        assertEquals(ttdDesign, ttdLow, 1e-9);
        assertTrue(low.valueSi("TT-421") < design.valueSi("TT-421") - 20.0, "final feedwater is colder at 40 % load");
        // The HP extraction itself follows the cone law against the HP section's outlet (cold reheat, PT-121).
        double pOut = low.valueSi("PT-121");
        double expected = Math.sqrt(pOut * pOut + 0.16 * (4.2e6 * 4.2e6 - 2.8e6 * 2.8e6));
        assertEquals(expected, low.valueSi("PT-111"), 1e-9 * expected);
    }

    private static void assertClose(double expected, double actual, String what) {
        assertEquals(expected, actual, RELATIVE_TOLERANCE * Math.abs(expected), what);
    }
}
