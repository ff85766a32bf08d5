package org.steamtally.deploy.props;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

class UnitSystemTest {

    @ParameterizedTest
    @CsvFileSource(resources = "engineering-units.csv", numLinesToSkip = 1)
    void conversionsUseTheExactDefinedFactors(String unit, double engineering, double si) {
        // Decimal inputs and 273.15 are each within half an ulp in binary and the operation rounds
        // once more, so a correct conversion is within 1.5 ulp; 2 ulp of the larger operand allows that.
        double siTolerance = 2 * Math.ulp(Math.max(Math.abs(si), 273.15));
        double engineeringTolerance = 2 * Math.ulp(Math.max(Math.abs(engineering), 273.15));
        assertEquals(si, toSi(unit).applyAsDouble(engineering), siTolerance, unit + " to SI");
        assertEquals(engineering, fromSi(unit).applyAsDouble(si), engineeringTolerance, unit + " from SI");
    }

    private static DoubleUnaryOperator toSi(String unit) {
        switch (unit) {
            case "kPa":
                return UnitSystem.ENGINEERING::pressureToSi;
            case "°C":
                return UnitSystem.ENGINEERING::temperatureToSi;
            case "kJ/kg":
                return UnitSystem.ENGINEERING::specificEnergyToSi;
            case "kJ/(kg·K)":
                return UnitSystem.ENGINEERING::specificEntropyToSi;
            default:
                throw new IllegalArgumentException(unit);
        }
    }

    private static DoubleUnaryOperator fromSi(String unit) {
        switch (unit) {
            case "kPa":
                return UnitSystem.ENGINEERING::pressureFromSi;
            case "°C":
                return UnitSystem.ENGINEERING::temperatureFromSi;
            case "kJ/kg":
                return UnitSystem.ENGINEERING::specificEnergyFromSi;
            case "kJ/(kg·K)":
                return UnitSystem.ENGINEERING::specificEntropyFromSi;
            default:
                throw new IllegalArgumentException(unit);
        }
    }
}
