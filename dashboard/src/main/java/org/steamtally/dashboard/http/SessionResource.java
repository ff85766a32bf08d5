package org.steamtally.dashboard.http;

import io.micrometer.core.instrument.MeterRegistry;
import io.vertx.core.Vertx;
import io.vertx.core.http.Cookie;
import io.vertx.core.http.CookieSameSite;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.RoutingContext;
import java.time.Duration;
import java.time.InstantSource;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.steamtally.dashboard.security.AuditEntry;
import org.steamtally.dashboard.security.AuditLog;
import org.steamtally.dashboard.security.LoginRateLimiter;
import org.steamtally.dashboard.security.PasswordHash;
import org.steamtally.dashboard.security.Session;
import org.steamtally.dashboard.security.Sessions;
import org.steamtally.dashboard.security.UserAccount;

/** {@code /api/v1/session}: log in, see who is logged in (and the CSRF token), log out. */
final class SessionResource {

    /** A hash to check against when the user is unknown, so that the answer takes as long either way. */
    private static final String DUMMY_HASH = PasswordHash.create("not a password".toCharArray(), 1_000);

    private final Vertx vertx;
    private final Map<String, UserAccount> users;
    private final Sessions sessions;
    private final LoginRateLimiter limiter;
    private final AuditLog audit;
    private final InstantSource clock;
    private final boolean secureCookie;
    private final MeterRegistry meters;

    SessionResource(Vertx vertx, List<UserAccount> users, Sessions sessions, LoginRateLimiter limiter, AuditLog audit,
                    InstantSource clock, boolean secureCookie, MeterRegistry meters) {
        this.vertx = vertx;
        this.users = users.stream().collect(Collectors.toMap(UserAccount::name, Function.identity()));
        this.sessions = sessions;
        this.limiter = limiter;
        this.audit = audit;
        this.clock = clock;
        this.secureCookie = secureCookie;
        this.meters = meters;
    }

    void login(RoutingContext ctx) {
        JsonObject body = Bodies.object(ctx);
        String user = Bodies.requiredString(body, "user", 64);
        String password = Bodies.requiredString(body, "password", 256);
        String address = ctx.request().remoteAddress() == null ? "unknown" : ctx.request().remoteAddress().hostAddress();
        Optional<Duration> blocked = limiter.blockedFor("addr:" + address)
                .or(() -> limiter.blockedFor("user:" + user));
        if (blocked.isPresent()) {
            long seconds = Math.max(1, blocked.get().toSeconds());
            meters.counter("steamtally.dashboard.logins", "outcome", "rate_limited").increment();
            ctx.response().putHeader("Retry-After", Long.toString(seconds));
            throw new ApiException(429, "too many failed logins; try again in " + seconds + " s");
        }
        UserAccount account = users.get(user);
        String hash = account == null ? DUMMY_HASH : account.passwordHash();
        // PBKDF2 takes a noticeable fraction of a second by design: off the event loop.
        vertx.executeBlocking(() -> PasswordHash.verify(password.toCharArray(), hash) && account != null, false)
                .onSuccess(ok -> {
                    if (!ok) {
                        limiter.recordFailure("addr:" + address);
                        limiter.recordFailure("user:" + user);
                        meters.counter("steamtally.dashboard.logins", "outcome", "failed").increment();
                        audit.record(new AuditEntry(clock.instant(), user, "login.failed", "session", "from " + address));
                        Responses.error(ctx, 401, "user name or password is wrong");
                        return;
                    }
                    Session s = sessions.open(account);
                    meters.counter("steamtally.dashboard.logins", "outcome", "ok").increment();
                    audit.record(new AuditEntry(clock.instant(), user, "login", "session", "from " + address));
                    ctx.response().addCookie(Cookie.cookie(Access.COOKIE, s.id()).setPath("/").setHttpOnly(true)
                            .setSameSite(CookieSameSite.STRICT).setSecure(secureCookie));
                    Responses.json(ctx, describe(s));
                })
                .onFailure(ctx::fail);
    }

    void current(RoutingContext ctx) {
        Session s = Access.session(ctx).orElseThrow(() -> new ApiException(401,
                "not logged in: POST /api/v1/session with {\"user\", \"password\"}"));
        Responses.json(ctx, describe(s));
    }

    void logout(RoutingContext ctx) {
        Session s = Access.session(ctx).orElseThrow();
        sessions.close(s.id());
        audit.record(new AuditEntry(clock.instant(), s.user(), "logout", "session", ""));
        ctx.response().addCookie(Cookie.cookie(Access.COOKIE, "").setPath("/").setHttpOnly(true)
                .setSameSite(CookieSameSite.STRICT).setSecure(secureCookie).setMaxAge(0));
        ctx.response().setStatusCode(204).end();
    }

    private static JsonObject describe(Session s) {
        return new JsonObject().put("user", s.user()).put("role", s.role().key()).put("csrf_token", s.csrfToken());
    }
}
