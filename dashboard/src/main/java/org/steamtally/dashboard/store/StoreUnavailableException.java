package org.steamtally.dashboard.store;

/**
 * The store cannot take or give points right now (not reachable, timed out, overloaded); the same
 * request may succeed later. Writes that fail this way go to the spool.
 */
public class StoreUnavailableException extends Exception {

    public StoreUnavailableException(String message, Throwable cause) {
        super(message, cause);
    }
}
