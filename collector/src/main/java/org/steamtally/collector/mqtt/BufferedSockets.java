package org.steamtally.collector.mqtt;

import java.io.BufferedInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.Socket;
import java.util.List;
import java.util.Optional;
import javax.net.SocketFactory;

/**
 * Plain TCP sockets whose input is buffered, for the MQTT clients on {@code tcp://} brokers.
 *
 * <p>Why: Paho (1.2.5, both clients) reads each packet from the socket's own stream through an
 * unbuffered {@code DataInputStream}: the first byte, the remaining length a byte at a time, then the
 * rest, so every PUBLISH and every acknowledgement costs three or more system calls. At a fleet's
 * 5,700 readings a second that is the larger part of the daemon's MQTT receive thread, which sets
 * how fast a second's burst of readings gets through (docs/PERFORMANCE.md). With a buffer, one call
 * takes in whatever the broker has sent.
 *
 * <p>TLS sockets are left alone: they read whole TLS records already.
 */
final class BufferedSockets extends SocketFactory {

    /** Bytes read from the socket at most per call; a burst of readings is some hundreds of kB. */
    static final int BUFFER_BYTES = 64 * 1024;

    private static final BufferedSockets INSTANCE = new BufferedSockets();

    private BufferedSockets() {
    }

    /** The factory for these brokers, when every one of them is plain TCP ({@code tcp://}). */
    static Optional<SocketFactory> forBrokers(List<String> brokerUrls) {
        boolean plain = !brokerUrls.isEmpty() && brokerUrls.stream().allMatch(u -> u.startsWith("tcp://"));
        return plain ? Optional.of(INSTANCE) : Optional.empty();
    }

    @Override
    public Socket createSocket() {
        return new BufferedInputSocket();
    }

    @Override
    public Socket createSocket(String host, int port) throws IOException {
        return connected(null, new InetSocketAddress(host, port));
    }

    @Override
    public Socket createSocket(String host, int port, InetAddress localHost, int localPort) throws IOException {
        return connected(new InetSocketAddress(localHost, localPort), new InetSocketAddress(host, port));
    }

    @Override
    public Socket createSocket(InetAddress host, int port) throws IOException {
        return connected(null, new InetSocketAddress(host, port));
    }

    @Override
    public Socket createSocket(InetAddress address, int port, InetAddress localAddress, int localPort)
            throws IOException {
        return connected(new InetSocketAddress(localAddress, localPort), new InetSocketAddress(address, port));
    }

    /** A new socket bound to {@code local} (when not null) and connected to {@code remote}. */
    private Socket connected(InetSocketAddress local, InetSocketAddress remote) throws IOException {
        Socket s = createSocket();
        try {
            if (local != null) {
                s.bind(local);
            }
            s.connect(remote);
            return s;
        } catch (IOException e) {
            s.close();
            throw e;
        }
    }

    /**
     * A socket that hands out one buffered stream of its input, the same one at every call: two
     * buffers over one socket would each hold bytes the other never sees.
     */
    static final class BufferedInputSocket extends Socket {

        private InputStream in;

        @Override
        public synchronized InputStream getInputStream() throws IOException {
            if (in == null) {
                in = new BufferedInputStream(super.getInputStream(), BUFFER_BYTES);
            }
            return in;
        }
    }
}
