package org.steamtally.collector.mqtt;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.KeyStore;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.SecretRef;

class TlsSocketsTest {

    private static final String PASSWORD = "trust-pw-4711";

    private static CollectorSettings withTrustStore(String path) {
        return CollectorSettings.builder(List.of("ssl://127.0.0.1:8883"), "c")
                .trustStore(path, SecretRef.env("ST_TRUST_PW")).build();
    }

    @Test
    void noStoresMeansTheJvmsDefaultTrust() {
        assertTrue(TlsSockets.socketFactory(CollectorSettings.builder(List.of("ssl://127.0.0.1:8883"), "c").build(),
                v -> null).isEmpty());
    }

    @Test
    void pkcs12TrustStoreWithItsPasswordFromTheEnvironmentGivesASocketFactory(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("trust.p12");
        KeyStore store = KeyStore.getInstance("PKCS12");
        store.load(null, null);
        try (OutputStream out = Files.newOutputStream(file)) {
            store.store(out, PASSWORD.toCharArray());
        }
        assertTrue(TlsSockets.socketFactory(withTrustStore(file.toString()), Map.of("ST_TRUST_PW", PASSWORD)::get)
                .isPresent());
    }

    @Test
    void unreadableTrustStoreIsNamedButItsPasswordIsNot(@TempDir Path dir) {
        String path = dir.resolve("missing.p12").toString();
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> TlsSockets.socketFactory(withTrustStore(path), Map.of("ST_TRUST_PW", PASSWORD)::get));
        assertTrue(e.getMessage().contains(path), e.getMessage());
        assertFalse(e.getMessage().contains(PASSWORD), e.getMessage());
    }
}
