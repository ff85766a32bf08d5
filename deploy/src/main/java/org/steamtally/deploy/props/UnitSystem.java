package org.steamtally.deploy.props;

import java.util.Arrays;
import java.util.Iterator;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/**
 * The units of the {@code props} input and output columns. Specific volume (m³/kg), speed of sound
 * (m/s) and vapour quality (unitless) are the same in both systems.
 */
public enum UnitSystem {

    /** SI base units: Pa, K, J/kg, J/(kg·K). */
    SI("si") {
        @Override
        public double pressureToSi(double value) {
            return value;
        }

        @Override
        public double pressureFromSi(double pascal) {
            return pascal;
        }

        @Override
        public double temperatureToSi(double value) {
            return value;
        }

        @Override
        public double temperatureFromSi(double kelvin) {
            return kelvin;
        }

        @Override
        public double specificEnergyToSi(double value) {
            return value;
        }

        @Override
        public double specificEnergyFromSi(double joulePerKilogram) {
            return joulePerKilogram;
        }

        @Override
        public double specificEntropyToSi(double value) {
            return value;
        }

        @Override
        public double specificEntropyFromSi(double joulePerKilogramKelvin) {
            return joulePerKilogramKelvin;
        }
    },

    /** kPa, °C, kJ/kg, kJ/(kg·K), as plant instruments and heat balances usually show them. */
    ENGINEERING("engineering") {
        @Override
        public double pressureToSi(double kilopascal) {
            return EngineeringUnits.fromKilopascal(kilopascal);
        }

        @Override
        public double pressureFromSi(double pascal) {
            return EngineeringUnits.toKilopascal(pascal);
        }

        @Override
        public double temperatureToSi(double celsius) {
            return EngineeringUnits.fromCelsius(celsius);
        }

        @Override
        public double temperatureFromSi(double kelvin) {
            return EngineeringUnits.toCelsius(kelvin);
        }

        @Override
        public double specificEnergyToSi(double kilojoulePerKilogram) {
            return EngineeringUnits.fromKilojoulePerKilogram(kilojoulePerKilogram);
        }

        @Override
        public double specificEnergyFromSi(double joulePerKilogram) {
            return EngineeringUnits.toKilojoulePerKilogram(joulePerKilogram);
        }

        @Override
        public double specificEntropyToSi(double kilojoulePerKilogramKelvin) {
            return EngineeringUnits.fromKilojoulePerKilogramKelvin(kilojoulePerKilogramKelvin);
        }

        @Override
        public double specificEntropyFromSi(double joulePerKilogramKelvin) {
            return EngineeringUnits.toKilojoulePerKilogramKelvin(joulePerKilogramKelvin);
        }
    };

    private final String optionValue;

    UnitSystem(String optionValue) {
        this.optionValue = optionValue;
    }

    /** The name given to {@code --units}, e.g. {@code engineering}. */
    public String optionValue() {
        return optionValue;
    }

    /** Pressure in Pa from this system's pressure unit. */
    public abstract double pressureToSi(double value);

    /** Pressure in this system's unit from Pa. */
    public abstract double pressureFromSi(double pascal);

    /** Temperature in K from this system's temperature unit. */
    public abstract double temperatureToSi(double value);

    /** Temperature in this system's unit from K. */
    public abstract double temperatureFromSi(double kelvin);

    /** Specific enthalpy or internal energy in J/kg from this system's unit. */
    public abstract double specificEnergyToSi(double value);

    /** Specific enthalpy or internal energy in this system's unit from J/kg. */
    public abstract double specificEnergyFromSi(double joulePerKilogram);

    /** Specific entropy or heat capacity in J/(kg·K) from this system's unit. */
    public abstract double specificEntropyToSi(double value);

    /** Specific entropy or heat capacity in this system's unit from J/(kg·K). */
    public abstract double specificEntropyFromSi(double joulePerKilogramKelvin);

    /** An input quantity's value in SI from this system's unit for it. */
    public double toSi(Quantity quantity, double value) {
        switch (quantity) {
            case PRESSURE:
                return pressureToSi(value);
            case TEMPERATURE:
                return temperatureToSi(value);
            case ENTHALPY:
                return specificEnergyToSi(value);
            case ENTROPY:
                return specificEntropyToSi(value);
            case QUALITY:
                return value;
            default:
                throw new IllegalArgumentException("no unit for " + quantity);
        }
    }

    /** The unit system named {@code optionValue} ({@code si} or {@code engineering}). */
    public static UnitSystem fromOptionValue(String optionValue) {
        for (UnitSystem system : values()) {
            if (system.optionValue.equals(optionValue)) {
                return system;
            }
        }
        throw new IllegalArgumentException("unknown units '" + optionValue + "'; expected one of: "
                + String.join(", ", new OptionValues()));
    }

    /** Reads {@code --units}. */
    public static final class Converter implements ITypeConverter<UnitSystem> {
        @Override
        public UnitSystem convert(String value) {
            try {
                return fromOptionValue(value);
            } catch (IllegalArgumentException e) {
                throw new TypeConversionException(e.getMessage());
            }
        }
    }

    /** The accepted {@code --units} values, for the help text. */
    public static final class OptionValues implements Iterable<String> {
        @Override
        public Iterator<String> iterator() {
            return Arrays.stream(values()).map(UnitSystem::optionValue).iterator();
        }
    }
}
