package org.steamtally.deploy.props;

import java.util.Arrays;
import java.util.Iterator;
import org.steamtally.calc.steam.Steam;
import org.steamtally.calc.steam.SteamRangeException;
import org.steamtally.calc.steam.SteamState;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/** The pairs of independent quantities a state can be given by, as named on {@code --given}. */
public enum InputPair {
    /** Pressure and temperature: single-phase states only. */
    P_T(Quantity.PRESSURE, Quantity.TEMPERATURE) {
        @Override
        public SteamState state(double first, double second) {
            return Steam.statePT(first, second);
        }
    },
    /** Pressure and specific enthalpy. */
    P_H(Quantity.PRESSURE, Quantity.ENTHALPY) {
        @Override
        public SteamState state(double first, double second) {
            return Steam.statePH(first, second);
        }
    },
    /** Pressure and specific entropy. */
    P_S(Quantity.PRESSURE, Quantity.ENTROPY) {
        @Override
        public SteamState state(double first, double second) {
            return Steam.statePS(first, second);
        }
    },
    /** Specific enthalpy and specific entropy. */
    H_S(Quantity.ENTHALPY, Quantity.ENTROPY) {
        @Override
        public SteamState state(double first, double second) {
            return Steam.stateHS(first, second);
        }
    },
    /** Pressure and vapour quality: states on the saturation line. */
    P_X(Quantity.PRESSURE, Quantity.QUALITY) {
        @Override
        public SteamState state(double first, double second) {
            return Steam.statePX(first, second);
        }
    },
    /** Temperature and vapour quality: states on the saturation line. */
    T_X(Quantity.TEMPERATURE, Quantity.QUALITY) {
        @Override
        public SteamState state(double first, double second) {
            return Steam.stateTX(first, second);
        }
    };

    private final Quantity first;
    private final Quantity second;
    private final String label;

    InputPair(Quantity first, Quantity second) {
        this.first = first;
        this.second = second;
        this.label = first.column() + "," + second.column();
    }

    /** The first quantity of the pair, e.g. p for {@code p,T}. */
    public Quantity first() {
        return first;
    }

    /** The second quantity of the pair, e.g. T for {@code p,T}. */
    public Quantity second() {
        return second;
    }

    /** The pair as written on {@code --given}, e.g. {@code p,T}. */
    public String label() {
        return label;
    }

    /**
     * The state for the two values, both in SI units.
     *
     * @throws SteamRangeException if IAPWS-IF97 defines no state there
     */
    public abstract SteamState state(double first, double second);

    /** The pair written as {@code label}, e.g. {@code p,T}; the column symbols are case-sensitive. */
    public static InputPair fromLabel(String label) {
        for (InputPair pair : values()) {
            if (pair.label.equals(label)) {
                return pair;
            }
        }
        throw new IllegalArgumentException("unknown pair '" + label + "'; expected one of: "
                + String.join("  ", new Labels()));
    }

    /** Reads {@code --given}. */
    public static final class Converter implements ITypeConverter<InputPair> {
        @Override
        public InputPair convert(String value) {
            try {
                return fromLabel(value);
            } catch (IllegalArgumentException e) {
                throw new TypeConversionException(e.getMessage());
            }
        }
    }

    /** The accepted {@code --given} values, for the help text. */
    public static final class Labels implements Iterable<String> {
        @Override
        public Iterator<String> iterator() {
            return Arrays.stream(values()).map(InputPair::label).iterator();
        }
    }
}
