package org.steamtally.calc.steam;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

import java.util.function.DoubleUnaryOperator;

import static org.junit.jupiter.api.Assertions.assertEquals;

class Region3VolumePTTest {

    private static DoubleUnaryOperator boundary(String name) {
        switch (name) {
            case "ab": return Region3VolumePT::t3ab;
            case "cd": return Region3VolumePT::t3cd;
            case "ef": return Region3VolumePT::t3ef;
            case "gh": return Region3VolumePT::t3gh;
            case "ij": return Region3VolumePT::t3ij;
            case "jk": return Region3VolumePT::t3jk;
            case "mn": return Region3VolumePT::t3mn;
            case "op": return Region3VolumePT::t3op;
            case "qu": return Region3VolumePT::t3qu;
            case "rx": return Region3VolumePT::t3rx;
            case "uv": return Region3VolumePT::t3uv;
            case "wx": return Region3VolumePT::t3wx;
            default: throw new IllegalArgumentException(name);
        }
    }

    /** To half a unit in the tenth printed digit (see {@link Printed}). */
    @ParameterizedTest(name = "T3{0}({1} MPa)")
    @CsvFileSource(resources = "vpt3-boundaries.csv")
    void boundaryEquationsMatchPublishedValues(String name, double pMPa, String T) {
        Printed.assertMatches(T, boundary(name).applyAsDouble(pMPa), 1, "T3" + name);
    }

    @ParameterizedTest(name = "3{0}: p = {1} MPa, T = {2} K")
    @CsvFileSource(resources = "vpt3-volumes.csv")
    void subregionIsTheOneThePublishedCheckPointBelongsTo(char subregion, double pMPa, double T) {
        assertEquals(subregion, Region3VolumePT.letter(Region3VolumePT.subregion(pMPa, T)));
    }

    /** To half a unit in the tenth printed digit (see {@link Printed}), except where the data file says. */
    @ParameterizedTest(name = "3{0}: p = {1} MPa, T = {2} K")
    @CsvFileSource(resources = "vpt3-volumes.csv")
    void backwardVolumeMatchesPublishedValue(char subregion, double pMPa, double T, String v, Double units) {
        Printed.assertMatches(v, Region3.backwardVolumePT(pMPa * 1e6, T), 1, "v(3" + subregion + ")",
                units == null ? 0.5 : units);
    }
}
