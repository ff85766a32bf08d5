package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;

import org.junit.jupiter.api.Test;

/** Shelving is time-limited and recorded with who and why; out of service lasts until returned. */
class ShelvingAndServiceTest {

    private final TestClock clock = new TestClock();
    private final AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), OneClosureUnit.immediate(), clock);
    private static final String ID = OneClosureUnit.CLOSURE;

    ShelvingAndServiceTest() {
        // The closure alarm exists once the closure has been computed.
        OneClosureUnit.feed(engine, clock, 0.0);
    }

    private AlarmRecord alarm() {
        return engine.alarm(ID).orElseThrow();
    }

    @Test
    void shelfRecordsWhoWhyAndUntilWhen() {
        OneClosureUnit.feed(engine, clock, 5.0);
        AlarmEvent e = engine.shelve(ID, Duration.ofHours(2), " op1 ", "cooling-water flow meter known bad");
        assertEquals("op1", e.user().orElseThrow());
        assertEquals("cooling-water flow meter known bad", e.note().orElseThrow());
        Shelf shelf = alarm().shelf().orElseThrow();
        assertEquals("op1", shelf.user());
        assertEquals(TestClock.START, shelf.shelvedAt());
        assertEquals(TestClock.START.plus(Duration.ofHours(2)), shelf.until());
    }

    @Test
    void shelfExpiresAtItsEndAndTheActiveAlarmIsAnnunciatedAgain() {
        OneClosureUnit.feed(engine, clock, 5.0);
        engine.acknowledge(ID, "op1");
        engine.shelve(ID, Duration.ofHours(1), "op1", "known during load ramp");
        clock.advance(Duration.ofMinutes(59)).advance(Duration.ofSeconds(59));
        assertEquals(List.of(), OneClosureUnit.feed(engine, clock, 5.0));
        assertEquals(AlarmState.SHELVED, alarm().state());
        clock.seconds(1);
        List<AlarmEvent> events = OneClosureUnit.feed(engine, clock, 5.0);
        assertEquals(1, events.size());
        AlarmEvent e = events.get(0);
        assertEquals(AlarmStimulus.SHELF_EXPIRED, e.stimulus());
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, e.to());
        assertTrue(e.user().isEmpty());
        assertTrue(alarm().shelf().isEmpty());
    }

    @Test
    void shelfExpiresWithoutSnapshotsWhenAskedTo() {
        engine.shelve(ID, Duration.ofMinutes(10), "op1", "test");
        clock.advance(Duration.ofMinutes(10));
        List<AlarmEvent> events = engine.expireShelves();
        assertEquals(AlarmState.NORMAL, events.get(0).to());
        assertEquals(List.of(), engine.expireShelves());
    }

    @Test
    void shelvedAlarmFollowsItsConditionUnseenAndReturnsNormalWhenItClearedMeanwhile() {
        engine.shelve(ID, Duration.ofHours(1), "op1", "test");
        assertEquals(List.of(), OneClosureUnit.feed(engine, clock, 5.0));
        assertEquals(List.of(), OneClosureUnit.feed(engine, clock, 0.0));
        assertEquals(AlarmState.NORMAL, engine.unshelve(ID, "op1").to());
    }

    @Test
    void shelvingAgainStartsANewPeriod() {
        engine.shelve(ID, Duration.ofMinutes(10), "op1", "first");
        clock.advance(Duration.ofMinutes(9));
        engine.shelve(ID, Duration.ofMinutes(10), "op2", "second");
        clock.advance(Duration.ofMinutes(9));
        assertEquals(List.of(), engine.expireShelves());
        assertEquals("op2", alarm().shelf().orElseThrow().user());
    }

    @Test
    void shelfLongerThanTheMaximumIsRefusedNamingTheMaximum() {
        AlarmActionException e = assertThrows(AlarmActionException.class,
                () -> engine.shelve(ID, Duration.ofHours(9), "op1", "long job"));
        assertTrue(e.getMessage().contains("PT8H") && e.getMessage().contains("PT9H"), e.getMessage());
        assertThrows(AlarmActionException.class, () -> engine.shelve(ID, Duration.ZERO, "op1", "x"));
        assertEquals(AlarmState.NORMAL, alarm().state());
    }

    @Test
    void shelvingNeedsAUserAndAReason() {
        AlarmActionException noReason = assertThrows(AlarmActionException.class,
                () -> engine.shelve(ID, Duration.ofHours(1), "op1", " "));
        assertTrue(noReason.getMessage().contains("reason"), noReason.getMessage());
        AlarmActionException noUser = assertThrows(AlarmActionException.class,
                () -> engine.shelve(ID, Duration.ofHours(1), "", "why"));
        assertTrue(noUser.getMessage().contains("user"), noUser.getMessage());
        assertThrows(AlarmActionException.class, () -> engine.acknowledge(ID, null));
    }

    @Test
    void closureNeverComputedHasNoAlarmToActOn() {
        AlarmActionException e = assertThrows(AlarmActionException.class,
                () -> engine.shelve("closure:boiler+fuel", Duration.ofHours(1), "op1", "typo"));
        assertTrue(e.getMessage().contains("once the closure has been computed"), e.getMessage());
        assertTrue(engine.alarm("closure:boiler+fuel").isEmpty());
    }

    @Test
    void suspectOfAKnownSensorCanBeTakenOutOfServiceBeforeItIsEverNamed() {
        AlarmEvent e = engine.removeFromService("suspect:PT-1", "tech1", "transmitter being replaced");
        assertEquals(AlarmState.NORMAL, e.from());
        assertEquals(AlarmState.OUT_OF_SERVICE, engine.alarm("suspect:PT-1").orElseThrow().state());
    }

    @Test
    void alarmFirstSeenWhileItsKindIsSuppressedBeginsSuppressed() {
        engine.suppress(AlarmKind.SUSPECT_SENSOR, "unit off line");
        AlarmEvent e = engine.shelve("suspect:PT-1", Duration.ofHours(1), "op1", "known");
        assertEquals(AlarmState.SUPPRESSED_BY_DESIGN, e.from());
    }

    @Test
    void unknownAlarmIsRefusedNamingTheIdForms() {
        AlarmActionException e = assertThrows(AlarmActionException.class,
                () -> engine.acknowledge("stale:NOPE", "op1"));
        assertTrue(e.getMessage().contains("stale:NOPE") && e.getMessage().contains("closure:<closure id>"),
                e.getMessage());
    }

    @Test
    void outOfServiceRecordsWhoAndWhyAndIgnoresTheConditionUntilReturned() {
        AlarmEvent removed = engine.removeFromService(ID, "tech1", "work order 4711: flow element replaced");
        assertEquals("tech1", removed.user().orElseThrow());
        ServiceRemoval removal = alarm().removal().orElseThrow();
        assertEquals("work order 4711: flow element replaced", removal.reason());
        assertEquals(TestClock.START, removal.since());
        for (int s = 0; s < 100; s++) {
            clock.seconds(1);
            assertEquals(List.of(), OneClosureUnit.feed(engine, clock, s % 2 == 0 ? 5.0 : 0.0));
        }
        OneClosureUnit.feed(engine, clock, 5.0);
        AlarmEvent back = engine.returnToService(ID, "tech1", "calibrated");
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, back.to());
        assertEquals("calibrated", back.note().orElseThrow());
        assertTrue(alarm().removal().isEmpty());
    }

    @Test
    void removingAShelvedAlarmEndsItsShelf() {
        engine.shelve(ID, Duration.ofHours(1), "op1", "x");
        engine.removeFromService(ID, "tech1", "repair");
        clock.advance(Duration.ofHours(2));
        assertEquals(List.of(), engine.expireShelves());
        assertTrue(alarm().shelf().isEmpty());
        assertEquals(AlarmState.OUT_OF_SERVICE, alarm().state());
    }

    @Test
    void suppressionHeldOverAShelfTakesEffectWhenTheShelfEnds() {
        engine.shelve(ID, Duration.ofHours(1), "op1", "x");
        assertEquals(List.of(), engine.suppress(AlarmKind.CLOSURE, "unit off line"));
        AlarmEvent e = engine.unshelve(ID, "op1");
        assertEquals(AlarmState.SUPPRESSED_BY_DESIGN, e.to());
        assertEquals("unit off line", alarm().suppression().orElseThrow());
    }
}
