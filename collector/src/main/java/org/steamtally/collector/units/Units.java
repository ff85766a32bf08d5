package org.steamtally.collector.units;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

import org.steamtally.calc.plant.Quantity;

/**
 * Looks up engineering units by spelling: the UCUM code or a common alias, matched case-sensitively
 * (as UCUM requires: {@code mbar} is a millibar, {@code Mbar} would be a megabar) after trimming
 * surrounding blanks. Pure functions, no I/O.
 */
public final class Units {

    private static final Map<String, EngineeringUnit> BY_SPELLING = spellings();

    private Units() {
    }

    /**
     * The unit with this spelling, of any quantity.
     *
     * @param spelling a UCUM code such as {@code "kPa"} or an alias such as {@code "psig"}
     * @return the unit
     * @throws UnknownUnitException naming the spelling and listing every accepted code
     */
    public static EngineeringUnit parse(String spelling) {
        EngineeringUnit unit = BY_SPELLING.get(normalise(spelling));
        if (unit == null) {
            List<String> accepted = codes(Arrays.asList(EngineeringUnit.values()));
            throw new UnknownUnitException(String.valueOf(spelling), Optional.empty(), accepted,
                    "unknown unit \"" + spelling + "\"" + caseHint(spelling) + " (accepted: "
                            + String.join(", ", accepted) + ")");
        }
        return unit;
    }

    /**
     * The unit with this spelling, which must be a unit of {@code quantity} (or of a quantity with the
     * same SI unit, see {@link EngineeringUnit#measures(Quantity)}).
     *
     * @param spelling a UCUM code or an alias
     * @param quantity what the value measures
     * @return the unit
     * @throws UnknownUnitException naming the spelling and listing the codes accepted for {@code quantity}
     */
    public static EngineeringUnit parse(String spelling, Quantity quantity) {
        EngineeringUnit unit = BY_SPELLING.get(normalise(spelling));
        if (unit != null && unit.measures(quantity)) {
            return unit;
        }
        List<String> accepted = codes(of(quantity));
        String what = unit == null
                ? "unit \"" + spelling + "\"" + caseHint(spelling) + " is not " + article(quantity) + " unit"
                : "unit \"" + spelling + "\" is " + article(unit.quantity()) + " unit, not "
                        + article(quantity) + " unit";
        throw new UnknownUnitException(String.valueOf(spelling), Optional.of(quantity), accepted,
                what + " (accepted: " + String.join(", ", accepted) + ")");
    }

    /** Every unit that may stand for {@code quantity}, in declaration order. */
    public static List<EngineeringUnit> of(Quantity quantity) {
        List<EngineeringUnit> units = new ArrayList<>();
        for (EngineeringUnit unit : EngineeringUnit.values()) {
            if (unit.measures(quantity)) {
                units.add(unit);
            }
        }
        return Collections.unmodifiableList(units);
    }

    /** Every accepted spelling (codes and aliases) for {@code quantity}, codes first within each unit. */
    public static List<String> spellingsOf(Quantity quantity) {
        List<String> all = new ArrayList<>();
        for (EngineeringUnit unit : of(quantity)) {
            all.add(unit.code());
            all.addAll(unit.aliases());
        }
        return Collections.unmodifiableList(all);
    }

    private static List<String> codes(List<EngineeringUnit> units) {
        List<String> codes = new ArrayList<>();
        for (EngineeringUnit unit : units) {
            codes.add(unit.code());
        }
        return codes;
    }

    private static String normalise(String spelling) {
        return spelling == null ? "" : spelling.strip();
    }

    /** Points out a spelling that differs from an accepted one only in case, a common slip. */
    private static String caseHint(String spelling) {
        String wanted = normalise(spelling).toLowerCase(Locale.ROOT);
        List<String> near = new ArrayList<>();
        for (String known : BY_SPELLING.keySet()) {
            if (known.toLowerCase(Locale.ROOT).equals(wanted)) {
                near.add(known);
            }
        }
        if (near.isEmpty()) {
            return "";
        }
        return " (units are case-sensitive: did you mean " + String.join(" or ", near) + "?)";
    }

    private static String article(Quantity quantity) {
        String label = quantity.label();
        return (label.startsWith("e") ? "an " : "a ") + label;
    }

    private static Map<String, EngineeringUnit> spellings() {
        Map<String, EngineeringUnit> map = new LinkedHashMap<>();
        for (EngineeringUnit unit : EngineeringUnit.values()) {
            put(map, unit.code(), unit);
            for (String alias : unit.aliases()) {
                put(map, alias, unit);
            }
        }
        return Collections.unmodifiableMap(map);
    }

    private static void put(Map<String, EngineeringUnit> map, String spelling, EngineeringUnit unit) {
        EngineeringUnit previous = map.put(spelling, unit);
        if (previous != null) {
            throw new IllegalStateException("unit spelling " + spelling + " given to both " + previous.name()
                    + " and " + unit.name());
        }
    }
}
