package org.steamtally.deploy.config;

import java.util.Objects;

/**
 * One problem in a plant-description file, at a place in it.
 *
 * @param file    the file as it was named to the loader
 * @param line    1-based line, or 0 when the problem concerns the whole file
 * @param column  1-based column, or 0 when not known
 * @param message the reason, for a plant engineer
 */
public record ConfigProblem(String file, int line, int column, String message) {

    public ConfigProblem {
        Objects.requireNonNull(file, "file");
        Objects.requireNonNull(message, "message");
    }

    /** {@code file:line:column: message}, the form compilers use, so editors can jump to it. */
    @Override
    public String toString() {
        if (line <= 0) {
            return file + ": " + message;
        }
        return file + ":" + line + (column > 0 ? ":" + column : "") + ": " + message;
    }
}
