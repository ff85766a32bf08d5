package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.signal.SignalCheck;
import org.steamtally.calc.signal.SignalReport;
import org.steamtally.calc.signal.SignalSettings;

/** The frozen-sensor and erratic-sensor alarms through the ISA-18.2 life cycle, on a clock the test moves. */
class SignalAlarmLifeCycleTest {

    private final TestClock clock = new TestClock();

    /** One reading of PT-1 at the clock's instant through the check and the engine. */
    private static List<AlarmEvent> feed(AlarmEngine engine, SignalCheck check, TestClock clock, double valuePa) {
        SignalReport r = check.check(Snapshot.allGood(clock.instant(), OneClosureUnit.UNIT, new double[] {valuePa}));
        return engine.evaluateSignals(r);
    }

    @Test
    void frozenSensorIsRaisedAtItsLimitAcknowledgedAndClearedAfterTheOffDelay() {
        AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), AlarmSettings.DEFAULTS, clock);
        SignalCheck check = AlarmEngine.signalCheck(OneClosureUnit.unit(), AlarmSettings.DEFAULTS, SignalSettings.DEFAULTS);
        for (int t = 0; t < 60; t++) {
            assertEquals(List.of(), feed(engine, check, clock, 10e6));
            clock.seconds(1);
        }
        // unchanged since the first reading 60 s ago: the default limit, and no on-delay
        List<AlarmEvent> on = feed(engine, check, clock, 10e6);
        assertEquals(1, on.size());
        AlarmEvent e = on.get(0);
        assertEquals("frozen:PT-1", e.alarmId());
        assertEquals(AlarmKind.FROZEN_SENSOR, e.kind());
        assertEquals(AlarmPriority.MEDIUM, e.priority());
        assertEquals(AlarmState.NORMAL, e.from());
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, e.to());
        assertEquals(60.0, e.value().getAsDouble());
        assertEquals(60.0, e.limit().getAsDouble());
        assertEquals("sensor PT-1 is frozen: unchanged for 60 s (limit 60 s)", e.text());

        AlarmEvent ack = engine.acknowledge("frozen:PT-1", "operator 7");
        assertEquals(AlarmState.ACTIVE_ACKNOWLEDGED, ack.to());

        // it moves again; the off-delay of 10 s must pass before the alarm clears
        double v = 10e6;
        for (int t = 0; t < 10; t++) {
            clock.seconds(1);
            v += 1000.0;
            assertEquals(List.of(), feed(engine, check, clock, v), "second " + t);
        }
        clock.seconds(1);
        List<AlarmEvent> off = feed(engine, check, clock, v + 1000.0);
        assertEquals(1, off.size());
        assertEquals(AlarmState.ACTIVE_ACKNOWLEDGED, off.get(0).from());
        assertEquals(AlarmState.NORMAL, off.get(0).to());
        assertEquals(AlarmStimulus.CONDITION_CLEARED, off.get(0).stimulus());
    }

    @Test
    void erraticSensorWaitsForItsOnDelayReturnsUnacknowledgedAndCanBeShelved() {
        // declared noise 1 kPa, window 5: expected successive-difference square 2e6 Pa²
        SignalSettings signal = SignalSettings.DEFAULTS.withWindow(5).withDeclaredNoise(Map.of("PT-1", 1000.0));
        var kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.FROZEN_SENSOR, AlarmSettings.FROZEN_DEFAULT.withEnabled(false));
        AlarmSettings settings = new AlarmSettings(kinds, Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT);
        AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), settings, clock);
        SignalCheck check = AlarmEngine.signalCheck(OneClosureUnit.unit(), settings, signal);
        double limit = signal.scatterQuantile();
        // ±40 kPa jumps: every difference is cut at 25 × 2e6 Pa², ratio 25, far above the limit (about 13)
        assertTrue(limit < 25.0, "limit " + limit);
        double sign = 1.0;
        // the window is full at the fifth reading (t = 4 s); the on-delay then runs to t = 9 s
        for (int t = 0; t < 4 + 5; t++) {
            sign = -sign;
            List<AlarmEvent> events = feed(engine, check, clock, 10e6 + sign * 20e3);
            assertEquals(List.of(), events, "second " + t + ": before the window is full and the 5 s on-delay has run");
            clock.seconds(1);
        }
        sign = -sign;
        List<AlarmEvent> on = feed(engine, check, clock, 10e6 + sign * 20e3);
        assertEquals(1, on.size(), on.toString());
        assertEquals("erratic:PT-1", on.get(0).alarmId());
        assertEquals(AlarmPriority.LOW, on.get(0).priority());
        assertEquals(25.0, on.get(0).value().getAsDouble(), 1e-6);
        assertEquals(limit, on.get(0).limit().getAsDouble(), 1e-12);
        assertTrue(on.get(0).text().startsWith("sensor PT-1 is erratic"), on.get(0).text());

        // quiet again: the window empties of the jumps, then the 30 s off-delay; not acknowledged,
        // so it returns unacknowledged
        AlarmEvent cleared = null;
        for (int t = 0; t < 60 && cleared == null; t++) {
            clock.seconds(1);
            for (AlarmEvent e : feed(engine, check, clock, 10e6 + (t % 2) * 1000.0)) {
                cleared = e;
            }
        }
        assertEquals(AlarmState.RETURNED_UNACKNOWLEDGED, cleared.to());
        assertEquals(AlarmState.SHELVED, engine.shelve("erratic:PT-1", Duration.ofHours(1), "operator 7",
                "transmitter being replaced").to());
    }

    @Test
    void aSignalReportOfAnotherUnitIsRefusedAndChangesNothing() {
        AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), AlarmSettings.DEFAULTS, clock);
        SignalReport other = new SignalReport(clock.instant(), "u2", List.of());
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> engine.evaluateSignals(other));
        assertTrue(e.getMessage().contains("u2"), e.getMessage());
        assertEquals(AlarmState.NORMAL, engine.alarm("frozen:PT-1").orElseThrow().state());
    }

    @Test
    void aPerSensorOverrideSetsThatSensorsFrozenLimitInTheCheckAndTheAlarm() {
        AlarmSettings settings = new AlarmSettings(AlarmSettings.defaultKinds(),
                Map.of("frozen:PT-1", AlarmSettings.FROZEN_DEFAULT.withLimit(900.0)), AlarmSettings.MAX_SHELVE_DEFAULT);
        SignalCheck check = AlarmEngine.signalCheck(OneClosureUnit.unit(), settings, SignalSettings.DEFAULTS);
        SignalReport r = check.check(OneClosureUnit.snapshot(clock.instant()));
        assertEquals(900.0, r.sensors().get(0).frozenLimitS());
    }
}
