package org.steamtally.calc.steam;

import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;

/**
 * The boundary equations hand over to each other at the entropies given as constants. Each is a
 * separate fit, so they meet only to within the fits' stated accuracy; 1e-4 relative in h (about
 * 0.2 kJ/kg) is well inside what the releases allow and far tighter than a wrong constant would give.
 */
class HsBoundariesTest {

    @Test
    void saturatedLiquidEnthalpiesMeetAt623Kelvin() {
        double s = HsBoundaries.S_SAT_LIQUID_623;
        double h1 = HsBoundaries.saturatedLiquidEnthalpy1(s);
        assertEquals(h1, HsBoundaries.saturatedLiquidEnthalpy3(s), 1e-4 * h1);
        assertEquals(h1, HsBoundaries.b13Enthalpy(s), 1e-4 * h1);
    }

    @Test
    void liquidAndVapourSaturationEnthalpiesMeetAtTheCriticalEntropy() {
        double s = HsBoundaries.S_CRIT;
        double h3 = HsBoundaries.saturatedLiquidEnthalpy3(s);
        assertEquals(h3, HsBoundaries.saturatedVapourEnthalpy2c3b(s), 1e-4 * h3);
        assertEquals(Region3.enthalpy(Region3.RHO_CRIT, Region3.T_CRIT), h3, 1e-4 * h3);
    }

    @Test
    void saturatedVapourEnthalpiesMeetAtTheirCommonEntropy() {
        double s = HsBoundaries.S_2BC;
        double h2ab = HsBoundaries.saturatedVapourEnthalpy2ab(s);
        assertEquals(h2ab, HsBoundaries.saturatedVapourEnthalpy2c3b(s), 1e-4 * h2ab);
    }

    /** T_sat(h,s) at the saturated vapour of 623.15 K: within 0.05 K, the equation's stated accuracy being tighter. */
    @Test
    void saturationTemperatureAtTheLowerEntropyEndIs623Kelvin() {
        double T = HsBoundaries.backwardSaturationTemperatureHS(HsBoundaries.H_B23_MIN, HsBoundaries.S_SAT_VAPOUR_623);
        assertEquals(623.15, T, 0.05);
    }
}
