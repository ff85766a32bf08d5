package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.function.Executable;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The facade: region selection, round trips of every input pair through the whole range, the
 * two-phase states, and the rejection of input outside the formulation.
 */
class SteamTest {

    /**
     * Backward pairs are refined on the forward equations, so a round trip is limited only by
     * rounding in the Newton steps; 1e-9 relative is the promise the closure check relies on.
     */
    private static final double ROUND_TRIP = 1e-9;
    private static final long SEED = 42L;

    @Test
    void everyBackwardPairRoundTripsThroughTheSinglePhaseRegions() {
        SplittableRandom random = new SplittableRandom(SEED);
        for (int i = 0; i < 3_000; i++) {
            SteamState given = singlePhaseState(random);
            double p = given.pressurePa();
            double T = given.temperatureK();
            String where = "p = " + p + " Pa, T = " + T + " K, " + given.region() + ", seed " + SEED;
            SteamState fromPH = Steam.statePH(p, given.enthalpyJPerKg());
            SteamState fromPS = Steam.statePS(p, given.entropyJPerKgK());
            assertAll(where,
                    () -> assertEquals(given.region(), fromPH.region(), "region from (p,h)"),
                    () -> assertRelative(T, fromPH.temperatureK(), "T from (p,h)"),
                    () -> assertRelative(given.entropyJPerKgK(), fromPH.entropyJPerKgK(), "s from (p,h)"),
                    () -> assertRelative(given.specificVolumeM3PerKg(), fromPH.specificVolumeM3PerKg(), "v from (p,h)"),
                    () -> assertEquals(given.region(), fromPS.region(), "region from (p,s)"),
                    () -> assertRelative(T, fromPS.temperatureK(), "T from (p,s)"),
                    () -> assertRelative(given.enthalpyJPerKg(), fromPS.enthalpyJPerKg(), "h from (p,s)"));
        }
    }

    @Test
    void enthalpyAndEntropyRoundTripThroughTheMollierPair() {
        SplittableRandom random = new SplittableRandom(SEED + 1);
        for (int i = 0; i < 600; i++) {
            SteamState given = singlePhaseState(random);
            double p = given.pressurePa();
            double T = given.temperatureK();
            SteamState found = Steam.stateHS(given.enthalpyJPerKg(), given.entropyJPerKgK());
            String where = "p = " + p + " Pa, T = " + T + " K, " + given.region() + ", seed " + (SEED + 1);
            assertAll(where,
                    () -> assertEquals(given.region(), found.region(), "region"),
                    () -> assertRelative(p, found.pressurePa(), "p"),
                    () -> assertRelative(T, found.temperatureK(), "T"));
        }
    }

    /**
     * A single-phase state drawn uniformly in T and log-uniformly in p over the whole formulation,
     * kept 0.1 % in pressure away from the saturation line, where (p, T) does not tell the phases apart.
     */
    private static SteamState singlePhaseState(SplittableRandom random) {
        while (true) {
            double T = 273.16 + random.nextDouble() * (2273.15 - 273.16);
            double pMax = T > 1073.15 ? 50e6 : 100e6;
            double p = Math.exp(Math.log(700.0) + random.nextDouble() * (Math.log(pMax) - Math.log(700.0)));
            boolean nearSaturation = T < If97Constants.CRITICAL_TEMPERATURE_K
                    && Math.abs(p - Saturation.pressure(T)) < 1e-3 * p;
            if (!nearSaturation) {
                return Steam.statePT(p, T);
            }
        }
    }

    @Test
    void wetStatesRoundTripThroughEveryPairThatFixesThem() {
        SplittableRandom random = new SplittableRandom(SEED + 2);
        for (int i = 0; i < 1_000; i++) {
            double T = 273.16 + random.nextDouble() * (646.5 - 273.16);
            double x = 0.01 + 0.98 * random.nextDouble();
            SteamState wet = Steam.stateTX(T, x);
            String where = "T = " + T + " K, x = " + x;
            assertEquals(Region.REGION_4, wet.region(), where);
            assertTrue(wet.isobaricHeatCapacityJPerKgK().isEmpty(), "no cp for a wet state");
            SteamState fromPX = Steam.statePX(wet.pressurePa(), x);
            SteamState fromPH = Steam.statePH(wet.pressurePa(), wet.enthalpyJPerKg());
            SteamState fromPS = Steam.statePS(wet.pressurePa(), wet.entropyJPerKgK());
            SteamState fromHS = Steam.stateHS(wet.enthalpyJPerKg(), wet.entropyJPerKgK());
            assertAll(where,
                    () -> assertRelative(T, fromPX.temperatureK(), "T from (p,x)"),
                    () -> assertEquals(x, fromPH.quality().getAsDouble(), 1e-8, "x from (p,h)"),
                    () -> assertEquals(x, fromPS.quality().getAsDouble(), 1e-8, "x from (p,s)"),
                    () -> assertEquals(Region.REGION_4, fromHS.region(), "region from (h,s)"),
                    () -> assertEquals(x, fromHS.quality().getAsDouble(), 1e-7, "x from (h,s)"),
                    () -> assertRelative(wet.pressurePa(), fromHS.pressurePa(), 1e-7, "p from (h,s)"));
        }
    }

