package org.steamtally.deploy.config;

import java.util.List;

/**
 * A scenario file that cannot be used, with every problem found in it, each naming the file, the
 * line and the reason. The message lists them all, one per line.
 */
public final class ScenarioException extends Exception {

    private static final long serialVersionUID = 1L;

    private final String file;
    private final List<ConfigProblem> problems;

    public ScenarioException(String file, List<ConfigProblem> problems) {
        super(message(file, problems));
        this.file = file;
        this.problems = List.copyOf(problems);
    }

    /** The file as it was named to the loader. */
    public String file() {
        return file;
    }

    /** The problems, in the order of the file. */
    public List<ConfigProblem> problems() {
        return problems;
    }

    private static String message(String file, List<ConfigProblem> problems) {
        StringBuilder text = new StringBuilder("scenario ").append(file).append(" has ")
                .append(problems.size()).append(problems.size() == 1 ? " problem:" : " problems:");
        for (ConfigProblem problem : problems) {
            text.append(System.lineSeparator()).append("  ").append(problem);
        }
        return text.toString();
    }
}
