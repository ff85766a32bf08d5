package org.steamtally.dashboard.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.dashboard.fixture.TestDashboard.await;

import io.micrometer.core.instrument.Gauge;
import io.vertx.core.MultiMap;
import io.vertx.core.buffer.Buffer;
import io.vertx.core.http.HttpClient;
import io.vertx.core.http.HttpClientResponse;
import io.vertx.core.http.HttpMethod;
import io.vertx.core.json.JsonArray;
import io.vertx.core.json.JsonObject;
import io.vertx.ext.web.client.HttpRequest;
import io.vertx.ext.web.client.HttpResponse;
import io.vertx.ext.web.client.WebClient;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.BooleanSupplier;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.UnitResult;
import org.steamtally.dashboard.fixture.FernholmTestPlant;
import org.steamtally.dashboard.fixture.TestDashboard;
import org.steamtally.dashboard.json.ResultJson;
import org.steamtally.dashboard.security.AuditEntry;

/** The API against a running server on a free port, with in-memory live results and alarms. */
class DashboardApiTest {

    private TestDashboard dash;
    private WebClient client;

    @BeforeEach
    void start() {
        dash = new TestDashboard();
        client = WebClient.create(dash.vertx);
    }

    @AfterEach
    void stop() {
        client.close();
        dash.close();
    }

    private HttpRequest<Buffer> get(String path) {
        return client.get(dash.port, "127.0.0.1", path);
    }

    private HttpRequest<Buffer> post(String path) {
        return client.post(dash.port, "127.0.0.1", path);
    }

    private static void assertJsonError(HttpResponse<Buffer> r, int status, String messagePart) {
        assertEquals(status, r.statusCode(), r.bodyAsString());
        assertTrue(r.getHeader("Content-Type").startsWith("application/json"), r.getHeader("Content-Type"));
        JsonObject body = r.bodyAsJsonObject();
        assertEquals(status, body.getInteger("status"));
        String message = body.getString("message");
        assertTrue(message.contains(messagePart), message);
        assertFalse(r.bodyAsString().contains("\tat "), "no stack trace in " + r.bodyAsString());
        assertFalse(r.bodyAsString().contains("Exception"), "no exception names in " + r.bodyAsString());
    }

    /** Logs in and returns {cookie header, CSRF token}. */
    private String[] login(String user) {
        HttpResponse<Buffer> r = await(post("/api/v1/session").sendJsonObject(
                new JsonObject().put("user", user).put("password", TestDashboard.PASSWORD)));
        assertEquals(200, r.statusCode(), r.bodyAsString());
        String setCookie = r.cookies().get(0);
        return new String[] {setCookie.split(";")[0], r.bodyAsJsonObject().getString("csrf_token")};
    }

    @Test
    void unitsAreListedWithTheFreshnessOfTheirResults() {
        JsonObject before = await(get("/api/v1/units").send()).bodyAsJsonObject();
        assertEquals("fernholm", before.getJsonObject("site").getString("id"));
        assertEquals("no_data", before.getJsonArray("units").getJsonObject(0).getString("status"));

        dash.publish(1.0);
        JsonObject live = await(get("/api/v1/units").send()).bodyAsJsonObject().getJsonArray("units").getJsonObject(0);
        assertEquals("live", live.getString("status"));
        assertEquals("2026-12-01T06:00:00.000Z", live.getString("last_result_ts"));

        dash.now.set(FernholmTestPlant.T0.plusSeconds(11));
        assertEquals("stale", await(get("/api/v1/units").send()).bodyAsJsonObject().getJsonArray("units")
                .getJsonObject(0).getString("status"));
    }

    @Test
    void liveAnswersWithTheLatestResultRecordInItsJsonForm() {
        dash.publish(1.0);
        dash.now.set(FernholmTestPlant.T0.plusSeconds(1));
        UnitResult latest = dash.plant.result(dash.now.get(), 1.01);
        dash.live.publish(latest);

        HttpResponse<Buffer> r = await(get("/api/v1/units/unit3/live").send());
        assertEquals(200, r.statusCode());
        assertEquals(ResultJson.write(latest), ResultJson.write(ResultJson.read(r.bodyAsString())));
        assertTrue(latest.cycle().thermalEfficiency().isPresent(), "the fixture computes a full cycle");
    }

    @Test
    void liveOfAUnitWithoutResultsIsANotFoundThatSaysWhy() {
        assertJsonError(await(get("/api/v1/units/unit4/live").send()), 404, "no result yet");
    }

