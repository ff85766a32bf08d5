package org.steamtally.collector.units;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;
import org.junit.jupiter.params.provider.ValueSource;
import org.steamtally.calc.plant.Quantity;

class UnitsTest {

    /** A standard atmosphere, NIST SP 811 (2008), B.8: atmosphere, standard (atm) → Pa 1.013 25 E+05, exact. */
    private static final double STANDARD_ATMOSPHERE_PA = 101_325.0;

    @ParameterizedTest(name = "{4}: {1} {0}")
    @CsvFileSource(resources = "nist-sp811-factors.csv", delimiter = '|')
    void conversionToSiMatchesNistSp811(String spelling, double value, double expectedSi, double tolerance,
                                        String entry) {
        EngineeringUnit unit = Units.parse(spelling);
        assertEquals(expectedSi, unit.toSi(value, STANDARD_ATMOSPHERE_PA), tolerance, entry);
    }

    @ParameterizedTest(name = "{4}: {1} {0}")
    @CsvFileSource(resources = "nist-sp811-factors.csv", delimiter = '|')
    void conversionBackFromSiRecoversTheValue(String spelling, double value, double expectedSi, double tolerance,
                                              String entry) {
        EngineeringUnit unit = Units.parse(spelling);
        // Two floating-point steps each way; 1e-12 relative is well above their rounding.
        assertEquals(value, unit.fromSi(unit.toSi(value, STANDARD_ATMOSPHERE_PA), STANDARD_ATMOSPHERE_PA),
                1e-12 * Math.max(1.0, Math.abs(value)), entry);
    }

    @Test
    void poundPerSquareInchIsBuiltFromTheExactPoundInchAndStandardGravity() {
        // NIST SP 811 (2008), B.8: lb = 0.453 592 37 kg (fn. 22), in = 0.0254 m, g_n = 9.806 65 m/s²:
        // 4.448 221 615 260 5 N over 6.4516E-4 m², the 6.894 757 E+03 Pa B.8 prints to 7 digits.
        assertEquals(0.45359237 * 9.80665 / (0.0254 * 0.0254), EngineeringUnit.PSI.scale(), 0.0);
    }

    @Test
    void gaugePressureIsAddedToTheSiteAtmosphericPressure() {
        double atmosphere = 98_700.0;
        assertAll(
                () -> assertEquals(10e5 + atmosphere, Units.parse("barg").toSi(10.0, atmosphere), 1e-9),
                () -> assertEquals(atmosphere, Units.parse("psig").toSi(0.0, atmosphere), 0.0),
                () -> assertEquals(150.0 * EngineeringUnit.PSI.scale() + atmosphere,
                        Units.parse("psig").toSi(150.0, atmosphere), 1e-9),
                () -> assertEquals(-0.9e5 + atmosphere, Units.parse("barg").toSi(-0.9, atmosphere), 1e-9),
                () -> assertEquals(2.5, Units.parse("barg").fromSi(2.5e5 + atmosphere, atmosphere), 1e-12));
    }

    @Test
    void absoluteUnitsIgnoreTheAtmosphericPressure() {
        assertEquals(1e5, Units.parse("bar").toSi(1.0, 90_000.0), 0.0);
        assertEquals(1e5, Units.parse("bar").toSi(1.0), 0.0);
    }

    @Test
    void gaugeUnitRefusesConversionWithoutAtmosphericPressure() {
        IllegalStateException e = assertThrows(IllegalStateException.class, () -> Units.parse("barg").toSi(1.0));
        assertTrue(e.getMessage().contains("atmospheric"), e.getMessage());
    }

    @Test
    void gaugeUnitRefusesAnImpossibleAtmosphericPressure() {
        assertThrows(IllegalArgumentException.class, () -> Units.parse("psig").toSi(1.0, 0.0));
        assertThrows(IllegalArgumentException.class, () -> Units.parse("psig").toSi(1.0, Double.NaN));
    }

