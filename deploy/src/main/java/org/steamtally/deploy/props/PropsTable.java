package org.steamtally.deploy.props;

import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.core.StreamWriteFeature;
import com.fasterxml.jackson.core.exc.StreamReadException;
import com.fasterxml.jackson.dataformat.csv.CsvFactory;
import com.fasterxml.jackson.dataformat.csv.CsvGenerator;
import com.fasterxml.jackson.dataformat.csv.CsvParser;
import java.io.IOException;
import java.io.InputStream;
import java.io.Writer;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.OptionalDouble;
import org.steamtally.calc.steam.SteamRangeException;
import org.steamtally.calc.steam.SteamState;

/**
 * Turns a CSV of input pairs into a CSV of states, streaming row by row.
 *
 * <p>The input has a header naming at least the two columns of the pair (other columns are ignored,
 * order is free). The output has the header {@link #OUTPUT_COLUMNS} and one row per input row in the
 * same order. A row that cannot be computed (wrong field count, a value that is not a number, a
 * state outside IAPWS-IF97) is written with its two input values as given, the other columns empty
 * and the reason in {@code error}; the following rows are still computed.
 *
 * <p>Numbers are written as the shortest decimal that reads back to the same double
 * ({@link ShortestDecimal}); x is empty for single-phase states, cp, cv and w are empty for two-phase
 * states, region is the IF97 region number (4 for two-phase).
 */
public final class PropsTable {

    /** The output header, in order. */
    public static final List<String> OUTPUT_COLUMNS =
            List.of("p", "T", "h", "s", "v", "u", "cp", "cv", "w", "x", "region", "error");

    /** Columns before {@code error}: where an input value is echoed, or a result written. */
    private static final int VALUE_COLUMNS = OUTPUT_COLUMNS.size() - 1;

    /**
     * Blank lines (often a trailing one) are not rows; spaces around unquoted values are not part of
     * them. The caller owns the streams, so neither side closes them.
     */
    private static final CsvFactory CSV = CsvFactory.builder()
            .enable(CsvParser.Feature.SKIP_EMPTY_LINES)
            .enable(CsvParser.Feature.TRIM_SPACES)
            .disable(StreamReadFeature.AUTO_CLOSE_SOURCE)
            .disable(StreamWriteFeature.AUTO_CLOSE_TARGET)
            .build();

    private final InputPair pair;
    private final UnitSystem units;
    private final int firstOutputColumn;
    private final int secondOutputColumn;

    /**
     * @param pair  the two quantities each input row gives
     * @param units the units of the input values and of the output columns
     */
    public PropsTable(InputPair pair, UnitSystem units) {
        this.pair = Objects.requireNonNull(pair, "pair");
        this.units = Objects.requireNonNull(units, "units");
        this.firstOutputColumn = OUTPUT_COLUMNS.indexOf(pair.first().column());
        this.secondOutputColumn = OUTPUT_COLUMNS.indexOf(pair.second().column());
    }

    /**
     * Reads every row of {@code input} and writes its state to {@code output}, flushing it at the
     * end. Neither stream is closed.
     *
     * @return how many rows were read, computed and failed
     * @throws PropsFileException if the input has no header, lacks a column of the pair, or is not
     *                            valid CSV (rows before the fault have been written)
     * @throws IOException        if reading or writing fails
     */
    public RowTally convert(InputStream input, Writer output) throws PropsFileException, IOException {
        try (CsvParser parser = (CsvParser) CSV.createParser(input);
             CsvGenerator generator = (CsvGenerator) CSV.createGenerator(output)) {
            List<String> header = readHeader(parser);
            int firstIndex = inputColumn(header, pair.first());
            int secondIndex = inputColumn(header, pair.second());
            writeHeader(generator);

            String[] fields = new String[header.size()];
            long read = 0;
            long failed = 0;
            long firstFailedLine = 0;
            while (parser.nextToken() == JsonToken.START_ARRAY) {
                long line = parser.currentLocation().getLineNr();
                int count = 0;
                while (parser.nextToken() == JsonToken.VALUE_STRING) {
                    if (count < fields.length) {
                        fields[count] = parser.getText();
                    }
                    count++;
                }
                read++;
                String first = firstIndex < count ? fields[firstIndex] : "";
                String second = secondIndex < count ? fields[secondIndex] : "";
                String error = count == fields.length
                        ? writeState(generator, first, second)
                        : "row has " + count + (count == 1 ? " field" : " fields") + ", header has " + fields.length;
                if (error != null) {
                    writeFailure(generator, first, second, error);
                    failed++;
                    if (firstFailedLine == 0) {
                        firstFailedLine = line;
                    }
                }
            }
            generator.flush();
            return new RowTally(read, read - failed, failed, firstFailedLine);
        } catch (StreamReadException e) {
            long line = e.getLocation() == null ? 0 : e.getLocation().getLineNr();
            throw new PropsFileException("input is not valid CSV near line " + line + ": " + e.getOriginalMessage());
        }
    }

