package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Function;

import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.Snapshot;

/**
 * A unit whose sensors all go quiet at once (its gateway or the broker link down) raises one alarm,
 * {@code silent:unit}, instead of a stale alarm per sensor and an invalid alarm per state and
 * component: ANSI/ISA-18.2-2016 asks for one alarm per cause and names suppression by design as the
 * means. The reheat unit has 17 sensors, 8 states and 7 components.
 */
class SilentUnitAlarmTest {

    private final ReheatUnit plant = new ReheatUnit();
    private final CycleModel model = plant.model();
    private final TestClock clock = new TestClock();

    private AlarmEngine engine(AlarmSettings settings) {
        return new AlarmEngine(plant.unit(), settings, clock);
    }

    /** A snapshot of the operating point with the given sensors stale. */
    private Snapshot staleSnapshot(Instant t, List<String> staleIds) {
        Snapshot good = plant.snapshot(t);
        Snapshot.SensorStatus[] s = good.status().clone();
        for (String id : staleIds) {
            s[plant.index(id)] = Snapshot.SensorStatus.STALE;
        }
        return new Snapshot(t, ReheatUnit.UNIT, Arrays.copyOf(good.valuesSi(), good.valuesSi().length), s);
    }

    private Snapshot allStale(Instant t) {
        return staleSnapshot(t, List.copyOf(plant.sensors.keySet()));
    }

    /** Runs {@code seconds} snapshots at 1 Hz; returns the events of each snapshot, in order. */
    private List<List<AlarmEvent>> run(AlarmEngine engine, int seconds, Function<Instant, Snapshot> snapshots) {
        List<List<AlarmEvent>> out = new ArrayList<>();
        for (int s = 0; s < seconds; s++) {
            Snapshot snapshot = snapshots.apply(clock.instant());
            out.add(engine.evaluate(snapshot, model.evaluate(snapshot)));
            clock.seconds(1);
        }
        return out;
    }

    private static List<AlarmEvent> flat(List<List<AlarmEvent>> perSnapshot) {
        return perSnapshot.stream().flatMap(List::stream).toList();
    }

    private static long annunciated(AlarmEngine engine, AlarmKind kind) {
        return engine.alarms().stream().filter(a -> a.kind() == kind && a.state().isAnnunciated()).count();
    }

    private static AlarmState stateOf(AlarmEngine engine, String id) {
        return engine.alarm(id).orElseThrow().state();
    }

    @Test
    void unitWhoseSensorsAllGoStaleRaisesOneSilentAlarmAndSuppressesTheRest() {
        AlarmEngine engine = engine(AlarmSettings.DEFAULTS);
        run(engine, 10, plant::snapshot);
        List<List<AlarmEvent>> perSnapshot = run(engine, 60, this::allStale);
        List<AlarmEvent> events = flat(perSnapshot);

        assertEquals(1, events.size(), events.toString());
        AlarmEvent silent = events.get(0);
        assertEquals(AlarmKind.SILENT_UNIT_ID, silent.alarmId());
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, silent.to());
        // The on-delay of 5 s, the stale alarms' own: raised in the snapshot in which they would be.
        assertEquals(TestClock.START.plusSeconds(10 + 5), silent.time());
        assertEquals(AlarmPriority.MEDIUM, silent.priority());
        assertEquals(1.0, silent.value().getAsDouble());
        assertEquals(1.0, silent.limit().getAsDouble());
        assertEquals("unit reheat is silent: no good reading from 17 of 17 sensors within their max age"
                + " (limit: a share of 1 of its sensors)", silent.text());