    @Test
    void uncertaintyConvertsWithTheScaleAloneWithoutOffsetOrAtmosphere() {
        assertAll(
                () -> assertEquals(1000.0, Units.parse("barg").uncertaintyToSi(0.01), 1e-12),
                () -> assertEquals(0.5, Units.parse("Cel").uncertaintyToSi(0.5), 0.0),
                () -> assertEquals(1.0, Units.parse("[degF]").uncertaintyToSi(1.8), 1e-15),
                () -> assertEquals(0.02e6, Units.parse("MPa").uncertaintyToSi(0.02), 1e-9));
    }

    @Test
    void nonFiniteValueIsRefused() {
        assertThrows(IllegalArgumentException.class, () -> Units.parse("kPa").toSi(Double.NaN));
        assertThrows(IllegalArgumentException.class, () -> Units.parse("kPa").uncertaintyToSi(Double.POSITIVE_INFINITY));
    }

    @Test
    void unknownUnitNamesItselfAndListsThePressureUnits() {
        UnknownUnitException e = assertThrows(UnknownUnitException.class,
                () -> Units.parse("furlong", Quantity.PRESSURE));
        assertTrue(e.getMessage().startsWith("unit \"furlong\" is not a pressure unit (accepted: Pa, kPa, MPa, bar,"),
                e.getMessage());
        assertTrue(e.accepted().contains("barg"));
        assertFalse(e.accepted().contains("Cel"));
        assertEquals("furlong", e.unit());
    }

    @Test
    void unitOfAnotherQuantityIsNamedAsSuch() {
        UnknownUnitException e = assertThrows(UnknownUnitException.class,
                () -> Units.parse("kg/s", Quantity.PRESSURE));
        assertTrue(e.getMessage().startsWith("unit \"kg/s\" is a mass flow unit, not a pressure unit"), e.getMessage());
    }

    @Test
    void unknownUnitWithoutQuantityListsEveryCode() {
        UnknownUnitException e = assertThrows(UnknownUnitException.class, () -> Units.parse("rod"));
        assertTrue(e.getMessage().startsWith("unknown unit \"rod\""), e.getMessage());
        assertTrue(e.accepted().contains("[degF]") && e.accepted().contains("t/h"));
    }

    @ParameterizedTest
    @ValueSource(strings = {"Bar", "BAR", "mPa", "KPA", "pa", "KW", "cel"})
    void spellingIsCaseSensitiveAsInUcumAndTheMessageSuggestsTheIntendedUnit(String spelling) {
        UnknownUnitException e = assertThrows(UnknownUnitException.class, () -> Units.parse(spelling));
        assertTrue(e.getMessage().contains("case-sensitive: did you mean"), e.getMessage());
    }

    @Test
    void millibarAndMegapascalAreNotConfusedWithTheirOtherCase() {
        assertSame(EngineeringUnit.MILLIBAR, Units.parse("mbar"));
        assertSame(EngineeringUnit.MEGAPASCAL, Units.parse("MPa"));
        assertThrows(UnknownUnitException.class, () -> Units.parse("Mbar"));
    }

    @Test
    void surroundingBlanksAreIgnored() {
        assertSame(EngineeringUnit.KILOPASCAL, Units.parse("  kPa "));
    }

    @Test
    void powerAndEnergyRateUnitsServeEachOther() {
        assertSame(EngineeringUnit.MEGAWATT, Units.parse("MW", Quantity.ENERGY_RATE));
        assertSame(EngineeringUnit.KILOJOULE_PER_SECOND, Units.parse("kJ/s", Quantity.POWER));
        assertThrows(UnknownUnitException.class, () -> Units.parse("MJ/kg", Quantity.POWER));
    }

    @Test
    void everyUnitIsFoundByItsCodeAndEveryAlias() {
        for (EngineeringUnit unit : EngineeringUnit.values()) {
            assertSame(unit, Units.parse(unit.code(), unit.quantity()));
            for (String alias : unit.aliases()) {
                assertSame(unit, Units.parse(alias, unit.quantity()), alias);
            }
        }
    }

    @Test
    void gaugeUnitsAreMarkedAsNotUcum() {
        for (EngineeringUnit unit : EngineeringUnit.values()) {
            assertEquals(!unit.isGauge(), unit.isUcum(), unit.code());
        }
    }
}
