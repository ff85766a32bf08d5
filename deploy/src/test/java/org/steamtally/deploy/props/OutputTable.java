package org.steamtally.deploy.props;

import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.dataformat.csv.CsvFactory;
import com.fasterxml.jackson.dataformat.csv.CsvParser;
import java.io.IOException;
import java.io.StringReader;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;

/** A {@code props} output read back with a CSV parser, so quoting is undone as any reader would. */
record OutputTable(List<String> header, List<List<String>> rows) {

    static OutputTable parse(String csv) {
        List<List<String>> lines = new ArrayList<>();
        try (CsvParser parser = (CsvParser) new CsvFactory().createParser(new StringReader(csv))) {
            while (parser.nextToken() == JsonToken.START_ARRAY) {
                List<String> fields = new ArrayList<>();
                while (parser.nextToken() == JsonToken.VALUE_STRING) {
                    fields.add(parser.getText());
                }
                lines.add(fields);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        OutputTable table = new OutputTable(lines.get(0), lines.subList(1, lines.size()));
        for (List<String> row : table.rows) {
            assertEquals(table.header.size(), row.size(), "every output row has one field per header column: " + row);
        }
        return table;
    }

    String get(int row, String column) {
        return rows.get(row).get(header.indexOf(column));
    }

    double number(int row, String column) {
        return Double.parseDouble(get(row, column));
    }
}
