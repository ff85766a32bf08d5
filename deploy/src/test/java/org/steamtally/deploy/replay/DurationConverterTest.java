package org.steamtally.deploy.replay;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.time.Duration;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;
import picocli.CommandLine.TypeConversionException;

class DurationConverterTest {

    @ParameterizedTest
    @CsvSource({"500ms, 500", "1s, 1000", "2min, 120000", "1h, 3600000", "PT0.25S, 250", "10 s, 10000"})
    void durationIsReadFromANumberAndAUnitOrIso8601(String text, long millis) {
        assertEquals(Duration.ofMillis(millis), new DurationConverter().convert(text));
    }

    @ParameterizedTest
    @ValueSource(strings = {"", "1", "1.5s", "s", "1 day", "-1s"})
    void textThatIsNotADurationIsRefused(String text) {
        assertThrows(TypeConversionException.class, () -> new DurationConverter().convert(text));
    }
}
