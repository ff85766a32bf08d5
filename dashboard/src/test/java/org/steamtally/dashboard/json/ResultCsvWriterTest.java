package org.steamtally.dashboard.json;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.StringWriter;
import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.StateResult;
import org.steamtally.calc.cycle.UnitResult;

class ResultCsvWriterTest {

    private static String csv(UnitResult... results) throws IOException {
        StringWriter text = new StringWriter();
        try (ResultCsvWriter w = new ResultCsvWriter(text)) {
            for (UnitResult r : results) {
                w.write(r);
            }
        }
        return text.toString();
    }

    @Test
    void handBuiltRecordWritesExactlyTheCommittedCsv() throws IOException {
        assertEquals(ResultJsonTest.resource("unit2-result.csv"), csv(ResultFixture.unit2()));
    }

    @Test
    void columnsAreTsSiteUnitThenCycleStatesComponentsAndClosures() {
        List<String> columns = ResultCsvWriter.columns(ResultFixture.unit2());
        assertAll(
                () -> assertEquals(List.of("ts", "site", "unit", "cycle.heat_added_W"), columns.subList(0, 4)),
                () -> assertTrue(columns.contains("state.main_steam.h_J_per_kg")),
                () -> assertTrue(columns.contains("component.feed_pump.work_out_W")),
                () -> assertEquals("closure.turbine+generator.z", columns.get(columns.size() - 1)),
                () -> assertTrue(columns.indexOf("closure.cycle.z") > columns.indexOf("component.feed_pump.reason")));
    }

    @Test
    void laterRecordWithFewerEntriesLeavesTheirCellsEmpty() throws IOException {
        UnitResult full = ResultFixture.unit2();
        UnitResult fewer = new UnitResult(full.timestamp(), full.site(), full.unit(), full.states(),
                full.components(), full.cycle(), List.of());
        String[] lines = csv(full, fewer).split("\n");
        assertAll(
                () -> assertEquals(3, lines.length),
                () -> assertTrue(lines[2].endsWith(",,,,,,"), lines[2]));
    }

    @Test
    void laterRecordWithAnEntryTheHeaderLacksIsRefused() {
        UnitResult full = ResultFixture.unit2();
        StateResult extra = new StateResult("reheat", ResultFixture.none(), ResultFixture.none(), ResultFixture.none(),
                ResultFixture.none(), ResultFixture.none(), ResultFixture.none(), Optional.empty(), ResultFixture.none(),
                ResultFixture.none(), false, Optional.of("not measured"));
        UnitResult more = new UnitResult(full.timestamp(), full.site(), full.unit(), List.of(extra),
                full.components(), full.cycle(), full.closure());
        StringWriter text = new StringWriter();
        ResultCsvWriter w = new ResultCsvWriter(text);
        assertThrows(IllegalArgumentException.class, () -> {
            w.write(full);
            w.write(more);
        });
    }

    @Test
    void reasonWithCommaOrQuoteIsQuoted() throws IOException {
        UnitResult empty = ResultFixture.allEmpty();
        StateResult state = new StateResult("main_steam", ResultFixture.none(), ResultFixture.none(),
                ResultFixture.none(), ResultFixture.none(), ResultFixture.none(), ResultFixture.none(), Optional.empty(),
                ResultFixture.none(), ResultFixture.none(), false, Optional.of("sensors \"PT-101\", TT-101 missing"));
        UnitResult r = new UnitResult(empty.timestamp(), empty.site(), empty.unit(), List.of(state),
                empty.components(), empty.cycle(), empty.closure());
        assertTrue(csv(r).contains(",\"sensors \"\"PT-101\"\", TT-101 missing\","), csv(r));
    }
}