    @Test
    void anUnknownUnitIsNamedInTheNotFoundMessage() {
        assertJsonError(await(get("/api/v1/units/unit9/live").send()), 404, "unit 'unit9' is not in the plant");
        assertJsonError(await(get("/api/v1/units/unit9/alarms").send()), 404, "GET /api/v1/units");
    }

    @Test
    void theStreamDeliversAResultPublishedAfterItOpened() throws Exception {
        HttpClient http = dash.vertx.createHttpClient();
        StringBuilder received = new StringBuilder();
        CompletableFuture<String> second = new CompletableFuture<>();
        dash.publish(1.0);
        // The body handler is set in the response callback, on the event loop, so no chunk arrives before it.
        HttpClientResponse resp = await(http.request(HttpMethod.GET, dash.port, "127.0.0.1", "/api/v1/units/unit3/stream")
                .compose(req -> req.send().onSuccess(r -> r.handler(buf -> {
                    synchronized (received) {
                        received.append(buf.toString());
                        if (received.toString().split("event: result", -1).length - 1 >= 2) {
                            second.complete(received.toString());
                        }
                    }
                }))));
        assertEquals(200, resp.statusCode());
        assertTrue(resp.getHeader("Content-Type").startsWith("text/event-stream"));
        waitFor(() -> dash.live.listenerCount(FernholmTestPlant.UNIT) == 1, "the stream subscribes");
        dash.now.set(FernholmTestPlant.T0.plusSeconds(1));
        UnitResult pushed = dash.plant.result(dash.now.get(), 0.98);
        dash.live.publish(pushed);

        String text = second.get(20, TimeUnit.SECONDS);
        List<String> data = new ArrayList<>();
        for (String line : text.split("\n")) {
            if (line.startsWith("data: ")) {
                data.add(line.substring(6));
            }
        }
        assertEquals(ResultJson.write(pushed), ResultJson.write(ResultJson.read(data.get(data.size() - 1))));

        dash.alarms.acknowledge(TestDashboard.FLOW_ALARM, "ops1");
        waitFor(() -> {
            synchronized (received) {
                return received.toString().contains("event: alarm");
            }
        }, "the alarm change is streamed");
        await(http.close());
        waitFor(() -> dash.live.listenerCount(FernholmTestPlant.UNIT) == 0, "a closed stream unsubscribes");
    }

    @Test
    void errorsAreJsonWithAMessageAndTheRightStatus() {
        assertJsonError(await(get("/api/v1/nothing-here").send()), 404, "/api/v1/openapi.yaml");
        assertJsonError(await(post("/api/v1/session").putHeader("Content-Type", "application/json")
                .sendBuffer(Buffer.buffer("{not json"))), 400, "not a JSON object");
        assertJsonError(await(post("/api/v1/session").putHeader("Content-Type", "application/x-www-form-urlencoded")
                .sendBuffer(Buffer.buffer("user=a&password=b"))), 415, "Content-Type: application/json");
        assertJsonError(await(post("/api/v1/session").sendJsonObject(new JsonObject().put("user", "ops1"))), 400,
                "'password'");
        assertJsonError(await(get("/api/v1/units/unit3/trends?series=efficiency&from=2026-12-01T00:00:00Z"
                + "&to=2026-12-01T08:00:00Z").send()), 400, "unknown series 'efficiency'");
        assertJsonError(await(get("/api/v1/units/unit3/trends?series=net_work_W&from=yesterday&to=2026-12-01T08:00:00Z")
                .send()), 400, "'from' must be an ISO-8601 instant");
    }

    @Test
    void trendsAndShiftSummariesSayThatNoStoreIsConnected() {
        assertJsonError(await(get("/api/v1/units/unit3/trends?series=thermal_efficiency,net_work_W"
                + "&from=2026-12-01T00:00:00Z&to=2026-12-01T08:00:00Z&bucket=PT1M").send()), 501, "no result store");
        assertJsonError(await(get("/api/v1/units/unit3/shifts?from=2026-11-01T00:00:00Z&to=2026-12-01T00:00:00Z"
                + "&format=csv").send()), 501, "shift summaries");
        assertJsonError(await(get("/api/v1/units/unit3/alarms/history?from=2026-11-01T00:00:00Z"
                + "&to=2026-12-01T00:00:00Z").send()), 501, "alarm history");
    }

