package org.steamtally.calc.cycle;

import java.util.List;
import java.util.Objects;

/**
 * A unit description that cannot be turned into a {@link CycleModel}: its states, sensors and
 * components do not make a cycle whose flows and enthalpies the model can fix. The message lists
 * every problem found, one a line, each naming the element concerned, so that a plant engineer can
 * correct the plant description in one pass.
 */
public final class CycleModelException extends IllegalArgumentException {

    private final String unitId;
    private final List<String> problems;

    /**
     * @param unitId   the unit whose description was rejected
     * @param problems the problems found, at least one, in the words shown to the user
     */
    public CycleModelException(String unitId, List<String> problems) {
        super(message(unitId, problems));
        this.unitId = unitId;
        this.problems = List.copyOf(problems);
    }

    private static String message(String unitId, List<String> problems) {
        Objects.requireNonNull(unitId, "unitId");
        if (problems.isEmpty()) {
            throw new IllegalArgumentException("a rejected unit description has at least one problem");
        }
        StringBuilder text = new StringBuilder("unit \"").append(unitId).append("\" cannot be modelled (")
                .append(problems.size()).append(problems.size() == 1 ? " problem):" : " problems):");
        for (String problem : problems) {
            text.append("\n  - ").append(problem);
        }
        return text.toString();
    }

    /** The unit whose description was rejected. */
    public String unitId() {
        return unitId;
    }

    /** Each problem, in the words of the message. */
    public List<String> problems() {
        return problems;
    }
}
