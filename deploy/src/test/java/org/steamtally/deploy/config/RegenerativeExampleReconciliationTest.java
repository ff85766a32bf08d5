package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.reconcile.ReconcilingEvaluator;

/**
 * The shipped regenerative example, as the loader reads it, reconciles: every instrument the
 * balances use takes part, the declared constants too, and the redundancy is that of its
 * independent measurements. The readings are the nominal figures of the file's comments, which do
 * not close the balances exactly, so only the structure is checked here; the numbers are checked
 * in calc's tests against a consistent operating point.
 */
class RegenerativeExampleReconciliationTest {

    /** Nominal readings in SI, from the comments of regenerative.yaml. */
    private static final Map<String, Double> NOMINAL = Map.ofEntries(
            Map.entry("PT-101", 12.5e6), Map.entry("TT-101", 813.15), Map.entry("FT-101", 125.0),
            Map.entry("PT-111", 4.2e6), Map.entry("TT-111", 668.15),
            Map.entry("PT-121", 2.8e6), Map.entry("TT-121", 618.15),
            Map.entry("PT-131", 2.6e6), Map.entry("TT-131", 813.15),
            Map.entry("PT-141", 0.9e6), Map.entry("TT-141", 673.15),
            Map.entry("PT-151", 250e3), Map.entry("TT-151", 523.15),
            Map.entry("PT-301", 8e3), Map.entry("PT-302", 8e3),
            Map.entry("PT-311", 1.6e6), Map.entry("TT-311", 315.15),
            Map.entry("PT-321", 1.5e6), Map.entry("TT-321", 395.15),
            Map.entry("PT-331", 240e3), Map.entry("PT-341", 1.6e6), Map.entry("TT-341", 400.15),
            Map.entry("PT-401", 0.85e6), Map.entry("PT-411", 15e6), Map.entry("TT-411", 450.15),
            Map.entry("PT-421", 14.6e6), Map.entry("TT-421", 518.15), Map.entry("FT-421", 125.0),
            Map.entry("PT-431", 4.0e6), Map.entry("FT-501", 5000.0), Map.entry("TT-501", 291.15),
            Map.entry("TT-502", 300.15), Map.entry("FT-900", 16.0), Map.entry("JT-001", 150e6),
            Map.entry("JT-601", 2.6e6), Map.entry("JT-602", 250e3));

    @Test
    void loadedExampleReconcilesWithEveryBalanceInstrumentAndARedundancyOfFivePlusOnePerDuplicate() throws Exception {
        Path inModule = Path.of("examples", "regenerative.yaml");
        Path file = Files.exists(inModule) ? inModule : Path.of("deploy", "examples", "regenerative.yaml");
        UnitDescription unit = PlantDescriptionLoader.load(file).units().get(0);
        List<Sensor> sensors = unit.sensors();
        double[] values = new double[sensors.size()];
        for (int i = 0; i < values.length; i++) {
            // a duplicate transmitter reads what its primary reads
            values[i] = NOMINAL.get(sensors.get(i).sameMeasurandAs().orElse(sensors.get(i).id()));
        }
        UnitResult result = ReconcilingEvaluator.compile("fernholm", unit)
                .evaluate(Snapshot.allGood(Instant.parse("2026-12-01T06:30:00Z"), unit.id(), values));
        List<ReconciledSensor> reconciled = result.reconciliation().sensors();
        assertAll(
                () -> assertTrue(List.of("passed", "failed").contains(result.reconciliation().status()),
                        result.reconciliation().status() + " " + result.reconciliation().reason()),
                // the five independent measurements, and one for each of the 21 duplicate transmitters
                () -> assertEquals(5 + 21, result.reconciliation().redundancy()),
                // all 57 sensors are in the balances, fix a state or check one; 5 declared constants have an uncertainty
                () -> assertEquals(57 + 5, reconciled.size()),
                () -> assertEquals("just_determined",
                        reconciled.stream().filter(s -> s.id().equals("PT-301")).findFirst().orElseThrow().redundancy()),
                () -> assertTrue(reconciled.stream().filter(s -> s.id().equals("FT-421")).findFirst().orElseThrow()
                        .testValue().isPresent()));
    }
}