    @Test
    void alarmActionsWithoutALoginAreRefused() {
        HttpResponse<Buffer> r = await(post("/api/v1/alarms/" + TestDashboard.SENSOR_ALARM + "/acknowledge")
                .sendJsonObject(new JsonObject()));
        assertJsonError(r, 401, "log in as an operator");
        assertEquals("unacknowledged", dash.alarms.list("unit3").get(0).state().key());
    }

    @Test
    void alarmActionsWithoutTheCsrfTokenAreRefused() {
        String[] session = login(TestDashboard.OPERATOR);
        HttpResponse<Buffer> r = await(post("/api/v1/alarms/" + TestDashboard.SENSOR_ALARM + "/acknowledge")
                .putHeader("Cookie", session[0]).sendJsonObject(new JsonObject()));
        assertJsonError(r, 403, "X-CSRF-Token");
        HttpResponse<Buffer> wrong = await(post("/api/v1/alarms/" + TestDashboard.SENSOR_ALARM + "/acknowledge")
                .putHeader("Cookie", session[0]).putHeader("X-CSRF-Token", session[1] + "x")
                .sendJsonObject(new JsonObject()));
        assertJsonError(wrong, 403, "X-CSRF-Token");
        assertEquals("unacknowledged", dash.alarms.list("unit3").get(0).state().key());
    }

    @Test
    void aViewerCannotAcknowledge() {
        String[] session = login(TestDashboard.VIEWER);
        assertJsonError(await(post("/api/v1/alarms/" + TestDashboard.SENSOR_ALARM + "/acknowledge")
                .putHeader("Cookie", session[0]).putHeader("X-CSRF-Token", session[1])
                .sendJsonObject(new JsonObject())), 403, "needs the operator role");
    }

    @Test
    void anOperatorAcknowledgesShelvesAndUnshelvesAndEachActionIsAudited() {
        String[] s = login(TestDashboard.OPERATOR);
        String base = "/api/v1/alarms/" + TestDashboard.SENSOR_ALARM;
        HttpResponse<Buffer> ack = await(post(base + "/acknowledge").putHeader("Cookie", s[0])
                .putHeader("X-CSRF-Token", s[1]).sendJsonObject(new JsonObject()));
        assertEquals(200, ack.statusCode(), ack.bodyAsString());
        assertEquals("acknowledged", ack.bodyAsJsonObject().getString("state"));

        assertJsonError(await(post(base + "/acknowledge").putHeader("Cookie", s[0]).putHeader("X-CSRF-Token", s[1])
                .sendJsonObject(new JsonObject())), 409, "only an unacknowledged alarm");

        assertJsonError(await(post(base + "/shelve").putHeader("Cookie", s[0]).putHeader("X-CSRF-Token", s[1])
                .sendJsonObject(new JsonObject().put("duration_min", 0).put("reason", "x"))), 400, "'duration_min'");
        HttpResponse<Buffer> shelve = await(post(base + "/shelve").putHeader("Cookie", s[0])
                .putHeader("X-CSRF-Token", s[1]).sendJsonObject(new JsonObject().put("duration_min", 60)
                        .put("reason", "thermometer being replaced, work order 4711")));
        assertEquals(200, shelve.statusCode(), shelve.bodyAsString());
        assertEquals("shelved", shelve.bodyAsJsonObject().getString("state"));
        assertEquals("2026-12-01T07:00:00.000Z", shelve.bodyAsJsonObject().getString("shelved_until"));

        HttpResponse<Buffer> unshelve = await(post(base + "/unshelve").putHeader("Cookie", s[0])
                .putHeader("X-CSRF-Token", s[1]).sendJsonObject(new JsonObject()));
        assertEquals("unacknowledged", unshelve.bodyAsJsonObject().getString("state"));

        List<String> actions = dash.audit.entries().stream().map(AuditEntry::action).toList();
        assertEquals(List.of("login", "alarm.acknowledge", "alarm.shelve", "alarm.unshelve"), actions);
        AuditEntry shelved = dash.audit.entries().get(2);
        assertEquals(TestDashboard.OPERATOR, shelved.user());
        assertEquals(TestDashboard.SENSOR_ALARM, shelved.target());
        assertTrue(shelved.detail().contains("work order 4711"));
    }

