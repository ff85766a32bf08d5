package org.steamtally.deploy.config;

import java.util.List;

/**
 * A scenario file that cannot be used, with every problem found in it, each naming the file, the
 * line and the reason. The message lists them all, one per line.
 */
public final class ScenarioException extends ConfigFileException {

    private static final long serialVersionUID = 1L;

    public ScenarioException(String file, List<ConfigProblem> problems) {
        super("scenario", file, problems);
    }
}
