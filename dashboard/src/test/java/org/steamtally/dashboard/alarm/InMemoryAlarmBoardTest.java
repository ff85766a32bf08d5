package org.steamtally.dashboard.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.atomic.AtomicReference;
import org.junit.jupiter.api.Test;

class InMemoryAlarmBoardTest {

    private final AtomicReference<Instant> now = new AtomicReference<>(Instant.parse("2026-12-01T06:00:00Z"));
    private final InMemoryAlarmBoard board = new InMemoryAlarmBoard(now::get);

    private AlarmView alarm(String id, AlarmView.Priority p, AlarmView.State s, int minutesAgo) {
        return new AlarmView(id, "unit3", p, s, "test alarm " + id, now.get().minusSeconds(60L * minutesAgo),
                Optional.empty(), OptionalDouble.empty(), Optional.empty(), List.of(), Optional.empty(), Optional.empty());
    }

    @Test
    void theListIsMostUrgentFirstThenNewestFirst() {
        board.raise(alarm("low", AlarmView.Priority.LOW, AlarmView.State.UNACKNOWLEDGED, 1));
        board.raise(alarm("high-old", AlarmView.Priority.HIGH, AlarmView.State.UNACKNOWLEDGED, 30));
        board.raise(alarm("high-new", AlarmView.Priority.HIGH, AlarmView.State.UNACKNOWLEDGED, 2));
        assertEquals(List.of("high-new", "high-old", "low"), board.list("unit3").stream().map(AlarmView::id).toList());
        assertTrue(board.list("unit4").isEmpty());
    }

    @Test
    void aShelvedAlarmReturnsUnacknowledgedWhenItsTimeIsUp() {
        board.raise(alarm("a", AlarmView.Priority.HIGH, AlarmView.State.ACKNOWLEDGED, 5));
        AlarmView shelved = board.shelve("a", Duration.ofMinutes(30), "instrument work", "ops1");
        assertEquals(Instant.parse("2026-12-01T06:30:00Z"), shelved.shelvedUntil().orElseThrow());
        now.set(now.get().plus(Duration.ofMinutes(29)));
        assertEquals(AlarmView.State.SHELVED, board.list("unit3").get(0).state());
        now.set(now.get().plus(Duration.ofMinutes(1)));
        assertEquals(AlarmView.State.UNACKNOWLEDGED, board.list("unit3").get(0).state());
    }

    @Test
    void acknowledgingAnAlarmThatReturnedToNormalClearsIt() {
        // ANSI/ISA-18.2-2016, alarm state transition diagram: RTN unacknowledged, on acknowledgement, to normal.
        board.raise(alarm("r", AlarmView.Priority.MEDIUM, AlarmView.State.RETURNED_UNACKNOWLEDGED, 5));
        board.acknowledge("r", "ops1");
        assertTrue(board.list("unit3").isEmpty());
    }

    @Test
    void actionsTheStateDoesNotAllowNameTheStateAndTheLimit() {
        board.raise(alarm("a", AlarmView.Priority.HIGH, AlarmView.State.ACKNOWLEDGED, 5));
        AlarmActionException twice = assertThrows(AlarmActionException.class, () -> board.acknowledge("a", "ops1"));
        assertTrue(twice.getMessage().contains("is acknowledged"), twice.getMessage());
        AlarmActionException tooLong = assertThrows(AlarmActionException.class,
                () -> board.shelve("a", Duration.ofHours(13), "x", "ops1"));
        assertTrue(tooLong.getMessage().contains("at most 12 h"), tooLong.getMessage());
        assertThrows(AlarmActionException.class, () -> board.shelve("a", Duration.ofHours(1), " ", "ops1"));
        assertThrows(UnknownAlarmException.class, () -> board.unshelve("nope", "ops1"));
    }
}