    @Test
    void theSessionCookieIsHttpOnlyAndStrictlySameSite() {
        HttpResponse<Buffer> r = await(post("/api/v1/session").sendJsonObject(
                new JsonObject().put("user", TestDashboard.OPERATOR).put("password", TestDashboard.PASSWORD)));
        String cookie = r.cookies().get(0);
        assertTrue(cookie.startsWith("steamtally_session="), cookie);
        assertTrue(cookie.toLowerCase(java.util.Locale.ROOT).contains("httponly"), cookie);
        assertTrue(cookie.contains("SameSite=Strict"), cookie);
        assertFalse(r.bodyAsString().contains(cookie.split(";")[0].split("=", 2)[1]), "the session id is not in the body");
    }

    @Test
    void repeatedFailedLoginsAreRateLimited() {
        for (int i = 0; i < 5; i++) {
            assertJsonError(await(post("/api/v1/session").sendJsonObject(
                    new JsonObject().put("user", TestDashboard.OPERATOR).put("password", "guess" + i))), 401, "wrong");
        }
        HttpResponse<Buffer> blocked = await(post("/api/v1/session").sendJsonObject(
                new JsonObject().put("user", TestDashboard.OPERATOR).put("password", TestDashboard.PASSWORD)));
        assertJsonError(blocked, 429, "too many failed logins");
        assertEquals("900", blocked.getHeader("Retry-After"));

        dash.now.set(FernholmTestPlant.T0.plus(Duration.ofMinutes(15)));
        assertEquals(200, await(post("/api/v1/session").sendJsonObject(
                new JsonObject().put("user", TestDashboard.OPERATOR).put("password", TestDashboard.PASSWORD)))
                .statusCode());
        assertEquals(5, dash.audit.entries().stream().filter(e -> e.action().equals("login.failed")).count());
    }

    @Test
    void markupInTagsAndNamesIsEscapedInJson() {
        dash.publish(1.0);
        for (String path : List.of("/api/v1/plant", "/api/v1/units", "/api/v1/units/unit3/alarms")) {
            String body = await(get(path).send()).bodyAsString();
            assertFalse(body.contains("<"), path + " has a raw '<': " + body);
            assertTrue(body.contains("\\u003c"), path);
        }
        JsonObject plant = await(get("/api/v1/plant").send()).bodyAsJsonObject();
        JsonArray sensors = plant.getJsonArray("units").getJsonObject(0).getJsonArray("sensors");
        assertTrue(sensors.stream().anyMatch(s -> ((JsonObject) s).getString("id").equals(FernholmTestPlant.SCRIPT_TAG)),
                "the tag reads back unchanged");
        assertEquals(FernholmTestPlant.SCRIPT_NAME, plant.getJsonArray("units").getJsonObject(1).getString("name"));
    }

    @Test
    void everyResponseCarriesTheSecurityHeaders() {
        for (String path : List.of("/", "/app.js", "/api/v1/units", "/api/v1/nothing")) {
            MultiMap h = await(get(path).send()).headers();
            String csp = h.get("Content-Security-Policy");
            assertNotNull(csp, path);
            assertTrue(csp.contains("frame-ancestors 'none'"), csp);
            assertTrue(csp.contains("script-src 'self'"), csp);
            assertFalse(csp.contains("unsafe-inline"), csp);
            assertEquals("nosniff", h.get("X-Content-Type-Options"), path);
        }
    }

    @Test
    void thePageHasNoInlineScript() {
        String html = await(get("/").send()).bodyAsString();
        assertTrue(html.contains("<script src="), html);
        assertFalse(html.matches("(?s).*<script>.*"), "no inline <script> element");
        assertFalse(html.matches("(?s).*\\son[a-z]+=.*"), "no inline event handler attribute");
    }

    @Test
    void withAnonymousViewingOffReadingNeedsALogin() {
        try (TestDashboard closed = new TestDashboard(false)) {
            WebClient c = WebClient.create(closed.vertx);
            assertJsonError(await(c.get(closed.port, "127.0.0.1", "/api/v1/units").send()), 401, "requires a login");
            HttpResponse<Buffer> login = await(c.post(closed.port, "127.0.0.1", "/api/v1/session").sendJsonObject(
                    new JsonObject().put("user", TestDashboard.VIEWER).put("password", TestDashboard.PASSWORD)));
            String cookie = login.cookies().get(0).split(";")[0];
            assertEquals(200, await(c.get(closed.port, "127.0.0.1", "/api/v1/units").putHeader("Cookie", cookie).send())
                    .statusCode());
            c.close();
        }
    }

