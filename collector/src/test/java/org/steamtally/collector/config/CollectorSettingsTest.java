package org.steamtally.collector.config;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CollectorSettingsTest {

    private static CollectorSettings.Builder base() {
        return CollectorSettings.builder(List.of("tcp://127.0.0.1:1883", "ssl://broker2.fernholm.example:8883"),
                "steamtally-fernholm-1");
    }

    @Test
    void defaultsAreMqtt5WithAPersistentSessionOfOneDay() {
        CollectorSettings s = base().build();
        assertEquals(MqttProtocol.MQTT_5, s.protocol());
        assertEquals(Duration.ofDays(1), s.sessionExpiry());
        assertEquals(Duration.ofSeconds(1), s.snapshotPeriod());
    }

    @Test
    void brokerUrlWithAnotherSchemeIsRefusedWithTheUrl() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> CollectorSettings.builder(List.of("http://127.0.0.1:1883"), "c").build());
        assertTrue(e.getMessage().contains("http://127.0.0.1:1883"), e.getMessage());
    }

    @Test
    void sharedSubscriptionNeedsMqtt5AndAPlainGroupName() {
        assertThrows(IllegalArgumentException.class,
                () -> base().protocol(MqttProtocol.MQTT_3_1_1).sharedGroup("plants").build());
        assertThrows(IllegalArgumentException.class, () -> base().sharedGroup("a/b").build());
        assertEquals("plants", base().sharedGroup("plants").build().sharedGroup().orElseThrow());
    }

    @Test
    void sessionExpiryBeyondWhatMqtt5CanSayIsRefused() {
        assertThrows(IllegalArgumentException.class,
                () -> base().sessionExpiry(Duration.ofSeconds(CollectorSettings.MAX_SESSION_EXPIRY_S + 1)).build());
    }

    @Test
    void printedSettingsNameWhereSecretsLiveButNotTheSecrets(@TempDir Path dir) throws IOException {
        Path file = dir.resolve("mqtt-password");
        Files.writeString(file, "s3cret-from-file\n", StandardCharsets.UTF_8);
        CollectorSettings s = base().username(SecretRef.env("ST_MQTT_USER")).password(SecretRef.file(file.toString()))
                .build();
        String printed = s.toString();
        assertTrue(printed.contains("env:ST_MQTT_USER"), printed);
        assertFalse(printed.contains("s3cret"), printed);
        assertArrayEquals("s3cret-from-file".toCharArray(), s.password().orElseThrow().resolve(v -> null),
                "one trailing line break is not part of the secret");
        assertArrayEquals("steam".toCharArray(),
                s.username().orElseThrow().resolve(Map.of("ST_MQTT_USER", "steam")::get));
    }

    @Test
    void missingSecretIsNamedByItsPlaceOnly() {
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> SecretRef.env("ST_MQTT_PASSWORD").resolve(v -> null));
        assertTrue(e.getMessage().contains("ST_MQTT_PASSWORD"), e.getMessage());
    }

    @Test
    void passwordWithoutUserNameIsRefused() {
        assertThrows(IllegalArgumentException.class, () -> base().password(SecretRef.env("P")).build());
    }
}
