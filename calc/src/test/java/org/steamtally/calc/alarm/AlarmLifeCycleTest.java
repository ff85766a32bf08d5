package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Every transition of the ISA-18.2 alarm state diagram (ANSI/ISA-18.2-2016, states A to G), and every
 * operator action a state must refuse, on the cycle closure of a one-sensor unit with the delays set
 * to zero, so that one evaluation moves the condition.
 */
class AlarmLifeCycleTest {

    private static final double ACTIVE_Z = 5.0;
    private static final double CLEAR_Z = 0.0;

    private final TestClock clock = new TestClock();
    private final AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), OneClosureUnit.immediate(), clock);

    /** Brings the closure alarm into a state, with its condition active or clear where the state allows both. */
    private void bringTo(AlarmState state, boolean conditionActive) {
        OneClosureUnit.feed(engine, clock, CLEAR_Z);
        switch (state) {
            case NORMAL -> { }
            case ACTIVE_UNACKNOWLEDGED -> OneClosureUnit.feed(engine, clock, ACTIVE_Z);
            case ACTIVE_ACKNOWLEDGED -> {
                OneClosureUnit.feed(engine, clock, ACTIVE_Z);
                engine.acknowledge(OneClosureUnit.CLOSURE, "op1");
            }
            case RETURNED_UNACKNOWLEDGED -> {
                OneClosureUnit.feed(engine, clock, ACTIVE_Z);
                OneClosureUnit.feed(engine, clock, CLEAR_Z);
            }
            case SHELVED -> engine.shelve(OneClosureUnit.CLOSURE, Duration.ofHours(1), "op1", "transmitter recalibration");
            case SUPPRESSED_BY_DESIGN -> engine.suppress(AlarmKind.CLOSURE, "unit shut down");
            case OUT_OF_SERVICE -> engine.removeFromService(OneClosureUnit.CLOSURE, "op1", "work order 4711");
        }
        if (conditionActive) {
            OneClosureUnit.feed(engine, clock, ACTIVE_Z);
        }
        assertEquals(state, current(), "set-up");
    }

    private AlarmState current() {
        return engine.alarm(OneClosureUnit.CLOSURE).orElseThrow().state();
    }

    /** Applies a stimulus; returns the events it caused. */
    private List<AlarmEvent> apply(AlarmStimulus stimulus) {
        clock.seconds(1);
        String id = OneClosureUnit.CLOSURE;
        return switch (stimulus) {
            case CONDITION_ACTIVE -> OneClosureUnit.feed(engine, clock, ACTIVE_Z);
            case CONDITION_CLEARED -> OneClosureUnit.feed(engine, clock, CLEAR_Z);
            case ACKNOWLEDGE -> List.of(engine.acknowledge(id, "op2", "seen"));
            case SHELVE -> List.of(engine.shelve(id, Duration.ofMinutes(30), "op2", "nuisance during load ramp"));
            case UNSHELVE -> List.of(engine.unshelve(id, "op2"));
            case SHELF_EXPIRED -> {
                clock.advance(Duration.ofHours(2));
                yield engine.expireShelves();
            }
            case REMOVE_FROM_SERVICE -> List.of(engine.removeFromService(id, "op2", "sensor replaced"));
            case RETURN_TO_SERVICE -> List.of(engine.returnToService(id, "op2"));
            case SUPPRESS -> engine.suppress(AlarmKind.CLOSURE, "unit shut down");
            case END_SUPPRESSION -> engine.endSuppression(AlarmKind.CLOSURE);
        };
    }

    @ParameterizedTest(name = "{0} ({1}) --{2}--> {3}")
    @CsvSource({
        // from state,             condition, stimulus,            to state
        "NORMAL,                  clear,  CONDITION_ACTIVE,    ACTIVE_UNACKNOWLEDGED",
        "NORMAL,                  clear,  SHELVE,              SHELVED",
        "NORMAL,                  clear,  REMOVE_FROM_SERVICE, OUT_OF_SERVICE",
        "NORMAL,                  clear,  SUPPRESS,            SUPPRESSED_BY_DESIGN",
        "ACTIVE_UNACKNOWLEDGED,   active, ACKNOWLEDGE,         ACTIVE_ACKNOWLEDGED",
        "ACTIVE_UNACKNOWLEDGED,   active, CONDITION_CLEARED,   RETURNED_UNACKNOWLEDGED",
        "ACTIVE_UNACKNOWLEDGED,   active, SHELVE,              SHELVED",
        "ACTIVE_UNACKNOWLEDGED,   active, REMOVE_FROM_SERVICE, OUT_OF_SERVICE",
        "ACTIVE_UNACKNOWLEDGED,   active, SUPPRESS,            SUPPRESSED_BY_DESIGN",
        "ACTIVE_ACKNOWLEDGED,     active, CONDITION_CLEARED,   NORMAL",
        "ACTIVE_ACKNOWLEDGED,     active, SHELVE,              SHELVED",
        "ACTIVE_ACKNOWLEDGED,     active, REMOVE_FROM_SERVICE, OUT_OF_SERVICE",
        "ACTIVE_ACKNOWLEDGED,     active, SUPPRESS,            SUPPRESSED_BY_DESIGN",
        "RETURNED_UNACKNOWLEDGED, clear,  ACKNOWLEDGE,         NORMAL",
        "RETURNED_UNACKNOWLEDGED, clear,  CONDITION_ACTIVE,    ACTIVE_UNACKNOWLEDGED",
        "RETURNED_UNACKNOWLEDGED, clear,  SHELVE,              SHELVED",
        "RETURNED_UNACKNOWLEDGED, clear,  REMOVE_FROM_SERVICE, OUT_OF_SERVICE",
        "RETURNED_UNACKNOWLEDGED, clear,  SUPPRESS,            SUPPRESSED_BY_DESIGN",
        "SHELVED,                 clear,  UNSHELVE,            NORMAL",
        "SHELVED,                 active, UNSHELVE,            ACTIVE_UNACKNOWLEDGED",
        "SHELVED,                 clear,  SHELF_EXPIRED,       NORMAL",
        "SHELVED,                 active, SHELF_EXPIRED,       ACTIVE_UNACKNOWLEDGED",
        "SHELVED,                 clear,  SHELVE,              SHELVED",
        "SHELVED,                 active, REMOVE_FROM_SERVICE, OUT_OF_SERVICE",
        "SUPPRESSED_BY_DESIGN,    clear,  END_SUPPRESSION,     NORMAL",
        "SUPPRESSED_BY_DESIGN,    active, END_SUPPRESSION,     ACTIVE_UNACKNOWLEDGED",
        "SUPPRESSED_BY_DESIGN,    active, SHELVE,              SHELVED",
        "SUPPRESSED_BY_DESIGN,    clear,  REMOVE_FROM_SERVICE, OUT_OF_SERVICE",
        "OUT_OF_SERVICE,          clear,  RETURN_TO_SERVICE,   NORMAL",
        "OUT_OF_SERVICE,          active, RETURN_TO_SERVICE,   ACTIVE_UNACKNOWLEDGED",
    })
    void stimulusMovesTheAlarmFromOneStateToTheNextWithOneEvent(AlarmState from, String condition,
                                                                AlarmStimulus stimulus, AlarmState to) {
        bringTo(from, condition.equals("active"));
        List<AlarmEvent> events = apply(stimulus);
        assertEquals(1, events.size(), "events: " + events);
        AlarmEvent e = events.get(0);
        assertEquals(from, e.from());
        assertEquals(to, e.to());
        assertEquals(stimulus, e.stimulus());
        assertEquals(OneClosureUnit.CLOSURE, e.alarmId());
        assertEquals(AlarmKind.CLOSURE, e.kind());
        assertEquals(clock.instant(), e.time());
        assertEquals(stimulus.isOperatorAction(), e.user().isPresent());
        if (stimulus.isOperatorAction()) {
            assertEquals("op2", e.user().get());
        }
        assertEquals(to, current());
    }

    @ParameterizedTest(name = "{0} ({1}) --{2}--> stays")
    @CsvSource({
        "ACTIVE_UNACKNOWLEDGED,   active, CONDITION_ACTIVE",
        "ACTIVE_ACKNOWLEDGED,     active, CONDITION_ACTIVE",
        "NORMAL,                  clear,  CONDITION_CLEARED",
        "NORMAL,                  clear,  END_SUPPRESSION",
        "SHELVED,                 clear,  CONDITION_ACTIVE",
        "SHELVED,                 active, CONDITION_CLEARED",
        "SHELVED,                 clear,  SUPPRESS",
        "SUPPRESSED_BY_DESIGN,    clear,  CONDITION_ACTIVE",
        "SUPPRESSED_BY_DESIGN,    active, CONDITION_CLEARED",
        "SUPPRESSED_BY_DESIGN,    clear,  SUPPRESS",
        "OUT_OF_SERVICE,          clear,  CONDITION_ACTIVE",
        "OUT_OF_SERVICE,          active, CONDITION_CLEARED",
        "OUT_OF_SERVICE,          clear,  SUPPRESS",
        "OUT_OF_SERVICE,          clear,  SHELF_EXPIRED",
    })
    void stimulusThatTheStateDoesNotAnswerLeavesItWithoutEvent(AlarmState from, String condition,
                                                              AlarmStimulus stimulus) {
        bringTo(from, condition.equals("active"));
        assertEquals(List.of(), apply(stimulus));
        assertEquals(from, current());
    }

    @ParameterizedTest(name = "{0} ({1}) refuses {2}")
    @CsvSource({
        "NORMAL,                  clear,  ACKNOWLEDGE",
        "NORMAL,                  clear,  UNSHELVE",
        "NORMAL,                  clear,  RETURN_TO_SERVICE",
        "ACTIVE_ACKNOWLEDGED,     active, ACKNOWLEDGE",
        "ACTIVE_ACKNOWLEDGED,     active, UNSHELVE",
        "RETURNED_UNACKNOWLEDGED, clear,  RETURN_TO_SERVICE",
        "SHELVED,                 clear,  ACKNOWLEDGE",
        "SHELVED,                 clear,  RETURN_TO_SERVICE",
        "SUPPRESSED_BY_DESIGN,    active, ACKNOWLEDGE",
        "SUPPRESSED_BY_DESIGN,    clear,  UNSHELVE",
        "OUT_OF_SERVICE,          clear,  ACKNOWLEDGE",
        "OUT_OF_SERVICE,          clear,  SHELVE",
        "OUT_OF_SERVICE,          clear,  UNSHELVE",
        "OUT_OF_SERVICE,          clear,  REMOVE_FROM_SERVICE",
    })
    void operatorActionTheStateDoesNotAllowIsRefusedByNameAndChangesNothing(AlarmState from, String condition,
                                                                           AlarmStimulus stimulus) {
        bringTo(from, condition.equals("active"));
        AlarmRecord before = engine.alarm(OneClosureUnit.CLOSURE).orElseThrow();
        AlarmActionException e = assertThrows(AlarmActionException.class, () -> apply(stimulus));
        assertTrue(e.getMessage().contains(OneClosureUnit.CLOSURE) && e.getMessage().contains(from.key()),
                e.getMessage());
        assertEquals(before, engine.alarm(OneClosureUnit.CLOSURE).orElseThrow());
    }
}
