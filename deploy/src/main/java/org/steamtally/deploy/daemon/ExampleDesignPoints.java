package org.steamtally.deploy.daemon;

import java.util.Optional;
import org.steamtally.calc.sim.DesignPoint;

/**
 * Design points of our own for the three shipped example units (the fictional site fernholm), in SI:
 * what the demo simulates and what {@code check-config} linearises the reconciliation at. Pressures
 * and temperatures follow the comments in the example files; flows are chosen so that every derived
 * sensor (generator, motors, fuel, cooling-water outlet) lies within its declared range. Isentropic
 * efficiencies of 0.85 to 0.88 for turbine sections and 0.70 to 0.80 for pumps are typical of such
 * units (common practice).
 */
public final class ExampleDesignPoints {

    /** The site id of the shipped examples. */
    public static final String SITE = "fernholm";

    private static final double CELSIUS = 273.15;

    private ExampleDesignPoints() {
    }

    /** The design point of a shipped example unit, by site and unit id; empty for any other unit. */
    public static Optional<DesignPoint> forUnit(String siteId, String unitId) {
        if (!SITE.equals(siteId)) {
            return Optional.empty();
        }
        return switch (unitId) {
            case "unit1" -> Optional.of(simple());
            case "unit2" -> Optional.of(reheat());
            case "unit3" -> Optional.of(regenerative());
            default -> Optional.empty();
        };
    }

    /** simple.yaml, unit1: 9 MPa, 510 °C, exhaust 7 kPa. */
    public static DesignPoint simple() {
        return DesignPoint.builder()
                .flow("main_steam", 36.0)
                .value("PT-101", 9.0e6).value("TT-101", 510 + CELSIUS)
                .value("PT-301", 7.0e3).value("PT-302", 7.0e3)
                .value("PT-401", 10.5e6)
                .value("FT-501", 1700.0).value("TT-501", 18 + CELSIUS)
                .isentropicEfficiency("turbine", 0.86)
                .isentropicEfficiency("feed_pump", 0.80)
                .build();
    }

    /** reheat.yaml, unit2: 12.5 MPa, 537 °C, reheat 3.0 MPa, exhaust 6.8 kPa. */
    public static DesignPoint reheat() {
        return DesignPoint.builder()
                .flow("main_steam", 100.0)
                .value("PT-201", 12.5e6).value("TT-201", 810.0)
                .value("PT-211", 3.2e6)
                .value("PT-221", 3.0e6).value("TT-221", 810.0)
                .value("PT-231", 6.8e3).value("PT-232", 6.8e3)
                .value("PT-241", 14.6e6)
                .value("FT-251", 7560.0).value("TT-251", 294.26)
                .isentropicEfficiency("hp_turbine", 0.85)
                .isentropicEfficiency("lp_turbine", 0.88)
                .isentropicEfficiency("feed_pump", 0.80)
                .build();
    }

    /** regenerative.yaml, unit3: 12.5 MPa, 540 °C, 125 kg/s, reheat 2.6 MPa, two heaters and a deaerator. */
    public static DesignPoint regenerative() {
        return DesignPoint.builder()
                .flow("main_steam", 125.0)
                .value("PT-101", 12.5e6).value("TT-101", 540 + CELSIUS)
                .value("PT-111", 4.2e6).value("TT-111", 395 + CELSIUS)
                .value("PT-121", 2.8e6).value("TT-121", 345 + CELSIUS)
                .value("PT-131", 2.6e6).value("TT-131", 540 + CELSIUS)
                .value("PT-141", 0.9e6).value("TT-141", 400 + CELSIUS)
                .value("PT-151", 250e3).value("TT-151", 250 + CELSIUS)
                .value("PT-301", 8.0e3).value("PT-302", 8.0e3)
                .value("PT-311", 1.6e6)
                .value("PT-321", 1.5e6).value("TT-321", 122 + CELSIUS)
                .value("PT-331", 240e3)
                .value("PT-341", 1.6e6)
                .value("PT-401", 0.85e6)
                .value("PT-411", 15.0e6)
                .value("PT-421", 14.6e6).value("TT-421", 245 + CELSIUS)
                .value("PT-431", 4.0e6)
                .value("FT-501", 5000.0).value("TT-501", 18 + CELSIUS)
                .flowMeter("FT-421", "feedwater")
                .isentropicEfficiency("lp_turbine", 0.88)
                .isentropicEfficiency("condensate_pump", 0.75)
                .isentropicEfficiency("drain_pump", 0.70)
                .isentropicEfficiency("feed_pump", 0.80)
                .build();
    }
}
