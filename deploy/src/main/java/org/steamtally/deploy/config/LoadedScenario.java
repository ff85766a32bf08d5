package org.steamtally.deploy.config;

import java.time.Instant;
import java.util.Objects;

import org.steamtally.calc.sim.Scenario;

/**
 * A scenario read from a file: the faults with their absolute instants, and what they apply to.
 *
 * @param unitId   the unit of the plant description whose sensors the faults name
 * @param timeZero the instant the fault starts are counted from: the file's {@code start}, or the
 *                 run's start when the file gives none
 * @param scenario the name and the faults, sizes in SI
 */
public record LoadedScenario(String unitId, Instant timeZero, Scenario scenario) {

    public LoadedScenario {
        Objects.requireNonNull(unitId, "unitId");
        Objects.requireNonNull(timeZero, "timeZero");
        Objects.requireNonNull(scenario, "scenario");
    }
}
