package org.steamtally.deploy.props;

import java.util.Arrays;
import java.util.Iterator;
import org.steamtally.collector.units.EngineeringUnit;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/**
 * The units of the {@code props} input and output columns, as named units of the collector's unit
 * table, so that every conversion of the project goes through one place. Specific entropy and
 * heat capacity take the energy unit per kelvin; specific volume (m³/kg), speed of sound (m/s) and
 * vapour quality (unitless) are the same in both systems.
 */
public enum UnitSystem {

    /** SI base units: Pa, K, J/kg, J/(kg·K). */
    SI("si", EngineeringUnit.PASCAL, EngineeringUnit.KELVIN, EngineeringUnit.JOULE_PER_KILOGRAM),

    /** kPa, °C, kJ/kg, kJ/(kg·K), as plant instruments and heat balances usually show them. */
    ENGINEERING("engineering", EngineeringUnit.KILOPASCAL, EngineeringUnit.CELSIUS,
            EngineeringUnit.KILOJOULE_PER_KILOGRAM);

    private final String optionValue;
    private final EngineeringUnit pressure;
    private final EngineeringUnit temperature;
    private final EngineeringUnit specificEnergy;

    UnitSystem(String optionValue, EngineeringUnit pressure, EngineeringUnit temperature,
               EngineeringUnit specificEnergy) {
        this.optionValue = optionValue;
        this.pressure = pressure;
        this.temperature = temperature;
        this.specificEnergy = specificEnergy;
    }

    /** The name given to {@code --units}, e.g. {@code engineering}. */
    public String optionValue() {
        return optionValue;
    }

    /** Pressure in Pa from this system's pressure unit. */
    public double pressureToSi(double value) {
        return pressure.toSi(value);
    }

    /** Pressure in this system's unit from Pa. */
    public double pressureFromSi(double pascal) {
        return pressure.fromSi(pascal);
    }

    /** Temperature in K from this system's temperature unit. */
    public double temperatureToSi(double value) {
        return temperature.toSi(value);
    }

    /** Temperature in this system's unit from K. */
    public double temperatureFromSi(double kelvin) {
        return temperature.fromSi(kelvin);
    }

    /** Specific enthalpy or internal energy in J/kg from this system's unit. */
    public double specificEnergyToSi(double value) {
        return specificEnergy.toSi(value);
    }

    /** Specific enthalpy or internal energy in this system's unit from J/kg. */
    public double specificEnergyFromSi(double joulePerKilogram) {
        return specificEnergy.fromSi(joulePerKilogram);
    }

    /** Specific entropy or heat capacity in J/(kg·K) from this system's unit (energy unit per kelvin). */
    public double specificEntropyToSi(double value) {
        return specificEnergy.toSi(value);
    }

    /** Specific entropy or heat capacity in this system's unit from J/(kg·K). */
    public double specificEntropyFromSi(double joulePerKilogramKelvin) {
        return specificEnergy.fromSi(joulePerKilogramKelvin);
    }

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
