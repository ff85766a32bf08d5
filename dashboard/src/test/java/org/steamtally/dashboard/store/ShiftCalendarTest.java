package org.steamtally.dashboard.store;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.time.Duration;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalTime;
import java.time.ZoneId;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * Shift boundaries by the wall clock of a named zone. Europe/Berlin changes at 01:00 UTC on the
 * last Sunday of March (02:00 CET → 03:00 CEST) and of October (03:00 CEST → 02:00 CET), EU
 * Directive 2000/84/EC; in 2026 those are 29 March and 25 October.
 */
class ShiftCalendarTest {

    private static final ZoneId BERLIN = ZoneId.of("Europe/Berlin");
    private final ShiftCalendar calendar = ShiftCalendar.threeShifts(BERLIN);

    @Test
    void nightShiftOfTheSpringChangeLastsSevenHours() {
        Shift night = calendar.shiftContaining(Instant.parse("2026-03-29T00:30:00Z"));
        assertEquals("night", night.name());
        assertEquals(LocalDate.of(2026, 3, 28), night.date());
        // 22:00 CET (UTC+1) and 06:00 CEST (UTC+2).
        assertEquals(Instant.parse("2026-03-28T21:00:00Z"), night.start());
        assertEquals(Instant.parse("2026-03-29T04:00:00Z"), night.end());
        assertEquals(Duration.ofHours(7), night.length());
    }

    @Test
    void nightShiftOfTheAutumnChangeLastsNineHours() {
        Shift night = calendar.shiftContaining(Instant.parse("2026-10-25T01:30:00Z"));
        // 22:00 CEST (UTC+2) and 06:00 CET (UTC+1).
        assertEquals(Instant.parse("2026-10-24T20:00:00Z"), night.start());
        assertEquals(Instant.parse("2026-10-25T05:00:00Z"), night.end());
        assertEquals(Duration.ofHours(9), night.length());
    }

    @Test
    void dayShiftsAroundTheChangesKeepEightHours() {
        for (LocalDate d : List.of(LocalDate.of(2026, 3, 29), LocalDate.of(2026, 10, 25))) {
            List<Shift> shifts = calendar.shiftsOn(d);
            assertEquals(List.of("early", "late", "night"), shifts.stream().map(Shift::name).toList());
            assertEquals(Duration.ofHours(8), shifts.get(0).length(), "early on " + d);
            assertEquals(Duration.ofHours(8), shifts.get(1).length(), "late on " + d);
        }
    }

    @Test
    void shiftsFollowEachOtherWithoutGapOrOverlapAcrossBothChanges() {
        Shift s = calendar.shiftContaining(Instant.parse("2026-03-27T12:00:00Z"));
        Duration total = Duration.ZERO;
        for (int i = 0; i < 9; i++) {
            Shift next = calendar.next(s);
            assertEquals(s.end(), next.start());
            assertEquals(s, calendar.previous(next));
            total = total.plus(s.length());
            s = next;
        }
        // Nine shifts from the late shift of 27 March: three days, one of them an hour short.
        assertEquals(Duration.ofHours(71), total);
    }

    @Test
    void aStartTimeInTheSpringGapMovesForwardByTheGap() {
        ShiftCalendar odd = new ShiftCalendar(BERLIN, Map.of("a", LocalTime.of(2, 30), "b", LocalTime.of(14, 30)));
        Shift a = odd.shiftsOn(LocalDate.of(2026, 3, 29)).get(0);
        // 02:30 does not exist that day; java.time moves it to 03:30 CEST = 01:30 UTC.
        assertEquals(Instant.parse("2026-03-29T01:30:00Z"), a.start());
    }

    @Test
    void rejectsTwoShiftsWithOneStartTime() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new ShiftCalendar(BERLIN, Map.of("a", LocalTime.of(6, 0), "b", LocalTime.of(6, 0))));
        assertEquals(true, e.getMessage().contains("06:00"), e.getMessage());
    }
}
