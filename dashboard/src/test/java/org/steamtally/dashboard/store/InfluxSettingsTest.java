package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Where the InfluxDB store's settings come from. */
class InfluxSettingsTest {

    @TempDir
    Path dir;

    @Test
    void environmentGivesUrlDatabasePolicyAndPasswordFromAFile() throws Exception {
        Path secret = dir.resolve("influx.secret");
        Files.writeString(secret, "s3cret\n");
        InfluxSettings s = InfluxSettings.fromEnvironment(Map.of(
                InfluxSettings.URL, "http://influx.example:8086/",
                InfluxSettings.DATABASE, "plant",
                InfluxSettings.RETENTION_POLICY, "one_year",
                InfluxSettings.USER, "writer",
                InfluxSettings.PASSWORD_FILE, secret.toString()));
        assertEquals("http://influx.example:8086", s.url());
        assertEquals("plant", s.database());
        assertEquals("one_year", s.retentionPolicy());
        assertEquals("writer", s.username());
        assertEquals("s3cret", s.password());
        assertFalse(s.createDatabase());
        assertFalse(s.toString().contains("s3cret"), "the password is not printed");
    }

    @Test
    void aPropertiesFileGivesTheSameSettings() throws Exception {
        Files.writeString(dir.resolve("pw"), "pw1");
        Path file = dir.resolve("influx.properties");
        Files.writeString(file, "url=https://influx.example\nuser=u\npassword_file=pw\ncreate_database=true\n");
        InfluxSettings s = InfluxSettings.fromFile(file);
        assertEquals(InfluxSettings.DEFAULT_DATABASE, s.database());
        assertEquals("", s.retentionPolicy(), "the database's default policy");
        assertEquals("pw1", s.password());
        assertTrue(s.createDatabase());
    }

    @Test
    void aMissingUrlNamesTheVariable() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> InfluxSettings.fromEnvironment(Map.of()));
        assertTrue(e.getMessage().contains(InfluxSettings.URL), e.getMessage());
    }
}
