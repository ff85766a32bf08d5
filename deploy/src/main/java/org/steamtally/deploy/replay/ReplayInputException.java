package org.steamtally.deploy.replay;

/**
 * An input of {@code replay} cannot be used at all: the plant description, the readings file, the
 * output file or an option. The message says which and why, for the person running the command.
 */
public final class ReplayInputException extends Exception {

    private static final long serialVersionUID = 1L;

    /** @param message which input cannot be used and why */
    public ReplayInputException(String message) {
        super(message);
    }
}
