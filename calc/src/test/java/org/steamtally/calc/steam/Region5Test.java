package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertDoesNotThrow;
import static org.junit.jupiter.api.Assertions.assertEquals;

import com.hummeling.if97.IF97;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

class Region5Test {

    private static final double MPA = 1e6;
    private static final double KJ = 1e3;

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table42-region5.csv", useHeadersInDisplayName = true)
    void forwardPropertiesMatchPublishedValuesInRegion5(double t, double pMpa, String v, String h, String u,
                                                        String s, String cp, String w) {
        double p = pMpa * MPA;
        assertAll(
                () -> Published.assertRoundsTo(v, Region5.specificVolume(p, t), "v"),
                () -> Published.assertRoundsTo(h, Region5.enthalpy(p, t) / KJ, "h"),
                () -> Published.assertRoundsTo(u, Region5.internalEnergy(p, t) / KJ, "u"),
                () -> Published.assertRoundsTo(s, Region5.entropy(p, t) / KJ, "s"),
                () -> Published.assertRoundsTo(cp, Region5.isobaricHeatCapacity(p, t) / KJ, "cp"),
                () -> Published.assertRoundsTo(w, Region5.speedOfSound(p, t), "w"));
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table42-region5.csv", useHeadersInDisplayName = true)
    void isochoricHeatCapacityAgreesWithAnIndependentImplementationInRegion5(double t, double pMpa) {
        // No cv check values are printed; 1e-9 relative against an independent evaluation of the
        // same equation is far above double rounding and far below any transcription error.
        double p = pMpa * MPA;
        double expected = new IF97(IF97.UnitSystem.SI).isochoricHeatCapacityPT(p, t);
        assertEquals(expected, Region5.isochoricHeatCapacity(p, t), 1e-9 * expected);
    }

    @Test
    void temperaturePHReproducesEnthalpyAcrossRegion5() {
        RoundTrip.region5Grid().forEach(state -> {
            double h = Region5.enthalpy(state.p(), state.t());
            double t = Region5.temperaturePH(state.p(), h);
            RoundTrip.assertSame(h, Region5.enthalpy(state.p(), t), RoundTrip.ENTHALPY_SCALE, "h", state);
        });
    }

    @Test
    void temperaturePSReproducesEntropyAcrossRegion5() {
        RoundTrip.region5Grid().forEach(state -> {
            double s = Region5.entropy(state.p(), state.t());
            double t = Region5.temperaturePS(state.p(), s);
            RoundTrip.assertSame(s, Region5.entropy(state.p(), t), RoundTrip.ENTROPY_SCALE, "s", state);
        });
    }

    @Test
    void newtonFromTheMiddleOfRegion5ConvergesInFewSteps() {
        // From 1673.15 K, 600 K from either end, h and s are so nearly linear in T and ln T that
        // the error falls roughly 600 K → 30 K → 0.1 K → 1e-6 K; six steps bound it with margin.
        int bound = 6;
        RoundTrip.region5Grid().forEach(state -> {
            double h = Region5.enthalpy(state.p(), state.t());
            double s = Region5.entropy(state.p(), state.t());
            assertDoesNotThrow(() -> Region5.temperaturePH(state.p(), h, bound), () -> "T(p,h) at " + state);
            assertDoesNotThrow(() -> Region5.temperaturePS(state.p(), s, bound), () -> "T(p,s) at " + state);
        });
    }
}
