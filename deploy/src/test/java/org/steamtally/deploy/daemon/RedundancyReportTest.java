package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.reconcile.Reliability;
import org.steamtally.deploy.config.PlantDescriptionLoader;

/**
 * check-config's redundancy report gives every redundant sensor its redundancy number and minimum
 * detectable bias (Baarda 1968, see docs/DETECTION.md) and names the sensors whose 3σ error the
 * balances cannot find within a minute, on the shipped regenerative example with and without its
 * duplicate transmitters.
 */
class RedundancyReportTest {

    private static PlantDescription example() throws Exception {
        Path inModule = Path.of("examples", "regenerative.yaml");
        return PlantDescriptionLoader.load(Files.exists(inModule) ? inModule
                : Path.of("deploy", "examples", "regenerative.yaml"));
    }

    private static String printed(RedundancyReport.UnitReport r) {
        StringWriter out = new StringWriter();
        try (PrintWriter w = new PrintWriter(out)) {
            RedundancyReport.print(r, w);
        }
        return out.toString();
    }

    @Test
    void withItsDuplicateTransmittersEveryRedundantSensorOfTheExampleIsCheckedAtThreeSigmaWithinAWindow() throws Exception {
        PlantDescription plant = example();
        RedundancyReport.UnitReport r = RedundancyReport.of(plant, plant.units().get(0));
        Reliability.SensorReliability pt101 = r.reliability().stream().filter(s -> s.id().equals("PT-101"))
                .findFirst().orElseThrow();
        String text = printed(r);
        assertAll(
                () -> assertEquals(26, r.redundancy()),
                () -> assertEquals(List.of(), r.notCheckableAtTarget()),
                // the balances see almost nothing of PT-101; its duplicate makes the pair r ≈ 0.5 each
                () -> assertEquals(0.5, pt101.redundancyNumber(), 0.01),
                () -> assertTrue(text.contains("every redundant sensor: a 3 u bias is found within one window"), text),
                () -> assertTrue(text.contains("PT-101B"), text));
    }

    @Test
    void withoutThemTheReportNamesTheSensorsThatNeedASecondTransmitter() throws Exception {
        PlantDescription plant = example();
        UnitDescription full = plant.units().get(0);
        UnitDescription primaries = new UnitDescription(full.id(), full.name(),
                full.sensors().stream().filter(s -> !s.isDuplicate()).toList(), full.states(), full.components(),
                full.deadState());
        RedundancyReport.UnitReport r = RedundancyReport.of(plant, primaries);
        String text = printed(r);
        // docs/DETECTION.md, "without duplicate transmitters": 21 of 29 redundant sensors below 5.65
        List<String> duplicated = full.sensors().stream().filter(Sensor::isDuplicate)
                .map(s -> s.sameMeasurandAs().orElseThrow()).toList();
        assertAll(
                () -> assertEquals(5, r.redundancy()),
                () -> assertEquals(duplicated, r.notCheckableAtTarget()),
                () -> assertTrue(text.contains("cannot be checked at 3 u within one window (21)"), text),
                () -> assertTrue(text.contains("a second transmitter on each"), text));
    }
}
