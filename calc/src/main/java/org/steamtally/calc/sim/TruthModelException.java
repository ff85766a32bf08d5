package org.steamtally.calc.sim;

import java.util.List;
import java.util.Objects;

/**
 * A design point that does not fit its unit, or an operating point at which the truth model cannot
 * produce a physical state (a negative flow, an extraction that would be wet). The message lists
 * every problem, one a line, each naming the sensor, state or component concerned.
 */
public final class TruthModelException extends IllegalArgumentException {

    private final List<String> problems;

    public TruthModelException(String unitId, List<String> problems) {
        super(message(unitId, problems));
        this.problems = List.copyOf(problems);
    }

    private static String message(String unitId, List<String> problems) {
        Objects.requireNonNull(unitId, "unitId");
        StringBuilder text = new StringBuilder("truth model of unit \"").append(unitId).append("\": ")
                .append(problems.size()).append(problems.size() == 1 ? " problem:" : " problems:");
        for (String p : problems) {
            text.append("\n  - ").append(p);
        }
        return text.toString();
    }

    /** Each problem, in the words of the message. */
    public List<String> problems() {
        return problems;
    }
}
