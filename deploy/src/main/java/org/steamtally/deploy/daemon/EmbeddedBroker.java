package org.steamtally.deploy.daemon;

import io.moquette.broker.Server;
import io.moquette.broker.config.IConfig;
import io.moquette.broker.config.MemoryConfig;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.util.Properties;

/**
 * An in-process MQTT 3.1.1 broker (Moquette) on the loopback interface, for the demo and the tests
 * that run without an external broker. In memory only, telemetry off (nothing leaves the machine),
 * and a session queue far above Moquette's default of 1024: at the default a burst of QoS 1
 * publications overflows the queue, acknowledgements are dropped and the publisher stalls.
 * Its loggers ({@code io.moquette}, {@code io.netty}) belong at WARN in the logging configuration.
 */
public final class EmbeddedBroker implements AutoCloseable {

    /** Messages queued per session: a minute of a 100-sensor unit at 1 Hz with room to spare. */
    public static final int SESSION_QUEUE_SIZE = 65_536;

    private final Server server;
    private final int port;

    private EmbeddedBroker(Server server, int port) {
        this.server = server;
        this.port = port;
    }

    /**
     * Starts a broker on 127.0.0.1 at a free port. Moquette reports the configured port, not the
     * bound one, so port 0 cannot be used; a port the kernel has just handed out is free with near
     * certainty.
     */
    public static EmbeddedBroker start() {
        int port = freeLoopbackPort();
        Properties p = new Properties();
        p.setProperty(IConfig.HOST_PROPERTY_NAME, "127.0.0.1");
        p.setProperty(IConfig.PORT_PROPERTY_NAME, Integer.toString(port));
        p.setProperty(IConfig.PERSISTENCE_ENABLED_PROPERTY_NAME, "false");
        p.setProperty(IConfig.ENABLE_TELEMETRY_NAME, "false");
        p.setProperty(IConfig.SESSION_QUEUE_SIZE, Integer.toString(SESSION_QUEUE_SIZE));
        p.setProperty(IConfig.ALLOW_ANONYMOUS_PROPERTY_NAME, "true");
        Server server = new Server();
        try {
            server.startServer(new MemoryConfig(p));
        } catch (IOException e) {
            throw new UncheckedIOException("the embedded MQTT broker did not start on port " + port, e);
        }
        return new EmbeddedBroker(server, port);
    }

    /** The URL to connect to, {@code tcp://127.0.0.1:PORT}. */
    public String url() {
        return "tcp://127.0.0.1:" + port;
    }

    @Override
    public void close() {
        server.stopServer();
    }

    private static int freeLoopbackPort() {
        try (ServerSocket socket = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            return socket.getLocalPort();
        } catch (IOException e) {
            throw new UncheckedIOException("no free loopback port for the embedded MQTT broker", e);
        }
    }
}
