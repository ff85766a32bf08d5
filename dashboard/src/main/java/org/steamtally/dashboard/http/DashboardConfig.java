package org.steamtally.dashboard.http;

import java.nio.file.Path;
import java.time.Duration;
import java.util.Objects;
import java.util.Optional;

/**
 * How the dashboard's server listens and whom it lets in.
 *
 * @param host             the address to bind; {@code 127.0.0.1} by default, so that exposing the
 *                         dashboard is a deliberate choice
 * @param port             the port; 0 picks a free one (tests)
 * @param anonymousViewing whether reading needs no login
 * @param tls              certificate and key (PEM) when the server speaks HTTPS; the session
 *                         cookie is then marked Secure
 * @param sessionIdle      a session unused this long ends
 * @param maxLoginFailures failed logins allowed per client address and per user name within
 *                         {@code loginWindow}
 * @param loginWindow      the window of the login rate limit
 */
public record DashboardConfig(String host, int port, boolean anonymousViewing, Optional<Tls> tls,
                              Duration sessionIdle, int maxLoginFailures, Duration loginWindow) {

    public DashboardConfig {
        Objects.requireNonNull(host, "host");
        Objects.requireNonNull(tls, "tls");
        if (port < 0 || port > 65535) {
            throw new IllegalArgumentException("port must lie within 0 to 65535, was " + port);
        }
        if (maxLoginFailures < 1) {
            throw new IllegalArgumentException("max login failures must be at least 1, was " + maxLoginFailures);
        }
    }

    /**
     * 127.0.0.1:8080, anonymous viewing on, no TLS, sessions end after 8 idle hours (a shift), five
     * failed logins per 15 minutes (common practice for interactive logins).
     */
    public static DashboardConfig defaults() {
        return new DashboardConfig("127.0.0.1", 8080, true, Optional.empty(), Duration.ofHours(8), 5,
                Duration.ofMinutes(15));
    }

    public DashboardConfig withPort(int newPort) {
        return new DashboardConfig(host, newPort, anonymousViewing, tls, sessionIdle, maxLoginFailures, loginWindow);
    }

    public DashboardConfig withAnonymousViewing(boolean allowed) {
        return new DashboardConfig(host, port, allowed, tls, sessionIdle, maxLoginFailures, loginWindow);
    }

    public DashboardConfig withTls(Tls files) {
        return new DashboardConfig(host, port, anonymousViewing, Optional.of(files), sessionIdle, maxLoginFailures,
                loginWindow);
    }

    /** PEM files of the server certificate (chain) and its private key. */
    public record Tls(Path certificatePem, Path privateKeyPem) {
        public Tls {
            Objects.requireNonNull(certificatePem, "certificatePem");
            Objects.requireNonNull(privateKeyPem, "privateKeyPem");
        }
    }
}
