package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.hummeling.if97.IF97;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

class Region1Test {

    private static final double MPA = 1e6;
    private static final double KJ = 1e3;

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table5-region1.csv", useHeadersInDisplayName = true)
    void forwardPropertiesMatchPublishedValuesInRegion1(double t, double pMpa, String v, String h, String u,
                                                        String s, String cp, String w) {
        double p = pMpa * MPA;
        assertAll(
                () -> Published.assertRoundsTo(v, Region1.specificVolume(p, t), "v"),
                () -> Published.assertRoundsTo(h, Region1.enthalpy(p, t) / KJ, "h"),
                () -> Published.assertRoundsTo(u, Region1.internalEnergy(p, t) / KJ, "u"),
                () -> Published.assertRoundsTo(s, Region1.entropy(p, t) / KJ, "s"),
                () -> Published.assertRoundsTo(cp, Region1.isobaricHeatCapacity(p, t) / KJ, "cp"),
                () -> Published.assertRoundsTo(w, Region1.speedOfSound(p, t), "w"));
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table5-region1.csv", useHeadersInDisplayName = true)
    void isochoricHeatCapacityAgreesWithAnIndependentImplementationInRegion1(double t, double pMpa) {
        // The release prints no cv check values; the independent LGPL implementation evaluates the
        // same equation, so agreement to 1e-9 relative (far above double rounding, far below any
        // transcription error) checks our cv relation.
        double p = pMpa * MPA;
        double expected = new IF97(IF97.UnitSystem.SI).isochoricHeatCapacityPT(p, t);
        assertEquals(expected, Region1.isochoricHeatCapacity(p, t), 1e-9 * expected);
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table7-region1-tph.csv", useHeadersInDisplayName = true)
    void backwardTemperaturePHMatchesPublishedValues(double pMpa, double hKj, String t) {
        Published.assertRoundsTo(t, Region1.backwardTemperaturePH(pMpa * MPA, hKj * KJ), "T(p,h)");
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table9-region1-tps.csv", useHeadersInDisplayName = true)
    void backwardTemperaturePSMatchesPublishedValues(double pMpa, double sKj, String t) {
        Published.assertRoundsTo(t, Region1.backwardTemperaturePS(pMpa * MPA, sKj * KJ), "T(p,s)");
    }

    @ParameterizedTest
    @CsvFileSource(resources = "supp-phs12-table3-region1-phs.csv", useHeadersInDisplayName = true)
    void backwardPressureHSMatchesPublishedValues(double hKj, double sKj, String p) {
        Published.assertRoundsTo(p, Region1.backwardPressureHS(hKj * KJ, sKj * KJ) / MPA, "p(h,s)");
    }

    @Test
    void refinedTemperaturePHReproducesEnthalpyAcrossRegion1() {
        RoundTrip.region1Grid().forEach(state -> {
            double h = Region1.enthalpy(state.p(), state.t());
            double t = Region1.temperaturePH(state.p(), h);
            RoundTrip.assertSame(h, Region1.enthalpy(state.p(), t), RoundTrip.ENTHALPY_SCALE, "h", state);
        });
    }

    @Test
    void refinedTemperaturePSReproducesEntropyAcrossRegion1() {
        RoundTrip.region1Grid().forEach(state -> {
            double s = Region1.entropy(state.p(), state.t());
            double t = Region1.temperaturePS(state.p(), s);
            RoundTrip.assertSame(s, Region1.entropy(state.p(), t), RoundTrip.ENTROPY_SCALE, "s", state);
        });
    }

    @Test
    void refinedPressureHSReproducesEnthalpyAndEntropyAcrossRegion1() {
        RoundTrip.region1Grid().forEach(state -> {
            double h = Region1.enthalpy(state.p(), state.t());
            double s = Region1.entropy(state.p(), state.t());
            double p = Region1.pressureHS(h, s);
            double t = Region1.temperaturePH(p, h);
            RoundTrip.assertSame(h, Region1.enthalpy(p, t), RoundTrip.ENTHALPY_SCALE, "h", state);
            RoundTrip.assertSame(s, Region1.entropy(p, t), RoundTrip.ENTROPY_SCALE, "s", state);
        });
    }

    @Test
    void refinedBackwardMethodsConvergeInFewNewtonSteps() {
        // The backward equations start within ~25 mK, so quadratic convergence needs three steps
        // to make a step smaller than 1e-9·T (three is the most seen on this grid); four leaves
        // room for inputs between the grid points.
        int bound = 4;
        RoundTrip.region1Grid().forEach(state -> {
            double h = Region1.enthalpy(state.p(), state.t());
            double s = Region1.entropy(state.p(), state.t());
            assertDoesNotThrow(() -> Region1.temperaturePH(state.p(), h, bound), () -> "T(p,h) at " + state);
            assertDoesNotThrow(() -> Region1.temperaturePS(state.p(), s, bound), () -> "T(p,s) at " + state);
            assertDoesNotThrow(() -> Region1.pressureHS(h, s, bound), () -> "p(h,s) at " + state);
        });
    }

    @Test
    void iterationThatRunsOutOfStepsRaisesAnErrorNamingTheInputs() {
        // One Newton step from the backward equation's ~1e-5 relative start cannot end with a step
        // below 1e-9·T, so a limit of one step must fail loudly rather than return a rough value.
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> Region1.temperaturePH(3e6, 500e3, 1));
        assertTrue(e.getMessage().contains("p = 3000000.0 Pa") && e.getMessage().contains("h = 500000.0 J/kg"),
                e.getMessage());
    }
}
