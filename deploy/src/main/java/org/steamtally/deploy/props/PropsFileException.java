package org.steamtally.deploy.props;

/**
 * An input or output file of {@code props} cannot be used at all: it cannot be opened, it has no
 * header or lacks a column the input pair needs, or it is not valid CSV. The message says which file
 * and why, in words meant for the person who wrote the file.
 */
public final class PropsFileException extends Exception {

    private static final long serialVersionUID = 1L;

    /** @param message which file cannot be used and why */
    public PropsFileException(String message) {
        super(message);
    }
}
