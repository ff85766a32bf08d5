package org.steamtally.calc.steam;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

import static org.junit.jupiter.api.Assertions.assertEquals;

class Region3ForwardTest {

    /** Each property to half a unit in the ninth printed digit (see {@link Printed}). */
    @ParameterizedTest(name = "T = {0} K, rho = {1} kg/m3")
    @CsvFileSource(resources = "region3-forward.csv", numLinesToSkip = 0)
    void propertiesMatchPublishedValuesOfTable33(double T, double rho, String p, String h, String u, String s,
                                                 String cp, String w) {
        Printed.assertMatches(p, Region3.pressure(rho, T), 1e6, "p");
        Printed.assertMatches(h, Region3.enthalpy(rho, T), 1e3, "h");
        Printed.assertMatches(u, Region3.internalEnergy(rho, T), 1e3, "u");
        Printed.assertMatches(s, Region3.entropy(rho, T), 1e3, "s");
        Printed.assertMatches(cp, Region3.isobaricHeatCapacity(rho, T), 1e3, "cp");
        Printed.assertMatches(w, Region3.speedOfSound(rho, T), 1, "w");
    }

    /**
     * c_v is not printed in Table 33; the thermodynamic identity c_p − c_v = T·(∂p/∂T)²_ρ/(ρ²·(∂p/∂ρ)_T)
     * ties it to the printed c_p. The derivatives are central differences with steps of 1e-5
     * relative, whose truncation error is of order 1e-10 relative, so 1e-7 relative is loose enough
     * for the rounding of the differences and tight enough to catch a wrong formula.
     */
    @ParameterizedTest(name = "T = {0} K, rho = {1} kg/m3")
    @CsvFileSource(resources = "region3-forward.csv", numLinesToSkip = 0)
    void isochoricHeatCapacityIsConsistentWithIsobaric(double T, double rho) {
        double dT = T * 1e-5;
        double dRho = rho * 1e-5;
        double dpdT = (Region3.pressure(rho, T + dT) - Region3.pressure(rho, T - dT)) / (2 * dT);
        double dpdRho = (Region3.pressure(rho + dRho, T) - Region3.pressure(rho - dRho, T)) / (2 * dRho);
        double expected = Region3.isobaricHeatCapacity(rho, T) - T * dpdT * dpdT / (rho * rho * dpdRho);
        double cv = Region3.isochoricHeatCapacity(rho, T);
        assertEquals(expected, cv, 1e-7 * cv);
    }
}
