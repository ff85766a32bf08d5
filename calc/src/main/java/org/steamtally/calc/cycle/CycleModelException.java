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

    /** The sort of element of the unit's description a problem is about. */
    public enum Element {
        /** The unit as a whole, or no single element of it. */
        UNIT,
        SENSOR,
        STATE,
        COMPONENT
    }

    /**
     * One problem and the element of the unit's description it is about, so that a loader can name
     * the place in the file where that element is declared.
     *
     * @param element the sort of element
     * @param id      its id (the unit's id for {@link Element#UNIT})
     * @param message the problem, in the words shown to the user
     */
    public record Problem(Element element, String id, String message) {
        public Problem {
            Objects.requireNonNull(element, "element");
            Objects.requireNonNull(id, "id");
            Objects.requireNonNull(message, "message");
        }
    }

    private final String unitId;
    private final List<String> problems;
    private final List<Problem> located;

    /**
     * Problems that concern the unit as a whole.
     *
     * @param unitId   the unit whose description was rejected
     * @param problems the problems found, at least one, in the words shown to the user
     */
    public CycleModelException(String unitId, List<String> problems) {
        this(unitId, problems.stream().map(p -> new Problem(Element.UNIT, unitId, p)).toList(), true);
    }

    private CycleModelException(String unitId, List<Problem> located, boolean unused) {
        super(message(unitId, located.stream().map(Problem::message).toList()));
        this.unitId = unitId;
        this.located = List.copyOf(located);
        this.problems = this.located.stream().map(Problem::message).toList();
    }

    /**
     * @param unitId  the unit whose description was rejected
     * @param located the problems found, at least one, each with the element it is about
     * @return the exception listing them
     */
    public static CycleModelException located(String unitId, List<Problem> located) {
        return new CycleModelException(unitId, located, true);
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

    /** Each problem with the element of the description it is about, in the order of {@link #problems()}. */
    public List<Problem> located() {
        return located;
    }
}
