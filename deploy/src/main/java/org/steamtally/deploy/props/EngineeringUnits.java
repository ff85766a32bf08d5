package org.steamtally.deploy.props;

/**
 * The conversions between SI base units and the engineering units of {@code --units engineering}
 * (kPa, °C, kJ/kg, kJ/(kg·K)). Every factor is exact by definition (NIST SP 811 (2008), 4.2.1.1 for
 * the Celsius temperature; the SI prefix kilo = 10³ for the others); the only error is the one
 * rounding of the double operation.
 */
public final class EngineeringUnits {

    /** t/°C = T/K − 273.15, by definition of the Celsius temperature (NIST SP 811 (2008), 4.2.1.1). */
    private static final double CELSIUS_OFFSET_K = 273.15;

    /** The SI prefix kilo. */
    private static final double KILO = 1000.0;

    private EngineeringUnits() {
    }

    /** Pressure in Pa from kPa. */
    public static double fromKilopascal(double kilopascal) {
        return kilopascal * KILO;
    }

    /** Pressure in kPa from Pa. */
    public static double toKilopascal(double pascal) {
        return pascal / KILO;
    }

    /** Thermodynamic temperature in K from Celsius temperature in °C. */
    public static double fromCelsius(double celsius) {
        return celsius + CELSIUS_OFFSET_K;
    }

    /** Celsius temperature in °C from thermodynamic temperature in K. */
    public static double toCelsius(double kelvin) {
        return kelvin - CELSIUS_OFFSET_K;
    }

    /** Specific energy (enthalpy, internal energy) in J/kg from kJ/kg. */
    public static double fromKilojoulePerKilogram(double kilojoulePerKilogram) {
        return kilojoulePerKilogram * KILO;
    }

    /** Specific energy (enthalpy, internal energy) in kJ/kg from J/kg. */
    public static double toKilojoulePerKilogram(double joulePerKilogram) {
        return joulePerKilogram / KILO;
    }

    /** Specific entropy or heat capacity in J/(kg·K) from kJ/(kg·K). */
    public static double fromKilojoulePerKilogramKelvin(double kilojoulePerKilogramKelvin) {
        return kilojoulePerKilogramKelvin * KILO;
    }

    /** Specific entropy or heat capacity in kJ/(kg·K) from J/(kg·K). */
    public static double toKilojoulePerKilogramKelvin(double joulePerKilogramKelvin) {
        return joulePerKilogramKelvin / KILO;
    }
}
