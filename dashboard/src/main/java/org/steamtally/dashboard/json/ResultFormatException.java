package org.steamtally.dashboard.json;

/**
 * A text is not a result record: not JSON, a required field missing, or a field of the wrong type.
 * The message names the field.
 */
public final class ResultFormatException extends IllegalArgumentException {

    private static final long serialVersionUID = 1L;

    /** @param message which field is wrong and how */
    public ResultFormatException(String message) {
        super(message);
    }

    /** @param message what could not be read; @param cause the parser's complaint */
    public ResultFormatException(String message, Throwable cause) {
        super(message, cause);
    }
}
