package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

class SaturationTest {

    private static final double MPA = 1e6;

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table35-saturation-pressure.csv", useHeadersInDisplayName = true)
    void saturationPressureMatchesPublishedValues(double t, String ps) {
        Published.assertRoundsTo(ps, Saturation.pressure(t) / MPA, "ps(T)");
    }

    @ParameterizedTest
    @CsvFileSource(resources = "r797-table36-saturation-temperature.csv", useHeadersInDisplayName = true)
    void saturationTemperatureMatchesPublishedValues(double pMpa, String ts) {
        Published.assertRoundsTo(ts, Saturation.temperature(pMpa * MPA), "Ts(p)");
    }

    @Test
    void saturationTemperatureInvertsSaturationPressureOverTheWholeLine() {
        // Eq. 31 is the exact algebraic inverse of eq. 30 (both solve eq. 28), so they agree to
        // rounding; 1e-11 relative allows for the cancellation in the quadratic roots.
        for (double t = 273.15; t <= 647.096; t += 0.5) {
            assertEquals(t, Saturation.temperature(Saturation.pressure(t)), 1e-11 * t, "T = " + t + " K");
        }
        double tc = If97Constants.CRITICAL_TEMPERATURE_K;
        assertEquals(tc, Saturation.temperature(Saturation.pressure(tc)), 1e-11 * tc);
    }

    @Test
    void saturationLineEndsMatchTheReleaseRange() {
        // IAPWS R7-97(2012), section 8.1: eq. 30 gives 611.213 Pa at 273.15 K and the critical
        // pressure 22.064 MPa at the critical temperature, to the printed digits.
        Published.assertRoundsTo("611.213", Saturation.pressure(273.15), "ps(273.15 K)");
        Published.assertRoundsTo("22.064", Saturation.pressure(If97Constants.CRITICAL_TEMPERATURE_K) / MPA,
                "ps(Tc)");
    }
}
