package org.steamtally.deploy.replay;

import java.nio.file.Path;
import org.steamtally.calc.plant.PlantDescription;

/** Where {@code replay} gets the plant description named by {@code --config}. */
@FunctionalInterface
public interface PlantSource {

    /**
     * Reads and validates the plant description in {@code file}.
     *
     * @throws Exception when the file cannot be read or is not a valid plant description; the message,
     *                   meant for the person who wrote the file, is shown as it is
     */
    PlantDescription load(Path file) throws Exception;
}
