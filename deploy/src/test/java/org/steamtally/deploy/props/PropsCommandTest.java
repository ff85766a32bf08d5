package org.steamtally.deploy.props;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;
import org.steamtally.deploy.CommandRun;
import org.steamtally.deploy.Launcher;

/**
 * The CSV contract of {@code steamtally props}. None of these checks depends on the property values
 * themselves, only on how rows, columns, units and failures are carried.
 */
class PropsCommandTest {

    private static final String HEADER = "p,T,h,s,v,u,cp,cv,w,x,region,error";

    private static CommandRun props(String stdin, String... options) {
        String[] args = new String[options.length + 3];
        args[0] = "props";
        args[1] = "--in";
        args[2] = "-";
        System.arraycopy(options, 0, args, 3, options.length);
        return CommandRun.of(stdin, args);
    }

    @Test
    void outputHeaderIsFixedAndEndsWithTheErrorColumn() {
        CommandRun run = props("p,T\n1.0E5,300\n", "--given", "p,T");
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertTrue(run.out().startsWith(HEADER + "\n"), run.out()),
                () -> assertEquals(List.of(HEADER.split(",")), PropsTable.OUTPUT_COLUMNS));
    }

    @Test
    void rowsComeOutInInputOrderWithTheGivenPressureAndTemperatureUnchanged() {
        double[] pressures = {1.0E5, 3.7E6, 16.6E6, 7.2E3, 100000.1};
        double[] temperatures = {300.0, 809.15, 811.15, 290.0, 400.0};
        StringBuilder input = new StringBuilder("p,T\n");
        for (int i = 0; i < pressures.length; i++) {
            input.append(pressures[i]).append(',').append(temperatures[i]).append('\n');
        }
        OutputTable table = OutputTable.parse(props(input.toString(), "--given", "p,T").out());
        assertEquals(pressures.length, table.rows().size());
        for (int i = 0; i < pressures.length; i++) {
            assertEquals(pressures[i], table.number(i, "p"), "row " + i + " p reads back as the same double");
            assertEquals(temperatures[i], table.number(i, "T"), "row " + i + " T reads back as the same double");
        }
    }

    @Test
    void extraInputColumnsAreIgnoredAndColumnOrderIsFree() {
        CommandRun run = props("tag,T,p,note\nMS-1,811.15,16.6E6,main steam\n", "--given", "p,T");
        OutputTable table = OutputTable.parse(run.out());
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertEquals(PropsTable.OUTPUT_COLUMNS, table.header()),
                () -> assertEquals(16.6E6, table.number(0, "p")),
                () -> assertEquals(811.15, table.number(0, "T")));
    }

    @Test
    void singlePhaseRowHasNoQualityButHasHeatCapacitiesAndSpeedOfSound() {
        OutputTable table = OutputTable.parse(props("p,T\n1.0E5,300\n", "--given", "p,T").out());
        assertAll(
                () -> assertEquals("", table.get(0, "x")),
                () -> assertFalse(table.get(0, "cp").isEmpty()),
                () -> assertFalse(table.get(0, "cv").isEmpty()),
                () -> assertFalse(table.get(0, "w").isEmpty()),
                () -> assertTrue(List.of("1", "2", "3", "5").contains(table.get(0, "region")), table.get(0, "region")),
                () -> assertEquals("", table.get(0, "error")));
    }

    @Test
    void twoPhaseRowHasQualityAndRegionFourButNoHeatCapacitiesOrSpeedOfSound() {
        OutputTable table = OutputTable.parse(props("p,x\n1.0E5,0.25\n", "--given", "p,x").out());
        assertAll(
                () -> assertEquals(0.25, table.number(0, "x")),
                () -> assertEquals("", table.get(0, "cp")),
                () -> assertEquals("", table.get(0, "cv")),
                () -> assertEquals("", table.get(0, "w")),
                () -> assertEquals("4", table.get(0, "region")),
                () -> assertEquals("", table.get(0, "error")));
    }

    @Test
    void badNumberFailsOnlyItsRowAndKeepsItsInputs() {
        CommandRun run = props("p,T\n1.0E5,300\n1.0E5,warm\n2.0E5,310\n", "--given", "p,T");
        OutputTable table = OutputTable.parse(run.out());
        assertAll(
                () -> assertEquals(Launcher.EXIT_PARTIAL_FAILURE, run.status()),
                () -> assertEquals(3, table.rows().size()),
                () -> assertEquals("", table.get(0, "error")),
                () -> assertEquals("1.0E5", table.get(1, "p")),
                () -> assertEquals("warm", table.get(1, "T")),
                () -> assertEquals("", table.get(1, "h")),
                () -> assertEquals("", table.get(1, "region")),
                () -> assertEquals("T = 'warm' is not a number", table.get(1, "error")),
                () -> assertEquals(2.0E5, table.number(2, "p")),
                () -> assertEquals("", table.get(2, "error")));
    }

    @ParameterizedTest
    @ValueSource(strings = {"NaN", "Infinity", "-Infinity", "0x1p8", "300d", "300f", "1e999", "3 00", "--300"})
    void valuesThatAreNotPlainFiniteNumbersFailTheirRow(String value) {
        CommandRun run = props("p,T\n1.0E5,\"" + value + "\"\n", "--given", "p,T");
        OutputTable table = OutputTable.parse(run.out());
        assertAll(
                () -> assertEquals(Launcher.EXIT_PARTIAL_FAILURE, run.status()),
                () -> assertEquals(value, table.get(0, "T")),
                () -> assertTrue(table.get(0, "error").startsWith("T = '" + value + "'"), table.get(0, "error")));
    }

    @Test
    void emptyValueFailsItsRow() {
        OutputTable table = OutputTable.parse(props("p,T\n1.0E5,\n", "--given", "p,T").out());
        assertEquals("T is empty", table.get(0, "error"));
    }

    @Test
    void wrongFieldCountFailsOnlyItsRow() {
        CommandRun run = props("p,T\n1.0E5\n1.0E5,300,7\n1.0E5,300\n", "--given", "p,T");
        OutputTable table = OutputTable.parse(run.out());
        assertAll(
                () -> assertEquals(Launcher.EXIT_PARTIAL_FAILURE, run.status()),
                () -> assertEquals("1.0E5", table.get(0, "p")),
                () -> assertEquals("", table.get(0, "T")),
                () -> assertEquals("row has 1 field, header has 2", table.get(0, "error")),
                () -> assertEquals("300", table.get(1, "T")),
                () -> assertEquals("row has 3 fields, header has 2", table.get(1, "error")),
                () -> assertEquals("", table.get(2, "error")));
    }

    @Test
    void stateOutsideIf97FailsItsRowWithTheRangeMessage() {
        // 5000 K is above the IAPWS-IF97 upper limit of 2273.15 K (IAPWS R7-97(2012), Figure 1).
        CommandRun run = props("p,T\n1.0E5,5000\n", "--given", "p,T");
        OutputTable table = OutputTable.parse(run.out());
        assertAll(
                () -> assertEquals(Launcher.EXIT_PARTIAL_FAILURE, run.status()),
                () -> assertTrue(table.get(0, "error").contains("T = 5000.0 K"), table.get(0, "error")),
                () -> assertEquals("5000", table.get(0, "T")));
    }

    @Test
    void inputsAndMessagesWithCommasOrQuotesAreQuotedSoEveryRowKeepsItsColumns() {
        CommandRun run = props("p,T\n\"1,5\",\"say \"\"hot\"\"\"\n", "--given", "p,T");
        OutputTable table = OutputTable.parse(run.out());
        assertAll(
                () -> assertEquals("1,5", table.get(0, "p")),
                () -> assertEquals("say \"hot\"", table.get(0, "T")),
                () -> assertEquals("p = '1,5' is not a number", table.get(0, "error")));
    }

    @Test
    void summaryOnStandardErrorCountsReadGoodAndFailedRows() {
        CommandRun run = props("p,T\n1.0E5,300\n1.0E5,x\n1.0E5,301\n", "--given", "p,T");
        assertEquals("steamtally props: read 3 rows: 2 good, 1 failed (first on input line 3)"
                + System.lineSeparator(), run.err());
    }

    @Test
    void allGoodRowsExitZeroWithASummary() {
        CommandRun run = props("p,T\n1.0E5,300\n", "--given", "p,T");
        assertAll(
                () -> assertEquals(0, run.status()),
                () -> assertEquals("steamtally props: read 1 row: 1 good, 0 failed" + System.lineSeparator(), run.err()));
    }

    @Test
    void blankLinesAreNotRowsButLineNumbersStillCountThem() {
        CommandRun run = props("p,T\n\n1.0E5,300\n   \n1.0E5,x\n\n", "--given", "p,T");
        assertAll(
                () -> assertEquals(2, OutputTable.parse(run.out()).rows().size()),
                () -> assertTrue(run.err().contains("read 2 rows: 1 good, 1 failed (first on input line 5)"), run.err()));
    }

    @Test
    void headerOnlyInputGivesHeaderOnlyOutput() {
        CommandRun run = props("p,T\n", "--given", "p,T");
        assertAll(
                () -> assertEquals(0, run.status()),
                () -> assertEquals(HEADER + "\n", run.out()),
                () -> assertTrue(run.err().contains("read 0 rows"), run.err()));
    }

    @Test
    void emptyInputIsAUsageError() {
        CommandRun run = props("", "--given", "p,T");
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("input is empty"), run.err()));
    }

    @Test
    void missingColumnIsAUsageErrorNamingTheColumnAndTheHeaderFound() {
        CommandRun run = props("p,t,h\n1.0E5,300,1\n", "--given", "p,T");
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertEquals("", run.out()),
                () -> assertTrue(run.err().contains("no column 'T'"), run.err()),
                () -> assertTrue(run.err().contains("header found: p,t,h"), run.err()),
                () -> assertNoStackTrace(run));
    }

    @Test
    void repeatedColumnOfThePairIsAUsageError() {
        CommandRun run = props("p,T,p\n1,2,3\n", "--given", "p,T");
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("'p' more than once"), run.err()));
    }

    @Test
    void malformedCsvIsAUsageErrorAfterTheRowsBeforeIt() {
        CommandRun run = props("p,T\n1.0E5,300\n\"1.0E5,300\n", "--given", "p,T");
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("not valid CSV"), run.err()),
                () -> assertNoStackTrace(run));
    }

    @Test
    void unknownPairIsAUsageErrorListingEveryPair() {
        CommandRun run = props("p,T\n", "--given", "p,q");
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("unknown pair 'p,q'"), run.err()),
                () -> new InputPair.Labels().forEach(label -> assertTrue(run.err().contains(label), run.err())),
                () -> assertNoStackTrace(run));
    }

    @Test
    void unknownUnitsAreAUsageError() {
        CommandRun run = props("p,T\n", "--given", "p,T", "--units", "imperial");
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("unknown units 'imperial'"), run.err()));
    }

    @Test
    void missingInputFileIsAUsageErrorWithoutStackTrace(@TempDir Path dir) {
        String missing = dir.resolve("absent.csv").toString();
        CommandRun run = CommandRun.of(new String[] {"props", "--given", "p,T", "--in", missing});
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertEquals("", run.out()),
                () -> assertTrue(run.err().contains("cannot read input file '" + missing + "': no such file"), run.err()),
                () -> assertNoStackTrace(run));
    }

    @Test
    void missingRequiredOptionIsAUsageError() {
        CommandRun run = CommandRun.of(new String[] {"props", "--in", "-"});
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("--given"), run.err()));
    }

    @Test
    void outFileReceivesTheTableAndStandardOutputStaysEmpty(@TempDir Path dir) throws IOException {
        Path in = dir.resolve("in.csv");
        Path out = dir.resolve("out.csv");
        Files.writeString(in, "p,T\n1.0E5,300\n", StandardCharsets.UTF_8);
        CommandRun run = CommandRun.of(new String[] {
                "props", "--given", "p,T", "--in", in.toString(), "--out", out.toString()});
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertEquals("", run.out()),
                () -> assertEquals(1, OutputTable.parse(Files.readString(out, StandardCharsets.UTF_8)).rows().size()));
    }

    @Test
    void outFileThatIsTheInputFileIsRefusedAndLeftIntact(@TempDir Path dir) throws IOException {
        Path in = dir.resolve("in.csv");
        Files.writeString(in, "p,T\n1.0E5,300\n", StandardCharsets.UTF_8);
        CommandRun run = CommandRun.of(new String[] {
                "props", "--given", "p,T", "--in", in.toString(), "--out", in.toString()});
        assertAll(
                () -> assertEquals(Launcher.EXIT_USAGE, run.status()),
                () -> assertTrue(run.err().contains("would be emptied"), run.err()),
                () -> assertEquals("p,T\n1.0E5,300\n", Files.readString(in, StandardCharsets.UTF_8)));
    }

    /**
     * The same states given in SI and in engineering units: every engineering output is the SI
     * output put through the named conversion. The SI input is the engineering input converted the
     * same way, so both runs compute from bit-identical SI values and equality is exact.
     */
    @ParameterizedTest
    @CsvSource({
            "p,T, 100, 150",
            "p,T, 16600, 538",
            "p,h, 100, 2700",
            "p,s, 100, 7.0",
            "h,s, 3000, 7.5",
            "p,x, 100, 0.5",
            "T,x, 100, 0.25"})
    void engineeringOutputIsTheSiOutputConvertedExactly(String first, String second, double a, double b) {
        InputPair pair = InputPair.fromLabel(first + "," + second);
        String header = pair.label() + "\n";
        String engineeringInput = header + a + "," + b + "\n";
        String siInput = header + ShortestDecimal.format(UnitSystem.ENGINEERING.toSi(pair.first(), a)) + ","
                + ShortestDecimal.format(UnitSystem.ENGINEERING.toSi(pair.second(), b)) + "\n";
        CommandRun si = props(siInput, "--given", pair.label());
        CommandRun engineering = props(engineeringInput, "--given", pair.label(), "--units", "engineering");
        assertEquals(0, si.status(), si.out());
        assertEquals(0, engineering.status(), engineering.out());
        OutputTable s = OutputTable.parse(si.out());
        OutputTable e = OutputTable.parse(engineering.out());
        assertAll(
                () -> assertConverted(s, e, "p", v -> v / 1e3),
                () -> assertConverted(s, e, "T", v -> v - 273.15),
                () -> assertConverted(s, e, "h", v -> v / 1e3),
                () -> assertConverted(s, e, "s", v -> v / 1e3),
                () -> assertConverted(s, e, "v", DoubleUnaryOperator.identity()),
                () -> assertConverted(s, e, "u", v -> v / 1e3),
                () -> assertConverted(s, e, "cp", v -> v / 1e3),
                () -> assertConverted(s, e, "cv", v -> v / 1e3),
                () -> assertConverted(s, e, "w", DoubleUnaryOperator.identity()),
                () -> assertConverted(s, e, "x", DoubleUnaryOperator.identity()),
                () -> assertEquals(s.get(0, "region"), e.get(0, "region")));
    }

    private static void assertConverted(OutputTable si, OutputTable engineering, String column,
                                        DoubleUnaryOperator fromSi) {
        String siText = si.get(0, column);
        String engineeringText = engineering.get(0, column);
        if (siText.isEmpty()) {
            assertEquals("", engineeringText, column + " is empty in both unit systems");
        } else {
            assertEquals(fromSi.applyAsDouble(Double.parseDouble(siText)), Double.parseDouble(engineeringText), column);
        }
    }

    @Test
    void engineeringRangeMessagesQuoteTheSiValue() {
        // 2100 °C = 2373.15 K, above the IAPWS-IF97 upper limit of 2273.15 K (IAPWS R7-97(2012), Figure 1).
        OutputTable table = OutputTable.parse(props("p,T\n100,2100\n", "--given", "p,T", "--units", "engineering").out());
        assertAll(
                () -> assertEquals("2100", table.get(0, "T")),
                () -> assertTrue(table.get(0, "error").contains(" K "), table.get(0, "error")));
    }

    @Test
    void shippedExampleComputesEveryRow() {
        CommandRun run = CommandRun.of(new String[] {"props", "--given", "p,T", "--in", "examples/props-pT.csv"});
        OutputTable table = OutputTable.parse(run.out());
        assertAll(
                () -> assertEquals(0, run.status(), run.err()),
                () -> assertEquals(7, table.rows().size()),
                () -> {
                    for (int row = 0; row < table.rows().size(); row++) {
                        assertEquals("", table.get(row, "error"), "row " + row);
                    }
                },
                () -> assertTrue(run.err().contains("read 7 rows: 7 good, 0 failed"), run.err()));
    }

    @Test
    void shippedExampleWithAnErrorComputesEveryRowButItsOneBadRow() {
        CommandRun run = CommandRun.of(new String[] {"props", "--given", "p,T", "--in",
                "examples/props-pT-with-error.csv"});
        OutputTable table = OutputTable.parse(run.out());
        int last = table.rows().size() - 1;
        assertAll(
                () -> assertEquals(Launcher.EXIT_PARTIAL_FAILURE, run.status()),
                () -> assertEquals(7, table.rows().size()),
                () -> {
                    for (int row = 0; row < last; row++) {
                        assertEquals("", table.get(row, "error"), "row " + row);
                    }
                },
                () -> assertFalse(table.get(last, "error").isEmpty()),
                () -> assertTrue(run.err().contains("read 7 rows: 6 good, 1 failed"), run.err()));
    }

    @Test
    void helpNamesEveryPairAndBothUnitSystems() {
        CommandRun run = CommandRun.of(new String[] {"props", "--help"});
        assertAll(
                () -> assertEquals(0, run.status()),
                () -> new InputPair.Labels().forEach(label -> assertTrue(run.out().contains(label), label)),
                () -> new UnitSystem.OptionValues().forEach(units -> assertTrue(run.out().contains(units), units)));
    }

    private static void assertNoStackTrace(CommandRun run) {
        assertFalse(run.err().contains("\tat "), run.err());
        assertFalse(run.err().contains("Exception"), run.err());
    }
}
