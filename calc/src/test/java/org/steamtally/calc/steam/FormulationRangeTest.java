package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.function.DoubleBinaryOperator;
import org.junit.jupiter.api.Test;

class FormulationRangeTest {

    private static void assertPositiveAndFinite(String what, List<RoundTrip.State> grid, DoubleBinaryOperator f) {
        for (RoundTrip.State state : grid) {
            double value = f.applyAsDouble(state.p(), state.t());
            assertTrue(Double.isFinite(value) && value > 0.0, () -> what + " = " + value + " at " + state);
        }
    }

    @Test
    void region1PropertiesArePositiveAndFiniteOverTheWholeRegion() {
        List<RoundTrip.State> grid = RoundTrip.region1Grid();
        assertPositiveAndFinite("v", grid, Region1::specificVolume);
        assertPositiveAndFinite("cp", grid, Region1::isobaricHeatCapacity);
        assertPositiveAndFinite("cv", grid, Region1::isochoricHeatCapacity);
        assertPositiveAndFinite("w", grid, Region1::speedOfSound);
    }

    @Test
    void region2PropertiesArePositiveAndFiniteOverTheWholeRegion() {
        List<RoundTrip.State> grid = RoundTrip.region2Grid();
        assertPositiveAndFinite("v", grid, Region2::specificVolume);
        assertPositiveAndFinite("h", grid, Region2::enthalpy);
        assertPositiveAndFinite("u", grid, Region2::internalEnergy);
        assertPositiveAndFinite("s", grid, Region2::entropy);
        assertPositiveAndFinite("cp", grid, Region2::isobaricHeatCapacity);
        assertPositiveAndFinite("cv", grid, Region2::isochoricHeatCapacity);
        assertPositiveAndFinite("w", grid, Region2::speedOfSound);
    }

    @Test
    void region5PropertiesArePositiveAndFiniteOverTheWholeRegion() {
        List<RoundTrip.State> grid = RoundTrip.region5Grid();
        assertPositiveAndFinite("v", grid, Region5::specificVolume);
        assertPositiveAndFinite("h", grid, Region5::enthalpy);
        assertPositiveAndFinite("u", grid, Region5::internalEnergy);
        assertPositiveAndFinite("s", grid, Region5::entropy);
        assertPositiveAndFinite("cp", grid, Region5::isobaricHeatCapacity);
        assertPositiveAndFinite("cv", grid, Region5::isochoricHeatCapacity);
        assertPositiveAndFinite("w", grid, Region5::speedOfSound);
    }
}
