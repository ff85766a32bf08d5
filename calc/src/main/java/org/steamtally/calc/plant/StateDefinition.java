package org.steamtally.calc.plant;

import java.util.Objects;
import java.util.Optional;

/**
 * A measured or derived point of the cycle, between two components.
 *
 * @param id         name, unique within the unit, e.g. {@code "main_steam"}
 * @param fix        how its thermodynamic state is fixed
 * @param flowSensor      the mass-flow sensor on this stream, when it has one; unmetered flows follow
 *                        from the mass and energy balances
 * @param checkFlowSensor a second mass-flow sensor on this stream, or one on a stream whose flow the
 *                        balances already fix: the cycle model does not use it, the reconciliation
 *                        checks the balances against it
 */
public record StateDefinition(String id, StateFix fix, Optional<String> flowSensor, Optional<String> checkFlowSensor) {

    public StateDefinition {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(fix, "fix");
        Objects.requireNonNull(flowSensor, "flowSensor");
        Objects.requireNonNull(checkFlowSensor, "checkFlowSensor");
    }

    /** A state without a check-flow sensor. */
    public StateDefinition(String id, StateFix fix, Optional<String> flowSensor) {
        this(id, fix, flowSensor, Optional.empty());
    }

    /** True for an ideal reference state, which carries no flow and belongs to no component port. */
    public boolean isReference() {
        return fix instanceof StateFix.Isentropic;
    }
}