    private List<String> readHeader(CsvParser parser) throws IOException, PropsFileException {
        if (parser.nextToken() != JsonToken.START_ARRAY) {
            throw new PropsFileException("input is empty: expected a header row naming the columns "
                    + pair.first().column() + " and " + pair.second().column());
        }
        List<String> header = new ArrayList<>();
        while (parser.nextToken() == JsonToken.VALUE_STRING) {
            header.add(parser.getText());
        }
        return header;
    }

    private int inputColumn(List<String> header, Quantity quantity) throws PropsFileException {
        int index = header.indexOf(quantity.column());
        if (index < 0) {
            throw new PropsFileException("input header has no column '" + quantity.column()
                    + "' needed by --given " + pair.label() + " (header found: " + String.join(",", header) + ")");
        }
        if (header.lastIndexOf(quantity.column()) != index) {
            throw new PropsFileException("input header names column '" + quantity.column()
                    + "' more than once (header found: " + String.join(",", header) + ")");
        }
        return index;
    }

    private static void writeHeader(CsvGenerator generator) throws IOException {
        generator.writeStartArray();
        for (String column : OUTPUT_COLUMNS) {
            generator.writeString(column);
        }
        generator.writeEndArray();
    }

    /** Writes the row for a good state and returns null, or writes nothing and returns why not. */
    private String writeState(CsvGenerator generator, String firstText, String secondText) throws IOException {
        SteamState state;
        try {
            double first = units.toSi(pair.first(), parse(pair.first(), firstText));
            double second = units.toSi(pair.second(), parse(pair.second(), secondText));
            state = pair.state(first, second);
        } catch (BadValueException | SteamRangeException e) {
            return e.getMessage();
        }
        generator.writeStartArray();
        writeNumber(generator, units.pressureFromSi(state.pressurePa()));
        writeNumber(generator, units.temperatureFromSi(state.temperatureK()));
        writeNumber(generator, units.specificEnergyFromSi(state.enthalpyJPerKg()));
        writeNumber(generator, units.specificEntropyFromSi(state.entropyJPerKgK()));
        writeNumber(generator, state.specificVolumeM3PerKg());
        writeNumber(generator, units.specificEnergyFromSi(state.internalEnergyJPerKg()));
        writeSpecificEntropy(generator, state.isobaricHeatCapacityJPerKgK());
        writeSpecificEntropy(generator, state.isochoricHeatCapacityJPerKgK());
        writeOptional(generator, state.speedOfSoundMPerS());
        writeOptional(generator, state.quality());
        generator.writeNumber(state.region().number());
        generator.writeString("");
        generator.writeEndArray();
        return null;
    }

    private void writeFailure(CsvGenerator generator, String firstText, String secondText, String error)
            throws IOException {
        generator.writeStartArray();
        for (int column = 0; column < VALUE_COLUMNS; column++) {
            if (column == firstOutputColumn) {
                generator.writeString(firstText);
            } else if (column == secondOutputColumn) {
                generator.writeString(secondText);
            } else {
                generator.writeString("");
            }
        }
        generator.writeString(error);
        generator.writeEndArray();
    }

    private void writeSpecificEntropy(CsvGenerator generator, OptionalDouble joulePerKilogramKelvin) throws IOException {
        if (joulePerKilogramKelvin.isPresent()) {
            writeNumber(generator, units.specificEntropyFromSi(joulePerKilogramKelvin.getAsDouble()));
        } else {
            generator.writeString("");
        }
    }

    private static void writeOptional(CsvGenerator generator, OptionalDouble value) throws IOException {
        if (value.isPresent()) {
            writeNumber(generator, value.getAsDouble());
        } else {
            generator.writeString("");
        }
    }

    /** Numbers never need quoting, so they go out as written, without the quoting scan. */
    private static void writeNumber(CsvGenerator generator, double value) throws IOException {
        generator.writeNumber(ShortestDecimal.format(value));
    }

    /**
     * A plain decimal or scientific number; names such as NaN or Infinity, hexadecimal and Java's
     * type suffixes (which {@link Double#parseDouble} would take) are refused, and so is a value too
     * large for a double.
     */
    private static double parse(Quantity quantity, String text) throws BadValueException {
        if (text.isEmpty()) {
            throw new BadValueException(quantity.column() + " is empty");
        }
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            boolean numeric = (c >= '0' && c <= '9') || c == '.' || c == '-' || c == '+' || c == 'e' || c == 'E';
            if (!numeric) {
                throw notANumber(quantity, text);
            }
        }
        double value;
        try {
            value = Double.parseDouble(text);
        } catch (NumberFormatException e) {
            throw notANumber(quantity, text);
        }
        if (!Double.isFinite(value)) {
            throw new BadValueException(quantity.column() + " = '" + text + "' is too large for a double");
        }
        return value;
    }

    private static BadValueException notANumber(Quantity quantity, String text) {
        return new BadValueException(quantity.column() + " = '" + text + "' is not a number");
    }

    /** A field of one row is not a usable number; only its message is used, so no stack trace. */
    private static final class BadValueException extends Exception {
        private static final long serialVersionUID = 1L;

        BadValueException(String message) {
            super(message, null, false, false);
        }
    }
}
