package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertEquals;

import com.hummeling.if97.IF97;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

class Region2Test {

    private static final double MPA = 1e6;
    private static final double KJ = 1e3;

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table15-region2.csv", useHeadersInDisplayName = true)
    void forwardPropertiesMatchPublishedValuesInRegion2(double t, double pMpa, String v, String h, String u,
                                                        String s, String cp, String w) {
        double p = pMpa * MPA;
        assertAll(
                () -> Published.assertRoundsTo(v, Region2.specificVolume(p, t), "v"),
                () -> Published.assertRoundsTo(h, Region2.enthalpy(p, t) / KJ, "h"),
                () -> Published.assertRoundsTo(u, Region2.internalEnergy(p, t) / KJ, "u"),
                () -> Published.assertRoundsTo(s, Region2.entropy(p, t) / KJ, "s"),
                () -> Published.assertRoundsTo(cp, Region2.isobaricHeatCapacity(p, t) / KJ, "cp"),
                () -> Published.assertRoundsTo(w, Region2.speedOfSound(p, t), "w"));
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table15-region2.csv", useHeadersInDisplayName = true)
    void isochoricHeatCapacityAgreesWithAnIndependentImplementationInRegion2(double t, double pMpa) {
        // No cv check values are printed; 1e-9 relative against an independent evaluation of the
        // same equation is far above double rounding and far below any transcription error.
        double p = pMpa * MPA;
        double expected = new IF97(IF97.UnitSystem.SI).isochoricHeatCapacityPT(p, t);
        assertEquals(expected, Region2.isochoricHeatCapacity(p, t), 1e-9 * expected);
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table24-region2-tph.csv", useHeadersInDisplayName = true)
    void backwardTemperaturePHMatchesPublishedValuesInEachSubregion(String subregion, double pMpa, double hKj,
                                                                    String t) {
        Published.assertRoundsTo(t, Region2.backwardTemperaturePH(pMpa * MPA, hKj * KJ), "T(p,h) in " + subregion);
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table29-region2-tps.csv", useHeadersInDisplayName = true)
    void backwardTemperaturePSMatchesPublishedValuesInEachSubregion(String subregion, double pMpa, double sKj,
                                                                    String t) {
        Published.assertRoundsTo(t, Region2.backwardTemperaturePS(pMpa * MPA, sKj * KJ), "T(p,s) in " + subregion);
    }

    @ParameterizedTest
    @CsvFileSource(resources = "supp-phs12-table9-region2-phs.csv", useHeadersInDisplayName = true)
    void backwardPressureHSMatchesPublishedValuesInEachSubregion(String subregion, double hKj, double sKj,
                                                                 String p) {
        Published.assertRoundsTo(p, Region2.backwardPressureHS(hKj * KJ, sKj * KJ) / MPA, "p(h,s) in " + subregion);
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-boundary-check-values.csv", useHeadersInDisplayName = true)
    void boundaryEquationsMatchPublishedCheckValues(String boundary, String t, String h, String p) {
        if (boundary.equals("B2bc")) {
            double hJ = Double.parseDouble(h) * KJ;
            Published.assertRoundsTo(p, Region2.boundaryPressure2bc(hJ) / MPA, "B2bc p(h)");
            Published.assertRoundsTo(h, Region2.boundaryEnthalpy2bc(Double.parseDouble(p) * MPA) / KJ, "B2bc h(p)");
        } else {
            Published.assertRoundsTo(p, B23.pressure(Double.parseDouble(t)) / MPA, "B23 p(T)");
            Published.assertRoundsTo(t, B23.temperature(Double.parseDouble(p) * MPA), "B23 T(p)");
        }
    }

    @Test
    void boundary2abLiesNearTheFourMegapascalIsobar() {
        // Supp-PHS12 defines h_2ab(s) as an approximation of the 4 MPa isobar between 2a and 2b.
        // Along that isobar from saturation (≈ 523.5 K) to 1073.15 K, h_2ab must stay close to the
        // isobar's enthalpy; 0.1 % of h is a loose bound that still catches a wrong coefficient,
        // which would shift h by far more.
        for (double t = 525.0; t <= 1073.15; t += 25.0) {
            double s = Region2.entropy(4e6, t);
            double h = Region2.enthalpy(4e6, t);
            assertEquals(h, Region2.boundaryEnthalpy2ab(s), 1e-3 * h, "T = " + t + " K");
        }
    }

    @Test
    void refinedTemperaturePHReproducesEnthalpyAcrossRegion2() {
        RoundTrip.region2Grid().forEach(state -> {
            double h = Region2.enthalpy(state.p(), state.t());
            double t = Region2.temperaturePH(state.p(), h);
            RoundTrip.assertSame(h, Region2.enthalpy(state.p(), t), RoundTrip.ENTHALPY_SCALE, "h", state);
        });
    }

    @Test
    void refinedTemperaturePSReproducesEntropyAcrossRegion2() {
        RoundTrip.region2Grid().forEach(state -> {
            double s = Region2.entropy(state.p(), state.t());
            double t = Region2.temperaturePS(state.p(), s);
            RoundTrip.assertSame(s, Region2.entropy(state.p(), t), RoundTrip.ENTROPY_SCALE, "s", state);
        });
    }

    @Test
    void refinedPressureHSReproducesEnthalpyAndEntropyAcrossRegion2() {
        RoundTrip.region2Grid().forEach(state -> {
            double h = Region2.enthalpy(state.p(), state.t());
            double s = Region2.entropy(state.p(), state.t());
            double p = Region2.pressureHS(h, s);
            double t = Region2.temperaturePH(p, h);
            RoundTrip.assertSame(h, Region2.enthalpy(p, t), RoundTrip.ENTHALPY_SCALE, "h", state);
            RoundTrip.assertSame(s, Region2.entropy(p, t), RoundTrip.ENTROPY_SCALE, "s", state);
        });
    }

    @Test
    void refinedBackwardMethodsConvergeInFewNewtonSteps() {
        // The backward equations start within ~10 mK (T) and a few ppm (p), so quadratic
        // convergence needs three steps to make a step smaller than 1e-9 of the variable; four
        // leaves room for inputs between the grid points (three is the most seen on this grid).
        int bound = 4;
        RoundTrip.region2Grid().forEach(state -> {
            double h = Region2.enthalpy(state.p(), state.t());
            double s = Region2.entropy(state.p(), state.t());
            assertDoesNotThrow(() -> Region2.temperaturePH(state.p(), h, bound), () -> "T(p,h) at " + state);
            assertDoesNotThrow(() -> Region2.temperaturePS(state.p(), s, bound), () -> "T(p,s) at " + state);
            assertDoesNotThrow(() -> Region2.pressureHS(h, s, bound), () -> "p(h,s) at " + state);
        });
    }
}
