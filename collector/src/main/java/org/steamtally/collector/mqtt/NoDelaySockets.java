package org.steamtally.collector.mqtt;

import java.io.IOException;
import java.net.InetAddress;
import java.net.Socket;
import java.util.List;
import java.util.Optional;
import javax.net.SocketFactory;
import javax.net.ssl.SSLSocketFactory;

/**
 * Socket factories that switch Nagle's algorithm off (TCP_NODELAY, RFC 896) on the sockets of our
 * MQTT clients. The MQTT client library leaves it on, so a small packet written while an earlier one
 * is unacknowledged waits for that acknowledgement, which the receiver may delay by up to 40 ms
 * (delayed ACK, RFC 1122 4.2.3.2): readings published a few at a time, and the collector's
 * acknowledgements of QoS 1 deliveries, then lose tens of milliseconds each on the way. Mosquitto
 * offers the same switch for its side ({@code set_tcp_nodelay}).
 */
final class NoDelaySockets {

    private NoDelaySockets() {
    }

    /**
     * The factory for a client of these broker URLs: the configured TLS factory, or the JVM's default
     * one for URLs that are all TLS, or a plain one for URLs that are all plain, each with TCP_NODELAY.
     * Empty for a mix of plain and TLS URLs, where the client library picks per URL (and Nagle stays on).
     */
    static Optional<SocketFactory> forBrokers(List<String> urls, Optional<SSLSocketFactory> tls) {
        if (tls.isPresent()) {
            return Optional.of(new NoDelaySsl(tls.get()));
        }
        long secure = urls.stream().filter(NoDelaySockets::isTls).count();
        if (secure == 0) {
            return Optional.of(new NoDelayPlain(SocketFactory.getDefault()));
        }
        if (secure == urls.size()) {
            return Optional.of(new NoDelaySsl((SSLSocketFactory) SSLSocketFactory.getDefault()));
        }
        return Optional.empty();
    }

    private static boolean isTls(String url) {
        return url.startsWith("ssl://") || url.startsWith("wss://");
    }

    private static Socket noDelay(Socket s) throws IOException {
        s.setTcpNoDelay(true);
        return s;
    }

    /** Plain TCP. The client library creates an unconnected socket and connects it itself. */
    private static final class NoDelayPlain extends SocketFactory {
        private final SocketFactory delegate;

        NoDelayPlain(SocketFactory delegate) {
            this.delegate = delegate;
        }

        @Override
        public Socket createSocket() throws IOException {
            return noDelay(delegate.createSocket());
        }

        @Override
        public Socket createSocket(String host, int port) throws IOException {
            return noDelay(delegate.createSocket(host, port));
        }

        @Override
        public Socket createSocket(String host, int port, InetAddress localHost, int localPort) throws IOException {
            return noDelay(delegate.createSocket(host, port, localHost, localPort));
        }

        @Override
        public Socket createSocket(InetAddress host, int port) throws IOException {
            return noDelay(delegate.createSocket(host, port));
        }

        @Override
        public Socket createSocket(InetAddress address, int port, InetAddress localAddress, int localPort)
                throws IOException {
            return noDelay(delegate.createSocket(address, port, localAddress, localPort));
        }
    }

    /** TLS: the client library connects the unconnected TLS socket of {@link #createSocket()} itself. */
    private static final class NoDelaySsl extends SSLSocketFactory {
        private final SSLSocketFactory delegate;

        NoDelaySsl(SSLSocketFactory delegate) {
            this.delegate = delegate;
        }

        @Override
        public String[] getDefaultCipherSuites() {
            return delegate.getDefaultCipherSuites();
        }

        @Override
        public String[] getSupportedCipherSuites() {
            return delegate.getSupportedCipherSuites();
        }

        @Override
        public Socket createSocket() throws IOException {
            return noDelay(delegate.createSocket());
        }

        @Override
        public Socket createSocket(Socket s, String host, int port, boolean autoClose) throws IOException {
            return noDelay(delegate.createSocket(noDelay(s), host, port, autoClose));
        }

        @Override
        public Socket createSocket(String host, int port) throws IOException {
            return noDelay(delegate.createSocket(host, port));
        }

        @Override
        public Socket createSocket(String host, int port, InetAddress localHost, int localPort) throws IOException {
            return noDelay(delegate.createSocket(host, port, localHost, localPort));
        }

        @Override
        public Socket createSocket(InetAddress host, int port) throws IOException {
            return noDelay(delegate.createSocket(host, port));
        }

        @Override
        public Socket createSocket(InetAddress address, int port, InetAddress localAddress, int localPort)
                throws IOException {
            return noDelay(delegate.createSocket(address, port, localAddress, localPort));
        }
    }
}
