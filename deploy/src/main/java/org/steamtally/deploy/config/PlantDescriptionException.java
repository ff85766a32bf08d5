package org.steamtally.deploy.config;

import java.util.List;

/**
 * A plant-description file that cannot be used, with every problem found in it (not just the first),
 * each naming the file, the line and the reason. The message lists them all, one per line.
 */
public final class PlantDescriptionException extends ConfigFileException {

    private static final long serialVersionUID = 1L;

    public PlantDescriptionException(String file, List<ConfigProblem> problems) {
        super("plant description", file, problems);
    }
}
