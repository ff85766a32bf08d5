package org.steamtally.collector.mqtt;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The buffered sockets under the MQTT clients: used for plain TCP only, and one stream per socket. */
class BufferedSocketsTest {

    @Test
    void onlyBrokersThatAreAllPlainTcpGetBufferedSockets() {
        assertTrue(BufferedSockets.forBrokers(List.of("tcp://a:1883", "tcp://b:1883")).isPresent());
        assertTrue(BufferedSockets.forBrokers(List.of("tcp://a:1883", "ssl://b:8883")).isEmpty(),
                "a TLS broker needs the TLS factory");
        assertTrue(BufferedSockets.forBrokers(List.of("ws://a:9001")).isEmpty());
        assertTrue(BufferedSockets.forBrokers(List.of()).isEmpty());
    }

    @Test
    void aSocketHandsOutOneStreamSoThatNoByteIsLeftInASecondBuffer() throws Exception {
        try (ServerSocket server = new ServerSocket(0, 1, InetAddress.getLoopbackAddress());
             Socket client = BufferedSockets.forBrokers(List.of("tcp://x:1")).orElseThrow()
                     .createSocket(InetAddress.getLoopbackAddress(), server.getLocalPort());
             Socket peer = server.accept()) {
            byte[] sent = {0x30, 0x03, 'a', 'b', 'c', 0x40, 0x02, 0x00, 0x01};
            try (OutputStream out = peer.getOutputStream()) {
                out.write(sent);
                out.flush();
                InputStream first = client.getInputStream();
                assertSame(first, client.getInputStream());
                byte[] got = new byte[sent.length];
                int n = 0;
                while (n < got.length) {
                    n += client.getInputStream().read(got, n, got.length - n);
                }
                assertArrayEquals(sent, got, "every byte read, in order, whichever call took it");
            }
        }
    }
}
