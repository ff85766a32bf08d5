package org.steamtally.deploy.config;

import java.util.List;

/**
 * A configuration file that cannot be used, with every problem found in it (not just the first), each
 * naming the file, the line and the reason. The message lists them all, one per line. The subclasses
 * say which kind of file it was, so a caller can tell a bad plant description from a bad scenario.
 */
public abstract class ConfigFileException extends Exception {

    private static final long serialVersionUID = 1L;

    private final String file;
    private final List<ConfigProblem> problems;

    /**
     * @param kind     what the file is, for the first line of the message, e.g. "scenario"
     * @param file     the file as it was named to the loader
     * @param problems the problems, in the order of the file
     */
    protected ConfigFileException(String kind, String file, List<ConfigProblem> problems) {
        super(message(kind, file, problems));
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

    private static String message(String kind, String file, List<ConfigProblem> problems) {
        StringBuilder text = new StringBuilder(kind).append(' ').append(file).append(" has ")
                .append(problems.size()).append(problems.size() == 1 ? " problem:" : " problems:");
        for (ConfigProblem problem : problems) {
            text.append(System.lineSeparator()).append("  ").append(problem);
        }
        return text.toString();
    }
}
