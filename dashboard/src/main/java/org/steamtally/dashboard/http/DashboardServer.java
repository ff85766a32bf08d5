package org.steamtally.dashboard.http;

import io.vertx.core.Future;
import io.vertx.core.Vertx;
import io.vertx.core.buffer.Buffer;
import io.vertx.core.http.HttpServer;
import io.vertx.core.http.HttpServerOptions;
import io.vertx.core.net.PemKeyCertOptions;
import io.vertx.ext.web.Router;
import io.vertx.ext.web.RoutingContext;
import io.vertx.ext.web.handler.BodyHandler;
import io.vertx.ext.web.handler.StaticHandler;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.lang.System.Logger.Level;
import org.steamtally.dashboard.alarm.AlarmActionException;
import org.steamtally.dashboard.alarm.UnknownAlarmException;
import org.steamtally.dashboard.security.LoginRateLimiter;
import org.steamtally.dashboard.store.StoreQueryException;
import org.steamtally.dashboard.security.Sessions;

/**
 * The dashboard's HTTP server: the API under {@code /api/v1}, its OpenAPI document at
 * {@code /api/v1/openapi.yaml}, {@code /health}, {@code /metrics} and the page.
 *
 * <pre>{@code
 * DashboardServer server = new DashboardServer(vertx, sources, DashboardConfig.defaults().withPort(0));
 * int port = server.start().await();   // or .onSuccess(...)
 * }</pre>
 */
public final class DashboardServer {

    private static final System.Logger LOG = System.getLogger(DashboardServer.class.getName());

    /**
     * The page's only sources are the server itself: no inline script or style, no frames, no plugins.
     * Inline SVG presentation attributes are not styles and need no exception.
     */
    static final String CONTENT_SECURITY_POLICY = "default-src 'none'; script-src 'self'; style-src 'self'; "
            + "img-src 'self' data:; connect-src 'self'; font-src 'self'; base-uri 'none'; form-action 'self'; "
            + "frame-ancestors 'none'; object-src 'none'";

    private final Vertx vertx;
    private final DashboardSources sources;
    private final DashboardConfig config;
    private HttpServer server;
    private final java.util.List<Extension> extensions = new java.util.ArrayList<>();

    public DashboardServer(Vertx vertx, DashboardSources sources, DashboardConfig config) {
        this.vertx = vertx;
        this.sources = sources;
        this.config = config;
    }

    /**
     * Extra API routes from the daemon's wiring (e.g. the demo's fault injection), registered behind
     * the same security headers, body limit and session handling as the built-in ones. Handlers may
     * throw {@link ApiException}.
     */
    @FunctionalInterface
    public interface Extension {
        /**
         * @param router   the dashboard's router
         * @param operator a handler that lets a request through only from a logged-in operator with the
         *                 session's CSRF token, as for alarm actions; put it before the route's handler
         */
        void register(Router router, io.vertx.core.Handler<io.vertx.ext.web.RoutingContext> operator);
    }

    /** Adds an extension; call before {@link #start()}. */
    public DashboardServer extend(Extension extension) {
        extensions.add(java.util.Objects.requireNonNull(extension, "extension"));
        return this;
    }

    /** Starts listening; the future carries the actual port (useful with port 0). */
    public Future<Integer> start() {
        HttpServerOptions options = new HttpServerOptions().setHost(config.host()).setPort(config.port());
        config.tls().ifPresent(t -> options.setSsl(true).setKeyCertOptions(new PemKeyCertOptions()
                .setCertPath(t.certificatePem().toString()).setKeyPath(t.privateKeyPem().toString())));
        return vertx.createHttpServer(options).requestHandler(router()).listen().map(s -> {
            server = s;
            return s.actualPort();
        });
    }

    public Future<Void> stop() {
        return server == null ? Future.succeededFuture() : server.close();
    }

