package org.steamtally.dashboard.http;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.steamtally.dashboard.fixture.TestDashboard.await;

import io.vertx.core.buffer.Buffer;
import io.vertx.core.json.JsonObject;
import io.vertx.core.net.SelfSignedCertificate;
import io.vertx.ext.web.client.HttpResponse;
import io.vertx.ext.web.client.WebClient;
import io.vertx.ext.web.client.WebClientOptions;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.steamtally.dashboard.fixture.TestDashboard;

class TlsTest {

    @Test
    void withTlsTheServerSpeaksHttpsAndTheSessionCookieIsSecure() {
        SelfSignedCertificate cert = SelfSignedCertificate.create("localhost");
        try (TestDashboard dash = new TestDashboard(c -> c.withTls(new DashboardConfig.Tls(
                Path.of(cert.certificatePath()), Path.of(cert.privateKeyPath()))))) {
            // The test trusts its own throw-away certificate; nothing else is contacted.
            WebClient client = WebClient.create(dash.vertx, new WebClientOptions().setSsl(true).setTrustAll(true)
                    .setVerifyHost(false));
            HttpResponse<Buffer> r = await(client.post(dash.port, "127.0.0.1", "/api/v1/session").sendJsonObject(
                    new JsonObject().put("user", TestDashboard.OPERATOR).put("password", TestDashboard.PASSWORD)));
            assertEquals(200, r.statusCode(), r.bodyAsString());
            String cookie = r.cookies().get(0);
            assertTrue(cookie.contains("Secure"), cookie);
            client.close();
        } finally {
            cert.delete();
        }
    }
}
