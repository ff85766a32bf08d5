package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.function.DoublePredicate;
import org.junit.jupiter.api.Test;

/**
 * The constant bounds with which the (p, h) and (p, s) region selection skips forward evaluations,
 * checked against the forward equations over the pressures where each is used. The scan is
 * log-spaced with neighbouring pressures 0.06 % apart; between them the smooth boundary curves
 * change by at most about 0.1 J/(kg·K) or 50 J/kg, well inside the margin of each bound to the
 * extreme found (at least 0.5 J/(kg·K), 7 J/(kg·K) for s(p, 623.15 K), and 3 kJ/kg for h).
 */
class FacadeShortcutBoundsTest {

    private static final int POINTS = 20_000;
    private static final double P_623 = Steam.REGION_13_SATURATION_PRESSURE_PA;

    /** Whether the condition holds at every log-spaced pressure from pLow to pHigh. */
    private static boolean everywhere(double pLow, double pHigh, DoublePredicate condition) {
        double ratio = Math.log(pHigh / pLow);
        for (int k = 0; k <= POINTS; k++) {
            double p = Math.min(pHigh, pLow * Math.exp(ratio * k / POINTS));
            if (!condition.test(p)) {
                return false;
            }
        }
        return true;
    }

    @Test
    void everyRegion1EnthalpyAtTheLowestTemperatureIsBelowTheSkipBound() {
        assertTrue(everywhere(Steam.TRIPLE_POINT_PRESSURE_PA, Steam.MAX_PRESSURE_PA,
                p -> Region1.enthalpy(p, Steam.MIN_TEMPERATURE_K) < Steam.ENTHALPY_ABOVE_MIN_TEMPERATURE));
    }

    @Test
    void everyRegion1EntropyAtTheLowestTemperatureIsBelowTheSkipBound() {
        assertTrue(everywhere(Steam.TRIPLE_POINT_PRESSURE_PA, Steam.MAX_PRESSURE_PA,
                p -> Region1.entropy(p, Steam.MIN_TEMPERATURE_K) < Steam.ENTROPY_ABOVE_MIN_TEMPERATURE));
    }

    @Test
    void region1EnthalpyAndEntropyOnThe62315KelvinIsothermStayAboveTheRegion1Bounds() {
        assertTrue(everywhere(P_623, Steam.MAX_PRESSURE_PA,
                p -> Region1.enthalpy(p, Steam.REGION_13_TEMPERATURE_K) > Steam.ENTHALPY_BELOW_REGION_13));
        assertTrue(everywhere(P_623, Steam.MAX_PRESSURE_PA,
                p -> Region1.entropy(p, Steam.REGION_13_TEMPERATURE_K) > Steam.ENTROPY_BELOW_REGION_13));
    }

    @Test
    void saturatedVapourEnthalpyAndEntropyStayBelowTheVapourBounds() {
        assertTrue(everywhere(Steam.TRIPLE_POINT_PRESSURE_PA, P_623,
                p -> Region2.enthalpy(p, Saturation.temperature(p)) < Steam.ENTHALPY_ABOVE_SATURATED_VAPOUR));
        assertTrue(everywhere(Steam.TRIPLE_POINT_PRESSURE_PA, P_623,
                p -> Region2.entropy(p, Saturation.temperature(p)) < Steam.ENTROPY_ABOVE_SATURATED_VAPOUR));
    }

    @Test
    void region2EnthalpyAndEntropyAt107315KelvinStayAboveTheRegion2Bounds() {
        assertTrue(everywhere(1.0, Steam.MAX_PRESSURE_PA,
                p -> Region2.enthalpy(p, Steam.MAX_TEMPERATURE_REGION_2_K) > Steam.ENTHALPY_BELOW_REGION_25));
        assertTrue(everywhere(1.0, Steam.MAX_PRESSURE_PA,
                p -> Region2.entropy(p, Steam.MAX_TEMPERATURE_REGION_2_K) > Steam.ENTROPY_BELOW_REGION_25));
    }

    @Test
    void region13SaturationPressureIsTheSaturationEquationAt62315Kelvin() {
        assertTrue(P_623 == Saturation.pressure(Steam.REGION_13_TEMPERATURE_K));
    }
}
