package org.steamtally.dashboard.json;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.steamtally.calc.cycle.ComponentResult;
import org.steamtally.calc.cycle.CycleResult;
import org.steamtally.calc.cycle.MetricsBasis;
import org.steamtally.calc.cycle.UnitResult;

class ResultJsonTest {

    static String resource(String name) throws IOException {
        try (InputStream in = ResultJsonTest.class.getResourceAsStream(name)) {
            if (in == null) {
                throw new IOException("missing test resource " + name);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
    }

    @Test
    void handBuiltRecordWritesExactlyTheCommittedJson() throws IOException {
        String golden = resource("unit2-result.jsonl").strip();
        assertEquals(golden, ResultJson.write(ResultFixture.unit2()));
    }

    @Test
    void aWindowVerdictIsWrittenLastAndReadBackAndARecordWithoutOneHasNoKey() {
        UnitResult plain = ResultFixture.unit2();
        assertFalse(ResultJson.write(plain).contains("window_reconciliation"));
        UnitResult withWindow = plain.withWindowReconciliation(new org.steamtally.calc.cycle.WindowReconciliation(
                50.0, 50, 12, "failed", 61.2, ResultFixture.of(11.07), 5, plain.reconciliation().suspects()));
        String json = ResultJson.write(withWindow);
        assertTrue(json.endsWith("\"window_reconciliation\":{\"length_s\":50.0,\"length\":50,\"samples\":12,"
                + "\"status\":\"failed\",\"passed\":false,\"chi2\":61.2,\"chi2_limit\":11.07,\"redundancy\":5,"
                + "\"suspects\":[{\"rank\":1,\"id\":\"FT-101\",\"unit\":\"kg/s\",\"equivalence_set\":[\"FT-101\",\"JT-001\"],"
                + "\"test_value\":3.2,\"bias\":2.1,\"sigma_bias\":0.61,\"confirmed\":true}]}}"), json);
        assertEquals(withWindow, ResultJson.read(json));
        String inconsistent = json.replace("\"status\":\"failed\",\"passed\":false,\"chi2\":61.2",
                "\"status\":\"failed\",\"passed\":true,\"chi2\":61.2");
        ResultFormatException e = assertThrows(ResultFormatException.class, () -> ResultJson.read(inconsistent));
        assertTrue(e.getMessage().contains("window_reconciliation: passed must be true exactly when status is passed"),
                e.getMessage());
    }

    @Test
    void aWithheldWindowVerdictWritesItsReasonLastAndReadsBack() {
        UnitResult plain = ResultFixture.unit2();
        UnitResult withheld = plain.withWindowReconciliation(org.steamtally.calc.cycle.WindowReconciliation.withheld(
                50.0, 50, 50, "good values in only part of the window's 50 periods, fewer than the 45 needed (90 %):"
                        + " FT-101 (25)"));
        String json = ResultJson.write(withheld);
        assertTrue(json.endsWith("\"window_reconciliation\":{\"length_s\":50.0,\"length\":50,\"samples\":50,"
                + "\"status\":\"withheld\",\"passed\":false,\"chi2\":0.0,\"chi2_limit\":null,\"redundancy\":0,"
                + "\"suspects\":[],\"reason\":\"good values in only part of the window's 50 periods, fewer than the 45"
                + " needed (90 %): FT-101 (25)\"}}"), json);
        assertEquals(withheld, ResultJson.read(json));
        String noReason = json.substring(0, json.lastIndexOf(",\"reason\"")) + "}}";
        ResultFormatException e = assertThrows(ResultFormatException.class, () -> ResultJson.read(noReason));
        assertTrue(e.getMessage().contains("a withheld verdict must say why"), e.getMessage());
    }

    @Test
    void recordReadsBackEqualToTheOneWritten() {
        UnitResult written = ResultFixture.unit2();
        assertEquals(written, ResultJson.read(ResultJson.write(written)));
    }

    @Test
    void emptyValuesAreNullAndReadBackEmpty() {
        UnitResult empty = ResultFixture.allEmpty();
        String json = ResultJson.write(empty);
        assertAll(
                () -> assertTrue(json.contains("\"p_Pa\":null"), json),
                () -> assertTrue(json.contains("\"phase\":null"), json),
                () -> assertTrue(json.contains("\"thermal_efficiency\":null"), json),
                () -> assertTrue(json.contains("\"closure\":[]"), json),
                () -> assertFalse(json.contains("NaN"), json),
                () -> assertEquals(empty, ResultJson.read(json)));
    }

    @Test
    void reconciliationAndSuspectsAreWrittenAfterTheClosureAndReadBack() {
        String json = ResultJson.write(ResultFixture.unit2());
        assertAll(
                () -> assertTrue(json.contains("\"metrics_basis\":\"raw_excluding_suspects\",\"cycle_raw\":{"), json),
                () -> assertTrue(json.contains("\"reconciliation\":{\"status\":\"failed\",\"passed\":false,"
                        + "\"chi2\":12.3,\"chi2_limit\":7.815,\"redundancy\":3"), json),
                () -> assertTrue(json.contains("\"suspects\":[{\"rank\":1,\"id\":\"FT-101\",\"unit\":\"kg/s\","
                        + "\"equivalence_set\":[\"FT-101\",\"JT-001\"]"), json),
                () -> assertTrue(json.indexOf("\"reconciliation\"") > json.indexOf("\"closure\"")),
                () -> assertEquals(ResultFixture.reconciliation(), ResultJson.read(json).reconciliation()));
    }

    @Test
    void recordWithoutReconciliationReadsAsNotReconciledWithRawMetrics() {
        String json = ResultJson.write(ResultFixture.unit2());
        String old = json.substring(0, json.indexOf(",\"metrics_basis\"")) + "}";
        UnitResult read = ResultJson.read(old);
        assertAll(
                () -> assertEquals("not_run", read.reconciliation().status()),
                () -> assertEquals(MetricsBasis.RAW, read.metricsBasis()),
                () -> assertEquals(read.cycle(), read.cycleRaw()));
    }

    @Test
    void passedThatContradictsTheStatusIsAFormatFault() {
        String json = ResultJson.write(ResultFixture.unit2()).replace("\"passed\":false", "\"passed\":true");
        assertThrows(ResultFormatException.class, () -> ResultJson.read(json));
    }

    @Test
    void timestampIsUtcWithThreeFractionalDigitsCutToTheMillisecond() {
        assertAll(
                () -> assertEquals("2026-12-01T00:00:00.000Z", ResultJson.timestamp(Instant.parse("2026-12-01T00:00:00Z"))),
                () -> assertEquals("2026-12-01T00:00:00.123Z",
                        ResultJson.timestamp(Instant.parse("2026-12-01T00:00:00.123999Z"))));
    }

    /**
     * Java 17's Double.toString writes 1.0E23 as 9.999999999999999E22 and 2.0E-3 style values longer
     * than needed for some doubles (JDK-4511638); the writer gives the shortest decimal that reads back.
     */
    @ParameterizedTest
    @ValueSource(doubles = {1.0E23, 0.30000000000000004, 2.0E-3, 4.9E-324, 1.7976931348623157E308, -0.0})
    void numbersAreWrittenAsTheShortestDecimalThatReadsBackToTheSameDouble(double value) {
        UnitResult r = withHeatAdded(value);
        String json = ResultJson.write(r);
        String written = json.substring(json.indexOf("\"heat_added_W\":") + 15, json.indexOf(",\"heat_rejected_W\""));
        assertAll(
                () -> assertEquals(Double.doubleToLongBits(value), Double.doubleToLongBits(Double.parseDouble(written))),
                () -> assertFalse(written.startsWith("9.99999"), written));
    }

    @Test
    void nonFiniteValueIsRefusedRatherThanWritten() {
        assertThrows(IllegalArgumentException.class, () -> ResultJson.write(withHeatAdded(Double.NaN)));
    }

    @Test
    void jsonLinesWriterEndsEachRecordWithANewline() throws IOException {
        StringWriter text = new StringWriter();
        try (ResultJsonLinesWriter w = new ResultJsonLinesWriter(text)) {
            w.write(ResultFixture.unit2());
            w.write(ResultFixture.allEmpty());
        }
        String[] lines = text.toString().split("\n", -1);
        assertAll(
                () -> assertEquals(3, lines.length),
                () -> assertEquals("", lines[2]),
                () -> assertEquals(ResultFixture.allEmpty(), ResultJson.read(lines[1])));
    }

    @ParameterizedTest
    @ValueSource(strings = {
            "",
            "[]",
            "{\"ts\":\"2026-12-01T00:00:00Z\"}",
            "{\"ts\":\"yesterday\",\"site\":\"s\",\"unit\":\"u\",\"states\":[],\"components\":[],\"cycle\":{},\"closure\":[]}",
    })
    void textThatIsNotAResultRecordIsRefusedWithAFormatException(String text) {
        assertThrows(ResultFormatException.class, () -> ResultJson.read(text));
    }

    @Test
    void missingFieldIsNamedInTheMessage() {
        String json = ResultJson.write(ResultFixture.unit2()).replace("\"work_out_W\":1.12E8,", "");
        ResultFormatException e = assertThrows(ResultFormatException.class, () -> ResultJson.read(json));
        assertTrue(e.getMessage().contains("component turbine: field work_out_W is missing"), e.getMessage());
    }

    @Test
    void recordBreakingItsOwnRulesIsAFormatFault() {
        String json = ResultJson.write(ResultFixture.unit2())
                .replace("\"valid\":false,\"reason\":\"state condensate is invalid\"", "\"valid\":false,\"reason\":null");
        assertThrows(ResultFormatException.class, () -> ResultJson.read(json));
    }

    private static UnitResult withHeatAdded(double value) {
        UnitResult base = ResultFixture.allEmpty();
        CycleResult cycle = new CycleResult(OptionalDouble.of(value), OptionalDouble.empty(), OptionalDouble.empty(),
                OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(),
                OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty());
        return new UnitResult(base.timestamp(), base.site(), base.unit(), base.states(),
                List.of(new ComponentResult("turbine", "turbine", OptionalDouble.empty(), OptionalDouble.empty(),
                        OptionalDouble.empty(), OptionalDouble.empty(), false, Optional.of("no inlet"))),
                cycle, base.closure());
    }
}
