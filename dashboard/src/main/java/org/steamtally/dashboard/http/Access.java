package org.steamtally.dashboard.http;

import io.vertx.core.http.Cookie;
import io.vertx.core.http.HttpMethod;
import io.vertx.ext.web.RoutingContext;
import java.util.Optional;
import org.steamtally.dashboard.security.Role;
import org.steamtally.dashboard.security.Session;
import org.steamtally.dashboard.security.Sessions;

/**
 * Who is asking, and whether they may: the session from its cookie, the viewer and operator checks
 * and the CSRF check on every state-changing request.
 */
final class Access {

    static final String COOKIE = "steamtally_session";
    static final String CSRF_HEADER = "X-CSRF-Token";
    private static final String SESSION_KEY = "steamtally.session";

    private final Sessions sessions;
    private final boolean anonymousViewing;

    Access(Sessions sessions, boolean anonymousViewing) {
        this.sessions = sessions;
        this.anonymousViewing = anonymousViewing;
    }

    /** Finds the session of the request's cookie, if any; never refuses. */
    void identify(RoutingContext ctx) {
        Cookie c = ctx.request().getCookie(COOKIE);
        if (c != null) {
            sessions.find(c.getValue()).ifPresent(s -> ctx.put(SESSION_KEY, s));
        }
        ctx.next();
    }

    static Optional<Session> session(RoutingContext ctx) {
        return Optional.ofNullable(ctx.get(SESSION_KEY));
    }

    /** Lets a read through when anonymous viewing is on or the caller is logged in. */
    void viewer(RoutingContext ctx) {
        if (!anonymousViewing && session(ctx).isEmpty()) {
            throw new ApiException(401, "this dashboard requires a login to view: POST /api/v1/session with "
                    + "{\"user\", \"password\"}");
        }
        ctx.next();
    }

    /**
     * Lets a state-changing request through only from a logged-in operator whose request carries the
     * session's CSRF token and a JSON body type (which a cross-site form cannot send).
     */
    void operator(RoutingContext ctx) {
        Session s = session(ctx).orElseThrow(() -> new ApiException(401,
                "log in as an operator first: POST /api/v1/session with {\"user\", \"password\"}"));
        requireCsrf(ctx, s);
        if (s.role() != Role.OPERATOR) {
            throw new ApiException(403, "user '" + s.user() + "' is a " + s.role().key()
                    + "; this action needs the operator role");
        }
        ctx.next();
    }

    /** The CSRF check alone, for requests any logged-in user may make (logout). */
    void loggedInWithCsrf(RoutingContext ctx) {
        Session s = session(ctx).orElseThrow(() -> new ApiException(401, "not logged in"));
        requireCsrf(ctx, s);
        ctx.next();
    }

    private static void requireCsrf(RoutingContext ctx, Session s) {
        if (!Sessions.csrfMatches(s, ctx.request().getHeader(CSRF_HEADER))) {
            throw new ApiException(403, "missing or wrong " + CSRF_HEADER + " header; read the token from "
                    + "GET /api/v1/session and send it with every request that changes something");
        }
    }

    /** Refuses a body of any type but JSON on POST, PUT and DELETE with a body. */
    static void requireJsonBody(RoutingContext ctx) {
        HttpMethod m = ctx.request().method();
        if (m == HttpMethod.POST || m == HttpMethod.PUT || m == HttpMethod.PATCH) {
            String type = ctx.request().getHeader("Content-Type");
            if (type == null || !type.toLowerCase(java.util.Locale.ROOT).startsWith("application/json")) {
                throw new ApiException(415, "send the request body as JSON with Content-Type: application/json, was "
                        + (type == null ? "no Content-Type" : "'" + type + "'"));
            }
        }
        ctx.next();
    }
}