    /** The routes, one handler class per resource. */
    Router router() {
        var clock = sources.clock();
        Sessions sessions = new Sessions(clock, config.sessionIdle());
        LoginRateLimiter limiter = new LoginRateLimiter(clock, config.maxLoginFailures(), config.loginWindow());
        Access access = new Access(sessions, config.anonymousViewing());

        var plant = sources.plant();
        var units = new UnitsResource(plant, sources.live());
        var session = new SessionResource(vertx, sources.users(), sessions, limiter, sources.audit(), clock,
                config.tls().isPresent(), sources.meters());
        var alarms = new AlarmsResource(plant, sources.alarms(), sources.audit(), clock);
        var stream = new StreamResource(vertx, plant, sources.live(), sources.alarms(), sources.meters());
        var diagram = new DiagramResource(plant, sources.live());
        var plantResource = new PlantResource(plant);
        var history = new HistoryResource(vertx, plant, sources.history());
        var health = new HealthResource(sources.live());
        var metrics = new MetricsResource(vertx, sources.meters());
        Buffer openApi = resource("openapi.yaml");

        Router r = Router.router(vertx);
        r.route().handler(DashboardServer::securityHeaders);
        r.route("/api/*").handler(ctx -> {
            ctx.response().putHeader("Cache-Control", "no-store");
            ctx.next();
        });
        r.route("/api/*").handler(BodyHandler.create().setBodyLimit(16 * 1024).setHandleFileUploads(false));
        r.route("/api/*").handler(access::identify);
        r.route("/api/*").handler(Access::requireJsonBody);

        r.get("/health").handler(health::both);
        r.get("/health/live").handler(health::liveness);
        r.get("/health/ready").handler(health::readiness);
        r.get("/metrics").handler(metrics::get);

        r.get("/api/v1/openapi.yaml").handler(ctx -> ctx.response()
                .putHeader("Content-Type", "application/yaml; charset=utf-8").end(openApi));

        r.post("/api/v1/session").handler(session::login);
        r.get("/api/v1/session").handler(session::current);
        r.delete("/api/v1/session").handler(access::loggedInWithCsrf).handler(session::logout);

        r.get("/api/v1/plant").handler(access::viewer).handler(plantResource::get);
        r.get("/api/v1/units").handler(access::viewer).handler(units::list);
        r.get("/api/v1/units/:unit/live").handler(access::viewer).handler(units::latest);
        r.get("/api/v1/units/:unit/stream").handler(access::viewer).handler(stream::open);
        r.get("/api/v1/units/:unit/ts-diagram").handler(access::viewer).handler(diagram::get);
        r.get("/api/v1/units/:unit/alarms").handler(access::viewer).handler(alarms::list);
        r.get("/api/v1/units/:unit/alarms/history").handler(access::viewer).handler(history::alarmHistory);
        r.get("/api/v1/units/:unit/trends").handler(access::viewer).handler(history::trends);
        r.get("/api/v1/units/:unit/shifts").handler(access::viewer).handler(history::shifts);
        r.post("/api/v1/alarms/:id/acknowledge").handler(access::operator).handler(alarms::acknowledge);
        r.post("/api/v1/alarms/:id/shelve").handler(access::operator).handler(alarms::shelve);
        r.post("/api/v1/alarms/:id/unshelve").handler(access::operator).handler(alarms::unshelve);

        for (Extension e : extensions) {
            e.register(r, access::operator);
        }

        r.route("/api/*").handler(ctx -> Responses.error(ctx, 404, "no API resource at " + ctx.request().method()
                + " " + ctx.normalizedPath() + "; the OpenAPI document at /api/v1/openapi.yaml lists them"));
        // Browser libraries from webjars on the classpath, under their versioned paths.
        r.get("/webjars/*").handler(StaticHandler.create("META-INF/resources/webjars").setCachingEnabled(true)
                .setMaxAgeSeconds(86_400).setDirectoryListing(false));
        r.route("/*").handler(StaticHandler.create("webroot").setIndexPage("index.html").setCachingEnabled(false)
                .setDirectoryListing(false));

        r.route().failureHandler(DashboardServer::failure);
        r.errorHandler(404, ctx -> Responses.error(ctx, 404, "nothing at " + ctx.normalizedPath()));
        r.errorHandler(405, ctx -> Responses.error(ctx, 405, ctx.request().method() + " is not allowed on "
                + ctx.normalizedPath() + "; the OpenAPI document at /api/v1/openapi.yaml lists the methods"));
        r.errorHandler(413, ctx -> Responses.error(ctx, 413, "the request body is larger than 16 KiB"));
        r.errorHandler(500, DashboardServer::failure);
        return r;
    }

    private static void securityHeaders(RoutingContext ctx) {
        ctx.response().headers()
                .set("Content-Security-Policy", CONTENT_SECURITY_POLICY)
                .set("X-Content-Type-Options", "nosniff")
                .set("X-Frame-Options", "DENY")
                .set("Referrer-Policy", "no-referrer")
                .set("Cross-Origin-Opener-Policy", "same-origin")
                .set("Cross-Origin-Resource-Policy", "same-origin");
        ctx.next();
    }

    /** Every failure becomes a JSON error; only unexpected ones are logged, with their stack trace, and never sent. */
    private static void failure(RoutingContext ctx) {
        Throwable t = ctx.failure();
        if (t instanceof ApiException e) {
            Responses.error(ctx, e.status(), e.getMessage());
        } else if (t instanceof UnknownAlarmException e) {
            Responses.error(ctx, 404, e.getMessage());
        } else if (t instanceof AlarmActionException e) {
            Responses.error(ctx, 409, e.getMessage());
        } else if (t instanceof StoreQueryException e) {
            LOG.log(Level.WARNING, "store query for " + ctx.normalizedPath() + " failed: " + e.getMessage());
            Responses.error(ctx, 503, "the result store did not answer this query; try again, and if it persists "
                    + "the server log names the cause");
        } else if (t == null && ctx.statusCode() >= 400 && ctx.statusCode() < 500) {
            Responses.error(ctx, ctx.statusCode(), "the request was refused (" + ctx.statusCode() + ")");
        } else {
            LOG.log(Level.ERROR, "request " + ctx.request().method() + " " + ctx.normalizedPath() + " failed", t);
            Responses.error(ctx, 500, "the dashboard failed to answer this request; the server log has the details");
        }
    }

    private static Buffer resource(String name) {
        try (InputStream in = DashboardServer.class.getResourceAsStream(name)) {
            if (in == null) {
                throw new IllegalStateException("resource " + name + " is missing from the dashboard's jar");
            }
            return Buffer.buffer(in.readAllBytes());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
