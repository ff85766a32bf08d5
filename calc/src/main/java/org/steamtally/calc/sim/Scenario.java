package org.steamtally.calc.sim;

import java.util.List;
import java.util.Objects;

/**
 * A named set of faults to inject, as read from a scenario file (shape in docs/SIMULATOR.md).
 *
 * @param name   for reports
 * @param faults the faults, each naming its sensor
 */
public record Scenario(String name, List<Fault> faults) {

    public Scenario {
        Objects.requireNonNull(name, "name");
        faults = List.copyOf(faults);
    }
}
