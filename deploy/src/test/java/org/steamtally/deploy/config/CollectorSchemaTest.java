package org.steamtally.deploy.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLMapper;
import com.networknt.schema.Error;
import com.networknt.schema.Schema;
import com.networknt.schema.SchemaRegistry;
import com.networknt.schema.SpecificationVersion;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The schema's {@code collector} section accepts what the reader accepts and refuses secrets in clear. */
class CollectorSchemaTest {

    private static final String SECTION = """
            collector:
              brokers: [tcp://127.0.0.1:1883]
              protocol: "5"
              client_id: steamtally-fernholm-1
              username: {env: ST_MQTT_USER}
              password: {file: /run/secrets/mqtt-password}
              session_expiry: 1d
              shared_group: fernholm
              topic_template: "{site}/{unit}/{sensor}"
              snapshot_period: 1s
              reconnect: {min: 100ms, max: 30s}
            """;

    private static List<Error> validate(String yaml) throws Exception {
        Path fromModule = Path.of("..", "docs", "plant-description.schema.json");
        Path schemaFile = Files.exists(fromModule) ? fromModule : Path.of("docs", "plant-description.schema.json");
        Schema schema = SchemaRegistry.withDefaultDialect(SpecificationVersion.DRAFT_2020_12)
                .getSchema(new ObjectMapper().readTree(schemaFile.toFile()));
        return schema.validate(new YAMLMapper().readTree(yaml));
    }

    private static String minimal() throws Exception {
        return Files.readString(Path.of(CollectorSchemaTest.class.getResource("valid-minimal.yaml").toURI()));
    }

    @Test
    void collectorSectionSatisfiesTheSchema() throws Exception {
        assertEquals(List.of(), validate(minimal() + "\n" + SECTION));
    }

    @Test
    void passwordInClearFailsTheSchema() throws Exception {
        assertFalse(validate(minimal() + "\n" + SECTION.replace("{file: /run/secrets/mqtt-password}", "hunter2"))
                .isEmpty());
    }

    @Test
    void unknownCollectorKeyFailsTheSchema() throws Exception {
        assertFalse(validate(minimal() + "\n" + SECTION + "  colour: blue\n").isEmpty());
    }
}
