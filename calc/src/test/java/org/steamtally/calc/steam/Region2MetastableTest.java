package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

class Region2MetastableTest {

    private static final double MPA = 1e6;
    private static final double KJ = 1e3;

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table18-region2-metastable.csv", useHeadersInDisplayName = true)
    void forwardPropertiesMatchPublishedValuesForMetastableVapour(double t, double pMpa, String v, String h,
                                                                  String u, String s, String cp, String w) {
        double p = pMpa * MPA;
        assertAll(
                () -> Published.assertRoundsTo(v, Region2Metastable.specificVolume(p, t), "v"),
                () -> Published.assertRoundsTo(h, Region2Metastable.enthalpy(p, t) / KJ, "h"),
                () -> Published.assertRoundsTo(u, Region2Metastable.internalEnergy(p, t) / KJ, "u"),
                () -> Published.assertRoundsTo(s, Region2Metastable.entropy(p, t) / KJ, "s"),
                () -> Published.assertRoundsTo(cp, Region2Metastable.isobaricHeatCapacity(p, t) / KJ, "cp"),
                () -> Published.assertRoundsTo(w, Region2Metastable.speedOfSound(p, t), "w"));
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table18-region2-metastable.csv", useHeadersInDisplayName = true)
    void isochoricHeatCapacityFollowsFromTheOtherPropertiesForMetastableVapour(double t, double pMpa) {
        // No cv check values are printed, and independent implementations place these states in
        // region 1. cv = cp − T·(∂v/∂T)²/(−∂v/∂p) links cv to the checked v and cp; central
        // differences with steps of 1e-4 relative carry errors of order 1e-8, so 1e-6 relative.
        double p = pMpa * MPA;
        double dt = 1e-4 * t;
        double dp = 1e-4 * p;
        double dvdT = (Region2Metastable.specificVolume(p, t + dt) - Region2Metastable.specificVolume(p, t - dt))
                / (2 * dt);
        double dvdp = (Region2Metastable.specificVolume(p + dp, t) - Region2Metastable.specificVolume(p - dp, t))
                / (2 * dp);
        double expected = Region2Metastable.isobaricHeatCapacity(p, t) + t * dvdT * dvdT / dvdp;
        assertEquals(expected, Region2Metastable.isochoricHeatCapacity(p, t), 1e-6 * expected);
    }
}
