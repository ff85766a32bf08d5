package org.steamtally.collector.ingest;

import java.time.Duration;
import java.util.List;
import java.util.Optional;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

/**
 * A fictional plant for the ingest tests: site "fernholm", unit "unit1" with a live-steam pressure
 * (MPa, 0 to 30 MPa), a live-steam temperature (°C, 0 to 650 °C), a feedwater flow (t/h) and a
 * barometer (kPa); unit "unit2" with one pressure whose topic is given explicitly.
 */
final class TestPlant {

    static final String SITE = "fernholm";
    static final double ATMOSPHERIC_PA = 100_000.0;

    static final Sensor PT = new Sensor("PT-101", Quantity.PRESSURE, "MPa", 1e4, UncertaintyBasis.STANDARD,
            0.0, 30e6, Duration.ofSeconds(5), Optional.empty());
    static final Sensor TT = new Sensor("TT-101", Quantity.TEMPERATURE, "Cel", 0.5, UncertaintyBasis.STANDARD,
            273.15, 923.15, Duration.ofSeconds(5), Optional.empty());
    static final Sensor FT = new Sensor("FT-101", Quantity.MASS_FLOW, "t/h", 0.1, UncertaintyBasis.STANDARD,
            0.0, 200.0, Duration.ofSeconds(5), Optional.empty());
    static final Sensor PB = new Sensor("PB-001", Quantity.PRESSURE, "kPa", 50.0, UncertaintyBasis.STANDARD,
            80e3, 110e3, Duration.ofSeconds(60), Optional.empty());
    static final Sensor PT2 = new Sensor("PT-201", Quantity.PRESSURE, "barg", 1e3, UncertaintyBasis.STANDARD,
            0.0, 5e6, Duration.ofSeconds(5), Optional.of("legacy/fernholm/u2/pressure"));

    static final UnitDescription UNIT1 = new UnitDescription("unit1", "Unit 1", List.of(PT, TT, FT, PB),
            List.of(), List.of(), DeadState.STANDARD);
    static final UnitDescription UNIT2 = new UnitDescription("unit2", "Unit 2", List.of(PT2),
            List.of(), List.of(), DeadState.STANDARD);

    static final PlantDescription PLANT = new PlantDescription(SITE, "Fernholm", ATMOSPHERIC_PA,
            List.of(UNIT1, UNIT2));

    static final String TEMPLATE = "{site}/{unit}/{sensor}";

    static TopicMap topics() {
        return TopicMap.of(PLANT, Optional.of(TEMPLATE));
    }

    private TestPlant() {
    }
}
