package org.steamtally.dashboard.store;

/** A query could not be answered: the store is unreachable or refused the query, as the message says. */
public class StoreQueryException extends RuntimeException {

    public StoreQueryException(String message, Throwable cause) {
        super(message, cause);
    }

    public StoreQueryException(String message) {
        super(message);
    }
}
