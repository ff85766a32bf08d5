package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.collector.config.CollectorSettings;
import org.steamtally.collector.config.MqttProtocol;
import org.steamtally.collector.config.SecretRef;

class CollectorSectionReaderTest {

    private static Path example() {
        Path fromModule = Path.of("examples", "simple.yaml");
        return Files.exists(fromModule) ? fromModule : Path.of("deploy", "examples", "simple.yaml");
    }

    private static PlantDescription plant() throws Exception {
        return PlantDescriptionLoader.load(example());
    }

    private static final String FULL = """
            site: {id: fernholm, atmospheric_pressure: {value: 100.8, unit: kPa}}
            collector:
              brokers: [tcp://broker1.fernholm.example:1883, tcp://broker2.fernholm.example:1883]
              protocol: "3.1.1"
              client_id: steamtally-fernholm-1
              username: {env: ST_MQTT_USER}
              password: {file: /run/secrets/mqtt-password}
              tls: {trust_store: /etc/steamtally/trust.p12, trust_store_password: {env: ST_TRUST_PW}}
              session_expiry: 2h
              topic_template: "{site}/{unit}/{sensor}"
              max_payload_bytes: 8192
              max_future_skew: 2s
              max_past_age: 6h
              snapshot_period: 500ms
              allowed_lateness: 1s
              dead_letter_topic: steamtally/deadletter
              down_alarm_after: 1min
              reconnect: {min: 200ms, max: 1min}
              queue: {messages: 10000, bytes: 8388608}
              barometer: PT-301
            """;

    @Test
    void everyKeyOfTheSectionIsRead() throws Exception {
        CollectorSettings s = CollectorSectionReader.parse("f.yaml", FULL, Optional.empty()).orElseThrow();
        assertAll(
                () -> assertEquals(List.of("tcp://broker1.fernholm.example:1883", "tcp://broker2.fernholm.example:1883"),
                        s.brokerUrls()),
                () -> assertEquals(MqttProtocol.MQTT_3_1_1, s.protocol()),
                () -> assertEquals("steamtally-fernholm-1", s.clientId()),
                () -> assertEquals(Optional.of(SecretRef.env("ST_MQTT_USER")), s.username()),
                () -> assertEquals(Optional.of(SecretRef.file("/run/secrets/mqtt-password")), s.password()),
                () -> assertEquals(Optional.of("/etc/steamtally/trust.p12"), s.trustStorePath()),
                () -> assertEquals(Duration.ofHours(2), s.sessionExpiry()),
                () -> assertEquals(Optional.of("{site}/{unit}/{sensor}"), s.topicTemplate()),
                () -> assertEquals(8192, s.maxPayloadBytes()),
                () -> assertEquals(Duration.ofSeconds(2), s.maxFutureSkew()),
                () -> assertEquals(Duration.ofHours(6), s.maxPastAge()),
                () -> assertEquals(Duration.ofMillis(500), s.snapshotPeriod()),
                () -> assertEquals(Duration.ofSeconds(1), s.allowedLateness()),
                () -> assertEquals(Optional.of("steamtally/deadletter"), s.deadLetterTopic()),
                () -> assertEquals(Duration.ofMinutes(1), s.downAlarmAfter()),
                () -> assertEquals(Duration.ofMillis(200), s.reconnectMin()),
                () -> assertEquals(10_000, s.queueMessages()),
                () -> assertEquals(Optional.of("PT-301"), s.barometer()));
    }

    @Test
    void fileWithoutTheSectionHasNoSettings() throws Exception {
        assertEquals(Optional.empty(), CollectorSectionReader.load(example(), plant()));
    }

    @Test
    void passwordWrittenInClearIsRefusedAtItsLineWithoutRepeatingIt() {
        String yaml = """
                site: {id: fernholm}
                collector:
                  brokers: [tcp://127.0.0.1:1883]
                  client_id: c1
                  username: {env: U}
                  password: hunter2-steam
                """;
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> CollectorSectionReader.parse("f.yaml", yaml, Optional.empty()));
        assertEquals(1, e.problems().size(), e.getMessage());
        ConfigProblem p = e.problems().get(0);
        assertAll(
                () -> assertEquals(6, p.line()),
                () -> assertTrue(p.message().contains("{env: VARIABLE} or {file: PATH}"), p.message()),
                () -> assertFalse(e.getMessage().contains("hunter2"), e.getMessage()));
    }

    @Test
    void everyProblemOfTheSectionIsListedWithItsLine() {
        String yaml = """
                site: {id: fernholm}
                collector:
                  brokers: [http://127.0.0.1:1883]
                  protocol: "4"
                  client_id: c1
                  snapshot_period: fast
                  colour: blue
                """;
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> CollectorSectionReader.parse("f.yaml", yaml, Optional.empty()));
        List<Integer> lines = e.problems().stream().map(ConfigProblem::line).toList();
        assertEquals(List.of(3, 4, 6, 7), lines, e.getMessage());
        assertTrue(e.getMessage().contains("f.yaml:7:3: unknown key \"colour\""), e.getMessage());
    }

    @Test
    void missingBrokersAndClientIdAreNamed() {
        String yaml = """
                site: {id: fernholm}
                collector:
                  protocol: "5"
                """;
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> CollectorSectionReader.parse("f.yaml", yaml, Optional.empty()));
        assertTrue(e.getMessage().contains("\"brokers\"") && e.getMessage().contains("\"client_id\""),
                e.getMessage());
    }

    @Test
    void templateAndBarometerAreCheckedAgainstThePlantsSensors() throws Exception {
        String yaml = """
                collector:
                  brokers: [tcp://127.0.0.1:1883]
                  client_id: c1
                  topic_template: "{site}/{tag}"
                  barometer: TT-101
                """;
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> CollectorSectionReader.parse("f.yaml", yaml, Optional.of(plant())));
        assertEquals(List.of(4, 5), e.problems().stream().map(ConfigProblem::line).toList(), e.getMessage());
    }

    @Test
    void sharedGroupWithMqtt311IsRefused() {
        String yaml = """
                collector:
                  brokers: [tcp://127.0.0.1:1883]
                  protocol: "3.1.1"
                  client_id: c1
                  shared_group: plants
                """;
        PlantDescriptionException e = assertThrows(PlantDescriptionException.class,
                () -> CollectorSectionReader.parse("f.yaml", yaml, Optional.empty()));
        assertTrue(e.getMessage().contains("shared subscriptions need MQTT 5"), e.getMessage());
    }

    @Test
    void plantDescriptionLoaderStillAcceptsAFileWithTheSection() throws Exception {
        String text = Files.readString(example()) + "\n" + FULL.lines().skip(1)
                .reduce("", (a, b) -> a + b + "\n");
        PlantDescription plant = PlantDescriptionLoader.parse("f.yaml", text);
        assertTrue(CollectorSectionReader.parse("f.yaml", text, Optional.of(plant)).isPresent());
    }
}
