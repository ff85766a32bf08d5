package org.steamtally.collector.mqtt;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.stream.IntStream;
import org.junit.jupiter.api.Test;

class FilterSummaryTest {

    @Test
    void aFleetsThousandsOfFiltersAreSummedUpAsACountAndTheFirstFew() {
        List<String> filters = IntStream.range(0, 3_600).mapToObj(i -> "site/u" + (i / 36) + "/s" + (i % 36)).toList();

        String line = ReconnectingSource.filterSummary(filters);

        assertTrue(line.startsWith("3600 filters: site/u0/s0, site/u0/s1, site/u0/s2, ..."), line);
        assertTrue(line.endsWith("(3597 more, listed at DEBUG)"), line);
        assertTrue(line.length() < 120, "bounded length, was " + line.length());
    }

    @Test
    void aFewFiltersAreAllNamed() {
        assertEquals("1 filter: site/#", ReconnectingSource.filterSummary(List.of("site/#")));
        assertEquals("2 filters: a/#, b/#", ReconnectingSource.filterSummary(List.of("a/#", "b/#")));
    }
}
