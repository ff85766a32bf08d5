package org.steamtally.deploy.replay;

import java.time.Duration;
import java.time.format.DateTimeParseException;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/**
 * Reads a duration option: a whole number and a unit, {@code 500ms}, {@code 1s}, {@code 2min},
 * {@code 1h}, or an ISO-8601 duration such as {@code PT0.5S}.
 */
public final class DurationConverter implements ITypeConverter<Duration> {

    private static final Pattern NUMBER_AND_UNIT = Pattern.compile("(\\d{1,9})\\s*(ms|s|min|h)");

    @Override
    public Duration convert(String text) {
        String trimmed = text.strip().toLowerCase(Locale.ROOT);
        Matcher m = NUMBER_AND_UNIT.matcher(trimmed);
        if (m.matches()) {
            long n = Long.parseLong(m.group(1));
            switch (m.group(2)) {
                case "ms":
                    return Duration.ofMillis(n);
                case "s":
                    return Duration.ofSeconds(n);
                case "min":
                    return Duration.ofMinutes(n);
                default:
                    return Duration.ofHours(n);
            }
        }
        try {
            return Duration.parse(text.strip());
        } catch (DateTimeParseException e) {
            throw new TypeConversionException("'" + text + "' is not a duration; write e.g. 500ms, 1s, 2min, 1h or PT0.5S");
        }
    }
}
