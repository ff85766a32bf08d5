package org.steamtally.collector.units;

import java.util.List;
import java.util.Optional;

import org.steamtally.calc.plant.Quantity;

/**
 * A unit spelling that is not accepted, or not accepted for the quantity it was given for. The
 * message names the spelling and lists the accepted ones, e.g.
 * {@code unit "furlong" is not a pressure unit (accepted: Pa, kPa, ...)}.
 */
public final class UnknownUnitException extends IllegalArgumentException {

    private static final long serialVersionUID = 1L;

    private final String unit;
    private final transient Optional<Quantity> expected;
    private final List<String> accepted;

    UnknownUnitException(String unit, Optional<Quantity> expected, List<String> accepted, String message) {
        super(message);
        this.unit = unit;
        this.expected = expected;
        this.accepted = List.copyOf(accepted);
    }

    /** The spelling that was given. */
    public String unit() {
        return unit;
    }

    /** The quantity the unit was asked for, when one was. */
    public Optional<Quantity> expected() {
        return expected;
    }

    /** The canonical codes accepted for that quantity (all codes when no quantity was asked for). */
    public List<String> accepted() {
        return accepted;
    }
}
