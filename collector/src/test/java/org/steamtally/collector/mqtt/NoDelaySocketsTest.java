package org.steamtally.collector.mqtt;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.util.List;
import java.util.Optional;
import javax.net.SocketFactory;
import javax.net.ssl.SSLSocket;
import javax.net.ssl.SSLSocketFactory;
import org.junit.jupiter.api.Test;

class NoDelaySocketsTest {

    /** Connects the factory's unconnected socket, as the MQTT client library does, to a local listener. */
    private static Socket connected(SocketFactory f, ServerSocket server) throws Exception {
        Socket s = f.createSocket();
        s.connect(new InetSocketAddress(server.getInetAddress(), server.getLocalPort()), 5_000);
        return s;
    }

    @Test
    void plainBrokersGetSocketsWithNaglesAlgorithmOff() throws Exception {
        SocketFactory f = NoDelaySockets.forBrokers(List.of("tcp://127.0.0.1:1883", "ws://127.0.0.1:9001"),
                Optional.empty()).orElseThrow();
        try (ServerSocket server = new ServerSocket(0); Socket s = connected(f, server)) {
            assertTrue(s.getTcpNoDelay());
        }
    }

    @Test
    void tlsBrokersGetTlsSocketsWithNaglesAlgorithmOff() throws Exception {
        // The library casts the socket to SSLSocket and starts the handshake itself (none here).
        SocketFactory f = NoDelaySockets.forBrokers(List.of("ssl://127.0.0.1:8883"), Optional.empty()).orElseThrow();
        assertInstanceOf(SSLSocketFactory.class, f);
        try (ServerSocket server = new ServerSocket(0); Socket s = connected(f, server)) {
            assertInstanceOf(SSLSocket.class, s);
            assertTrue(s.getTcpNoDelay());
        }
    }

    @Test
    void aConfiguredTlsFactoryIsKeptAndWrapped() throws Exception {
        SSLSocketFactory configured = (SSLSocketFactory) SSLSocketFactory.getDefault();
        SocketFactory f = NoDelaySockets.forBrokers(List.of("tcp://127.0.0.1:1883"), Optional.of(configured))
                .orElseThrow();
        assertInstanceOf(SSLSocketFactory.class, f);
        assertEquals(List.of(configured.getDefaultCipherSuites()), List.of(((SSLSocketFactory) f).getDefaultCipherSuites()));
    }

    @Test
    void aMixOfPlainAndTlsBrokersIsLeftToTheLibrary() {
        assertEquals(Optional.empty(), NoDelaySockets.forBrokers(List.of("tcp://a:1883", "ssl://b:8883"), Optional.empty()));
    }
}
