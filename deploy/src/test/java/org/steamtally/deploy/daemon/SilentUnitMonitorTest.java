package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.time.Instant;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.steamtally.calc.alarm.AlarmEngine;
import org.steamtally.calc.alarm.AlarmEngineState;
import org.steamtally.calc.alarm.AlarmKind;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.alarm.AlarmState;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.PlantDescription;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;
import org.steamtally.dashboard.alarm.AlarmView;
import org.steamtally.dashboard.store.StoredAlarmEvent;

/**
 * The regenerative example's unit going silent in the daemon's pipeline, in simulated time: one
 * alarm in the store and on the board instead of one per sensor, state and component, and the same
 * after a restart from the saved alarm state.
 */
class SilentUnitMonitorTest {

    private static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");

    @TempDir
    Path dataDir;

    /** Feeds one snapshot a simulated second for {@code seconds}, waiting for each to be processed. */
    private static void run(UnitMonitorTest.Rig rig, Simulator sim, UnitMonitorTest.StepClock clock, Instant from,
                            int seconds, boolean silent) throws InterruptedException {
        for (int i = 0; i < seconds; i++) {
            Instant t = from.plusSeconds(i);
            clock.set(t);
            long before = rig.monitor().processed();
            Snapshot s = sim.step(t).snapshot();
            if (silent) {
                Snapshot.SensorStatus[] status = new Snapshot.SensorStatus[s.status().length];
                Arrays.fill(status, Snapshot.SensorStatus.STALE);
                s = new Snapshot(t, s.unitId(), s.valuesSi(), status);
            }
            rig.queue().add(s);
            UnitMonitorTest.awaitProcessed(rig.monitor(), before + 1);
        }
    }

    private static AlarmState stateOf(UnitMonitor m, String id) {
        return m.alarms().stream().filter(a -> a.id().equals(id)).findFirst().orElseThrow().state();
    }

    @Test
    void silentUnitStoresOneAlarmEventShowsOneAlarmAndStaysSilentAfterARestart() throws Exception {
        PlantDescription plant = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText()).plant();
        UnitDescription unit = plant.units().get(0);
        int sensors = unit.sensors().size();
        UnitMonitorTest.StepClock clock = new UnitMonitorTest.StepClock();
        Simulator sim = Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(17).build();

        UnitMonitorTest.Rig first = UnitMonitorTest.rig(plant, clock, dataDir);
        first.monitor().start();
        EngineAlarmBoard board = new EngineAlarmBoard(List.of(first.monitor()));
        run(first, sim, clock, T0, 10, false);
        int before = first.store().alarmEvents.size();
        run(first, sim, clock, T0.plusSeconds(10), 30, true);

        List<StoredAlarmEvent> stored = first.store().alarmEvents.subList(before, first.store().alarmEvents.size());
        assertEquals(List.of(AlarmKind.SILENT_UNIT_ID), stored.stream().map(StoredAlarmEvent::alarmId).toList(),
                "one event for a silent unit of " + sensors + " sensors");
        List<AlarmView> shown = board.list(unit.id()).stream().filter(v -> v.state() == AlarmView.State.UNACKNOWLEDGED)
                .toList();
        assertEquals(1, shown.size(), shown.toString());
        assertEquals(EngineAlarmBoard.boardId(unit.id(), AlarmKind.SILENT_UNIT_ID), shown.get(0).id());
        assertEquals("unit " + unit.id() + " is silent: no good reading from " + sensors + " of " + sensors
                + " sensors within their max age (limit: a share of 1 of its sensors)", shown.get(0).message());
        assertTrue(first.monitor().alarms().stream().filter(a -> a.kind() == AlarmKind.STALE_SENSOR)
                .allMatch(a -> a.state() == AlarmState.SUPPRESSED_BY_DESIGN));
        first.monitor().close();