    @Test
    void healthReportsLivenessAndReadiness() {
        assertEquals(200, await(get("/health/live").send()).statusCode());
        HttpResponse<Buffer> notReady = await(get("/health/ready").send());
        assertEquals(503, notReady.statusCode());
        assertEquals("no_data", notReady.bodyAsJsonObject().getJsonObject("units").getString("unit3"));
        dash.publish(1.0);
        dash.live.publish(resultOfSilentUnit());
        assertEquals(200, await(get("/health/ready").send()).statusCode());
    }

    private UnitResult resultOfSilentUnit() {
        UnitResult r = dash.plant.result(dash.now.get());
        return new UnitResult(r.timestamp(), r.site(), FernholmTestPlant.SILENT_UNIT, r.states(), r.components(),
                r.cycle(), r.closure());
    }

    @Test
    void metricsAreInThePrometheusFormat() {
        await(post("/api/v1/session").sendJsonObject(new JsonObject().put("user", "nobody").put("password", "x")));
        HttpResponse<Buffer> r = await(get("/metrics").send());
        assertEquals(200, r.statusCode());
        assertTrue(r.getHeader("Content-Type").startsWith("text/plain"), r.getHeader("Content-Type"));
        assertTrue(r.bodyAsString().contains("steamtally_dashboard_logins_total{outcome=\"failed\"} 1.0"),
                r.bodyAsString());
        assertTrue(r.bodyAsString().contains("steamtally_dashboard_stream_clients"), r.bodyAsString());
    }

    @Test
    void metricsAreWrittenOffTheEventLoopSoThatALargeRegistryDoesNotHoldUpTheStreams() {
        AtomicReference<String> readOn = new AtomicReference<>();
        Gauge.builder("test.thread.probe", () -> {
            readOn.set(Thread.currentThread().getName());
            return 1.0;
        }).register(dash.meters);
        HttpResponse<Buffer> r = await(get("/metrics").send());
        assertEquals(200, r.statusCode());
        assertTrue(r.bodyAsString().contains("test_thread_probe 1.0"), r.bodyAsString());
        assertTrue(readOn.get() != null && !readOn.get().contains("eventloop"), "gauge read on " + readOn.get());
    }

    @Test
    void theOpenApiDocumentDescribesEveryRoute() {
        HttpResponse<Buffer> r = await(get("/api/v1/openapi.yaml").send());
        assertEquals(200, r.statusCode());
        String doc = r.bodyAsString();
        assertTrue(doc.startsWith("openapi: 3."));
        for (String path : List.of("/api/v1/session:", "/api/v1/plant:", "/api/v1/units:", "/api/v1/units/{unit}/live:",
                "/api/v1/units/{unit}/stream:", "/api/v1/units/{unit}/ts-diagram:", "/api/v1/units/{unit}/alarms:",
                "/api/v1/alarms/{id}/acknowledge:", "/api/v1/alarms/{id}/shelve:", "/api/v1/alarms/{id}/unshelve:",
                "/api/v1/units/{unit}/trends:", "/api/v1/units/{unit}/shifts:", "/api/v1/units/{unit}/alarms/history:",
                "/health:", "/health/live:",
                "/health/ready:", "/metrics:")) {
            assertTrue(doc.contains("\n  " + path + "\n"), "documented: " + path);
        }
    }

    @Test
    void theDiagramHasTheDomeAndOneIsobarPerGroupOfNearbyPressures() {
        dash.publish(1.0);
        JsonObject d = await(get("/api/v1/units/unit3/ts-diagram").send()).bodyAsJsonObject();
        assertTrue(d.getJsonArray("dome").size() > 100);
        List<Double> pressures = d.getJsonArray("isobars").stream().map(o -> ((JsonObject) o).getDouble("p_Pa")).toList();
        // 10.5, 10.4 and 10 MPa lie within 8 % of each other and share the 10.5 MPa line; 0.5 and 0.45 MPa,
        // 11 % apart, keep one line each, as do 1.8 MPa and 8 kPa.
        assertEquals(List.of(10.5e6, 1.8e6, 0.5e6, 0.45e6, 8e3), pressures);
    }

    private static void waitFor(BooleanSupplier condition, String what) {
        long deadline = System.nanoTime() + Duration.ofSeconds(20).toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("timed out waiting until " + what);
            }
            Thread.onSpinWait();
        }
    }
}