    @Test
    void saturatedEndsHaveQualityZeroAndOne() {
        SteamState liquid = Steam.statePX(1e5, 0.0);
        SteamState vapour = Steam.statePX(1e5, 1.0);
        assertEquals(Region1.enthalpy(1e5, liquid.temperatureK()), liquid.enthalpyJPerKg(), 0.0);
        assertEquals(Region2.enthalpy(1e5, vapour.temperatureK()), vapour.enthalpyJPerKg(), 0.0);
        assertEquals(0.0, Steam.statePH(1e5, liquid.enthalpyJPerKg()).quality().getAsDouble(), 1e-12);
        assertEquals(1.0, Steam.statePH(1e5, vapour.enthalpyJPerKg()).quality().getAsDouble(), 1e-12);
    }

    @Test
    void singlePhaseStatesCarryNoQuality() {
        SteamState superheated = Steam.statePT(10e6, 800.0);
        assertFalse(superheated.quality().isPresent());
        assertTrue(superheated.speedOfSoundMPerS().isPresent());
    }

    @Test
    void regionsAreChosenByTheirBoundaries() {
        assertEquals(Region.REGION_1, Steam.regionPT(3e6, 300.0));
        assertEquals(Region.REGION_2, Steam.regionPT(3e6, 600.0));
        assertEquals(Region.REGION_3, Steam.regionPT(25e6, 650.0));
        assertEquals(Region.REGION_2, Steam.regionPT(25e6, 900.0));
        assertEquals(Region.REGION_5, Steam.regionPT(25e6, 1500.0));
        assertEquals(Region.REGION_4, Steam.regionPH(1e6, 2e6));
        assertEquals(Region.REGION_4, Steam.regionPS(20e6, 4.4e3));
    }

    @ParameterizedTest(name = "p = {0} Pa, T = {1} K is rejected naming {2}")
    @CsvSource({
            "NaN,        300,     p",
            "0,          300,     p",
            "-1e5,       300,     p",
            "100.1e6,    300,     p",
            "1e6,        NaN,     T",
            "1e6,        273.0,   T",
            "1e6,        2273.2,  T",
            "60e6,       1200,    T",
            "Infinity,   300,     p",
    })
    void rejectsTemperatureAndPressureOutsideTheFormulation(double p, double T, String quantity) {
        SteamRangeException e = assertThrows(SteamRangeException.class, () -> Steam.statePT(p, T));
        assertEquals("p,T", e.pair());
        assertEquals(quantity, e.quantity());
        assertTrue(e.getMessage().startsWith("p,T: " + quantity + " = "), e.getMessage());
        assertTrue(e.getMessage().contains("valid"), e.getMessage());
    }

    @Test
    void rejectsBackwardPairsWithNoState() {
        assertRejects("p,h", "h", () -> Steam.statePH(1e6, -1e6));
        assertRejects("p,h", "h", () -> Steam.statePH(1e6, 9e6));
        assertRejects("p,h", "h", () -> Steam.statePH(80e6, 5e6));
        assertRejects("p,h", "h", () -> Steam.statePH(1e6, Double.NaN));
        assertRejects("p,s", "s", () -> Steam.statePS(1e6, -500.0));
        assertRejects("p,s", "s", () -> Steam.statePS(1e6, 20e3));
        assertRejects("p,x", "x", () -> Steam.statePX(1e6, 1.2));
        assertRejects("p,x", "p", () -> Steam.statePX(30e6, 0.5));
        assertRejects("p,x", "p", () -> Steam.statePX(100.0, 0.5));
        assertRejects("T,x", "T", () -> Steam.stateTX(700.0, 0.5));
        assertRejects("T,x", "x", () -> Steam.stateTX(400.0, -0.1));
        assertRejects("h,s", "h", () -> Steam.stateHS(-1e6, 5e3));
        assertRejects("h,s", "h", () -> Steam.stateHS(2e6, 30e3));
        assertRejects("h,s", "s", () -> Steam.stateHS(2e6, Double.NaN));
    }

    private static void assertRejects(String pair, String quantity, Executable call) {
        SteamRangeException e = assertThrows(SteamRangeException.class, call);
        assertEquals(pair, e.pair(), e.getMessage());
        assertEquals(quantity, e.quantity(), e.getMessage());
    }

    private static void assertRelative(double expected, double actual, String what) {
        assertRelative(expected, actual, ROUND_TRIP, what);
    }

    private static void assertRelative(double expected, double actual, double tolerance, String what) {
        assertEquals(expected, actual, tolerance * Math.abs(expected), what);
    }
}