        // A new monitor on the same data directory, as after a kill and restart.
        UnitMonitorTest.Rig second = UnitMonitorTest.rig(plant, clock, dataDir);
        second.monitor().start();
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, stateOf(second.monitor(), AlarmKind.SILENT_UNIT_ID));
        assertTrue(second.monitor().alarms().stream().filter(a -> a.kind() == AlarmKind.STALE_SENSOR)
                .allMatch(a -> a.state() == AlarmState.SUPPRESSED_BY_DESIGN));

        // The unit reports again: the silent alarm returns, nothing else was ever shown.
        run(second, sim, clock, T0.plusSeconds(40), 20, false);
        assertEquals(List.of(AlarmKind.SILENT_UNIT_ID), second.store().alarmEvents.stream()
                .map(StoredAlarmEvent::alarmId).toList());
        assertEquals(AlarmState.RETURNED_UNACKNOWLEDGED, stateOf(second.monitor(), AlarmKind.SILENT_UNIT_ID));
        assertTrue(second.monitor().alarms().stream().filter(a -> a.kind() != AlarmKind.SILENT_UNIT)
                .noneMatch(a -> a.state().isAnnunciated()), second.monitor().alarms().toString());
        second.monitor().close();
    }

    /** Evaluates {@code seconds} snapshots from {@code T0 + from} with every sensor stale. */
    private static int quiet(AlarmEngine engine, org.steamtally.calc.cycle.CycleModel model, Simulator sim,
                             UnitMonitorTest.StepClock clock, int from, int seconds) {
        int events = 0;
        for (int i = from; i < from + seconds; i++) {
            Instant t = T0.plusSeconds(i);
            clock.set(t);
            Snapshot s = sim.step(t).snapshot();
            Snapshot.SensorStatus[] status = new Snapshot.SensorStatus[s.status().length];
            Arrays.fill(status, Snapshot.SensorStatus.STALE);
            Snapshot silent = new Snapshot(t, s.unitId(), s.valuesSi(), status);
            events += engine.evaluate(silent, model.evaluate(silent)).size();
        }
        return events;
    }

    @Test
    void stateFileWithTheSilentAlarmRoundTripsAndOneWrittenBeforeItExistedStillLoads() throws Exception {
        PlantDescription plant = DaemonConfigFiles.parse("regenerative.yaml", Demo.exampleText()).plant();
        UnitDescription unit = plant.units().get(0);
        UnitMonitorTest.StepClock clock = new UnitMonitorTest.StepClock();
        AlarmEngine engine = new AlarmEngine(unit, AlarmSettings.DEFAULTS, clock);
        Simulator sim = Simulator.builder(TruthModel.of(unit, ExampleDesignPoints.regenerative())).seed(19).build();
        var model = org.steamtally.calc.cycle.CycleModel.compile(plant.siteId(), unit);
        assertEquals(1, quiet(engine, model, sim, clock, 0, 30));
        AlarmEngineState state = engine.state();
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, engine.alarm(AlarmKind.SILENT_UNIT_ID).orElseThrow().state());

        AlarmStateFile file = new AlarmStateFile(dataDir, unit.id());
        file.save(state);
        assertEquals(state, file.load().orElseThrow());

        // As the daemon wrote it before the silent-unit alarm existed: no record of it, and a stale
        // alarm for every sensor of the quiet unit.
        var kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.SILENT_UNIT, AlarmSettings.SILENT_UNIT_DEFAULT.withEnabled(false));
        AlarmEngine before = new AlarmEngine(unit, new AlarmSettings(kinds, java.util.Map.of(),
                AlarmSettings.MAX_SHELVE_DEFAULT), clock);
        // Without it, the flood: a stale alarm per sensor, an invalid alarm per state and component.
        assertEquals(unit.sensors().size() + unit.states().size() + unit.components().size(),
                quiet(before, model, sim, clock, 30, 30));
        AlarmEngineState old = before.state();
        assertTrue(old.alarms().stream().noneMatch(r -> r.kind() == AlarmKind.SILENT_UNIT));
        AlarmStateFile oldFile = new AlarmStateFile(dataDir, unit.id(), "old");
        oldFile.save(old);

        AlarmEngine restored = new AlarmEngine(unit, AlarmSettings.DEFAULTS, clock);
        assertEquals(List.of(), restored.restore(oldFile.load().orElseThrow()));
        assertEquals(AlarmState.NORMAL, restored.alarm(AlarmKind.SILENT_UNIT_ID).orElseThrow().state());
        assertEquals(unit.sensors().size(), restored.alarms().stream()
                .filter(a -> a.kind() == AlarmKind.STALE_SENSOR && a.state().isAnnunciated()).count());
        // Still quiet: the silent alarm rises and takes the stale alarms off the operator's list.
        quiet(restored, model, sim, clock, 60, 10);
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, restored.alarm(AlarmKind.SILENT_UNIT_ID).orElseThrow().state());
        assertEquals(0, restored.alarms().stream()
                .filter(a -> a.kind() == AlarmKind.STALE_SENSOR && a.state().isAnnunciated()).count());
    }
}
