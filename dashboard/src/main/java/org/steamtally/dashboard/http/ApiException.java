package org.steamtally.dashboard.http;

/**
 * A request the API refuses, with the HTTP status and a message that tells the caller what to change.
 * The failure handler turns it into a JSON error body.
 */
public final class ApiException extends RuntimeException {

    private final int status;

    public ApiException(int status, String message) {
        super(message, null, false, false);
        this.status = status;
    }

    public int status() {
        return status;
    }

    static ApiException badRequest(String message) {
        return new ApiException(400, message);
    }

    static ApiException notFound(String message) {
        return new ApiException(404, message);
    }
}
