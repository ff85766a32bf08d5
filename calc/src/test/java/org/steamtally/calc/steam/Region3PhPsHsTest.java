package org.steamtally.calc.steam;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

import static org.junit.jupiter.api.Assertions.assertEquals;

/** Published check values of IAPWS SR3-03(2014) and SR4-04(2014), each to half a unit in the last printed digit. */
class Region3PhPsHsTest {

    @ParameterizedTest(name = "h3ab({0} MPa)")
    @CsvFileSource(resources = "tvphps3-h3ab.csv")
    void boundaryEnthalpy3abMatchesPublishedValue(double pMPa, String h) {
        Printed.assertMatches(h, Region3.boundaryEnthalpy3ab(pMPa * 1e6), 1e3, "h3ab");
    }

    @ParameterizedTest(name = "3{0}: p = {1} MPa, h = {2} kJ/kg")
    @CsvFileSource(resources = "tvphps3-ph.csv")
    void backwardTemperatureAndVolumeFromPressureAndEnthalpyMatchPublishedValues(char subregion, double pMPa,
                                                                                 double hKJ, String T, String v) {
        assertEquals(subregion == 'a', Region3PhPs.isSubregionAPH(pMPa, hKJ), "subregion");
        Printed.assertMatches(T, Region3.backwardTemperaturePH(pMPa * 1e6, hKJ * 1e3), 1, "T(p,h)");
        Printed.assertMatches(v, Region3.backwardVolumePH(pMPa * 1e6, hKJ * 1e3), 1, "v(p,h)");
    }

    @ParameterizedTest(name = "3{0}: p = {1} MPa, s = {2} kJ/(kg K)")
    @CsvFileSource(resources = "tvphps3-ps.csv")
    void backwardTemperatureAndVolumeFromPressureAndEntropyMatchPublishedValues(char subregion, double pMPa,
                                                                                double sKJ, String T, String v) {
        assertEquals(subregion == 'a', sKJ <= Region3PhPs.S_CRIT, "subregion");
        Printed.assertMatches(T, Region3.backwardTemperaturePS(pMPa * 1e6, sKJ * 1e3), 1, "T(p,s)");
        Printed.assertMatches(v, Region3.backwardVolumePS(pMPa * 1e6, sKJ * 1e3), 1, "v(p,s)");
    }

    @ParameterizedTest(name = "p3sat(h = {0} kJ/kg)")
    @CsvFileSource(resources = "tvphps3-p3sat-h.csv")
    void saturationPressureFromEnthalpyMatchesPublishedValue(double hKJ, String p) {
        Printed.assertMatches(p, Region3.saturationPressureH(hKJ * 1e3), 1e6, "p3sat(h)");
    }

    @ParameterizedTest(name = "p3sat(s = {0} kJ/(kg K))")
    @CsvFileSource(resources = "tvphps3-p3sat-s.csv")
    void saturationPressureFromEntropyMatchesPublishedValue(double sKJ, String p) {
        Printed.assertMatches(p, Region3.saturationPressureS(sKJ * 1e3), 1e6, "p3sat(s)");
    }

    @ParameterizedTest(name = "3{0}: h = {1} kJ/kg, s = {2} kJ/(kg K)")
    @CsvFileSource(resources = "phs3-pressure.csv")
    void backwardPressureFromEnthalpyAndEntropyMatchesPublishedValue(char subregion, double hKJ, double sKJ, String p) {
        assertEquals(subregion == 'a', sKJ <= Region3PhPs.S_CRIT, "subregion");
        Printed.assertMatches(p, Region3.backwardPressureHS(hKJ * 1e3, sKJ * 1e3), 1e6, "p(h,s)");
    }

    @ParameterizedTest(name = "{0}(s = {1} kJ/(kg K))")
    @CsvFileSource(resources = "phs3-boundaries.csv")
    void boundaryEnthalpiesFromEntropyMatchPublishedValues(String equation, double sKJ, String h) {
        double s = sKJ * 1e3;
        double actual;
        switch (equation) {
            case "h1": actual = HsBoundaries.saturatedLiquidEnthalpy1(s); break;
            case "h3": actual = HsBoundaries.saturatedLiquidEnthalpy3(s); break;
            case "h2ab": actual = HsBoundaries.saturatedVapourEnthalpy2ab(s); break;
            case "h2c3b": actual = HsBoundaries.saturatedVapourEnthalpy2c3b(s); break;
            case "hB13": actual = HsBoundaries.b13Enthalpy(s); break;
            default: throw new IllegalArgumentException(equation);
        }
        Printed.assertMatches(h, actual, 1e3, equation);
    }

    @ParameterizedTest(name = "T_B23(h = {0} kJ/kg, s = {1} kJ/(kg K))")
    @CsvFileSource(resources = "phs3-tb23.csv")
    void b23TemperatureFromEnthalpyAndEntropyMatchesPublishedValue(double hKJ, double sKJ, String T) {
        Printed.assertMatches(T, HsBoundaries.b23Temperature(hKJ * 1e3, sKJ * 1e3), 1, "T_B23(h,s)");
    }

    @ParameterizedTest(name = "T_sat(h = {0} kJ/kg, s = {1} kJ/(kg K))")
    @CsvFileSource(resources = "phs3-tsat.csv")
    void saturationTemperatureFromEnthalpyAndEntropyMatchesPublishedValue(double hKJ, double sKJ, String T) {
        Printed.assertMatches(T, HsBoundaries.backwardSaturationTemperatureHS(hKJ * 1e3, sKJ * 1e3), 1, "T_sat(h,s)");
    }
}