        assertEquals(0, annunciated(engine, AlarmKind.STALE_SENSOR));
        assertEquals(0, annunciated(engine, AlarmKind.CALCULATION_INVALID));
        List<AlarmRecord> hidden = engine.alarms().stream()
                .filter(a -> a.kind() == AlarmKind.STALE_SENSOR || a.kind() == AlarmKind.CALCULATION_INVALID).toList();
        assertEquals(17 + 8 + 7, hidden.size());
        for (AlarmRecord a : hidden) {
            assertEquals(AlarmState.SUPPRESSED_BY_DESIGN, a.state(), a.id());
            assertEquals(Optional.of(AlarmEngine.SILENT_UNIT_REASON), a.suppression(), a.id());
        }
        // Their conditions are still followed, so that each returns in the right state.
        assertTrue(engine.alarm("stale:T_cold_reheat").orElseThrow().conditionActive());
        assertTrue(engine.alarm("invalid:state:cold_reheat").orElseThrow().conditionActive());
    }

    @Test
    void withoutTheSilentAlarmTheSameSilenceFloodsTheJournal() {
        // The comparison that motivates the alarm: one alarm per sensor, state and component.
        EnumMap<AlarmKind, AlarmDefinition> kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.SILENT_UNIT, AlarmSettings.SILENT_UNIT_DEFAULT.withEnabled(false));
        AlarmEngine engine = engine(new AlarmSettings(kinds, Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT));
        run(engine, 10, plant::snapshot);
        List<AlarmEvent> events = flat(run(engine, 60, this::allStale));
        assertEquals(17 + 8 + 7, events.size(), events.toString());
        assertEquals(17, annunciated(engine, AlarmKind.STALE_SENSOR));
    }

    @Test
    void unitStartedBeforeAnyReadingArrivedRaisesTheSilentAlarmAlone() {
        AlarmEngine engine = engine(AlarmSettings.DEFAULTS);
        List<AlarmEvent> events = flat(run(engine, 30, t -> {
            Snapshot s = allStale(t);
            Arrays.fill(s.status(), Snapshot.SensorStatus.MISSING);
            return s;
        }));
        assertEquals(List.of(AlarmKind.SILENT_UNIT_ID), events.stream().map(AlarmEvent::alarmId).toList());
    }

    @Test
    void readingsThatReturnClearTheSilentAlarmAndLeaveNoStaleAlarm() {
        AlarmEngine engine = engine(AlarmSettings.DEFAULTS);
        run(engine, 60, this::allStale);
        List<AlarmEvent> events = flat(run(engine, 60, plant::snapshot));

        assertEquals(1, events.size(), events.toString());
        AlarmEvent cleared = events.get(0);
        assertEquals(AlarmKind.SILENT_UNIT_ID, cleared.alarmId());
        assertEquals(AlarmStimulus.CONDITION_CLEARED, cleared.stimulus());
        assertEquals(AlarmState.RETURNED_UNACKNOWLEDGED, cleared.to());
        // The off-delay of 10 s after the first good snapshot.
        assertEquals(TestClock.START.plusSeconds(60 + 10), cleared.time());
        assertTrue(cleared.text().startsWith("unit reheat reports: 0 of 17 sensors without a good reading"),
                cleared.text());
        for (AlarmRecord a : engine.alarms()) {
            if (a.kind() != AlarmKind.SILENT_UNIT) {
                assertEquals(AlarmState.NORMAL, a.state(), a.id());
                assertTrue(!a.conditionActive(), a.id());
            }
        }
    }

    @Test
    void sensorStillStaleAfterTheUnitReportsAgainRaisesItsOwnAlarm() {
        AlarmEngine engine = engine(AlarmSettings.DEFAULTS);
        run(engine, 60, this::allStale);
        List<AlarmEvent> events = flat(run(engine, 60, t -> staleSnapshot(t, List.of("T_cold_reheat"))));

        AlarmEvent stale = events.stream().filter(e -> e.alarmId().equals("stale:T_cold_reheat")).findFirst()
                .orElseThrow(() -> new AssertionError("no stale alarm: " + events));
        assertEquals(AlarmStimulus.END_SUPPRESSION, stale.stimulus());
        assertEquals(AlarmState.SUPPRESSED_BY_DESIGN, stale.from());
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, stale.to());
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, stateOf(engine, "stale:T_cold_reheat"));
        // What follows from that one sensor is raised too, and nothing else.
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, stateOf(engine, "invalid:state:cold_reheat"));
        assertEquals(1, annunciated(engine, AlarmKind.STALE_SENSOR));
        assertEquals(AlarmState.NORMAL, stateOf(engine, "stale:T_main_steam"));
        assertEquals(AlarmState.NORMAL, stateOf(engine, "invalid:state:main_steam"));
        assertEquals(AlarmState.RETURNED_UNACKNOWLEDGED, stateOf(engine, AlarmKind.SILENT_UNIT_ID));
    }

    @Test
    void oneStaleSensorRaisesTheOrdinaryStaleAlarmAndNoSilentAlarm() {
        AlarmEngine engine = engine(AlarmSettings.DEFAULTS);
        List<AlarmEvent> events = flat(run(engine, 60, t -> staleSnapshot(t, List.of("T_cold_reheat"))));
        assertTrue(events.stream().anyMatch(e -> e.alarmId().equals("stale:T_cold_reheat")
                && e.to() == AlarmState.ACTIVE_UNACKNOWLEDGED), events.toString());
        assertTrue(events.stream().noneMatch(e -> e.kind() == AlarmKind.SILENT_UNIT), events.toString());
        assertEquals(AlarmState.NORMAL, stateOf(engine, AlarmKind.SILENT_UNIT_ID));
    }

    @Test
    void allButOneSensorStaleIsNotSilentUnderTheDefaultButIsUnderALowerShare() {
        List<String> allButOne = plant.sensors.keySet().stream().filter(id -> !id.equals("P_gen")).toList();
        AlarmEngine byDefault = engine(AlarmSettings.DEFAULTS);
        run(byDefault, 60, t -> staleSnapshot(t, allButOne));
        assertEquals(AlarmState.NORMAL, stateOf(byDefault, AlarmKind.SILENT_UNIT_ID));
        assertEquals(16, annunciated(byDefault, AlarmKind.STALE_SENSOR));

        // 16 of 17 is 0.941: at or above a share of 0.9.
        EnumMap<AlarmKind, AlarmDefinition> kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.SILENT_UNIT, AlarmSettings.SILENT_UNIT_DEFAULT.withLimit(0.9));
        AlarmEngine lower = engine(new AlarmSettings(kinds, Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT));
        List<AlarmEvent> events = flat(run(lower, 60, t -> staleSnapshot(t, allButOne)));
        assertEquals(List.of(AlarmKind.SILENT_UNIT_ID), events.stream().map(AlarmEvent::alarmId).toList());
        assertEquals(16.0 / 17.0, events.get(0).value().getAsDouble());
        assertEquals(0, annunciated(lower, AlarmKind.STALE_SENSOR));
    }

    @Test
    void staleAlarmAlreadyShownIsSuppressedWithAnEventWhenTheWholeUnitFallsSilent() {
        AlarmEngine engine = engine(AlarmSettings.DEFAULTS);
        run(engine, 60, t -> staleSnapshot(t, List.of("T_cold_reheat")));
        long shown = engine.alarms().stream().filter(a -> a.state().isAnnunciated()).count();
        List<List<AlarmEvent>> perSnapshot = run(engine, 60, this::allStale);
        List<AlarmEvent> events = flat(perSnapshot);
        // The silent alarm, then one suppress event per alarm the operator had in front of him.
        assertEquals(1 + shown, events.size(), events.toString());
        assertEquals(AlarmKind.SILENT_UNIT_ID, events.get(0).alarmId());
        for (AlarmEvent e : events.subList(1, events.size())) {
            assertEquals(AlarmStimulus.SUPPRESS, e.stimulus(), e.toString());
            assertEquals(Optional.of(AlarmEngine.SILENT_UNIT_REASON), e.note());
        }
        assertEquals(AlarmState.SUPPRESSED_BY_DESIGN, stateOf(engine, "stale:T_cold_reheat"));
    }

    @Test
    void endingAKindSuppressionWhileTheUnitIsSilentKeepsItsAlarmsSuppressed() {
        AlarmEngine engine = engine(AlarmSettings.DEFAULTS);
        engine.suppress(AlarmKind.STALE_SENSOR, "unit off line");
        run(engine, 60, this::allStale);
        assertEquals(List.of(), engine.endSuppression(AlarmKind.STALE_SENSOR));
        assertEquals(AlarmState.SUPPRESSED_BY_DESIGN, stateOf(engine, "stale:T_cold_reheat"));
        assertEquals(Optional.of(AlarmEngine.SILENT_UNIT_REASON),
                engine.alarm("stale:T_cold_reheat").orElseThrow().suppression());
    }

    @Test
    void restoredEngineKeepsTheUnitSilentAndCarriesOnAsTheSavedOne() {
        TestClock clockB = new TestClock();
        AlarmEngine a = engine(AlarmSettings.DEFAULTS);
        run(a, 60, this::allStale);
        AlarmEngineState state = a.state();
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED,
                state.alarms().stream().filter(r -> r.id().equals(AlarmKind.SILENT_UNIT_ID)).findFirst()
                        .orElseThrow().state());

        clockB.advance(java.time.Duration.between(TestClock.START, clock.instant()));
        AlarmEngine b = new AlarmEngine(plant.unit(), AlarmSettings.DEFAULTS, clockB);
        assertEquals(List.of(), b.restore(state));
        assertEquals(a.alarms(), b.alarms());
        for (int s = 0; s < 60; s++) {
            Snapshot snapshot = staleSnapshot(clock.instant(), List.of("T_cold_reheat"));
            assertEquals(a.evaluate(snapshot, model.evaluate(snapshot)), b.evaluate(snapshot, model.evaluate(snapshot)),
                    "second " + s);
            clock.seconds(1);
            clockB.seconds(1);
        }
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, stateOf(b, "stale:T_cold_reheat"));
    }

    @Test
    void stateSavedBeforeTheSilentAlarmExistedStillLoads() {
        AlarmEngine a = engine(AlarmSettings.DEFAULTS);
        run(a, 60, t -> staleSnapshot(t, List.of("T_cold_reheat")));
        AlarmEngineState full = a.state();
        AlarmEngineState old = new AlarmEngineState(full.unitId(), full.takenAt(),
                full.alarms().stream().filter(r -> r.kind() != AlarmKind.SILENT_UNIT).toList());

        AlarmEngine b = engine(AlarmSettings.DEFAULTS);
        assertEquals(List.of(), b.restore(old));
        assertEquals(AlarmState.NORMAL, stateOf(b, AlarmKind.SILENT_UNIT_ID));
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, stateOf(b, "stale:T_cold_reheat"));
    }

    @Test
    void silentShareAboveOneIsRefusedWithTheValue() {
        EnumMap<AlarmKind, AlarmDefinition> kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.SILENT_UNIT, AlarmSettings.SILENT_UNIT_DEFAULT.withLimit(1.5));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new AlarmSettings(kinds, Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT));
        assertEquals("silent_unit: the silent-unit limit is a share of the unit's sensors and must be at most 1"
                + " (all of them), was 1.5", e.getMessage());
    }
}
