package org.steamtally.calc.signal;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.time.InstantSource;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;

import org.junit.jupiter.api.Test;
import org.steamtally.calc.alarm.AlarmEngine;
import org.steamtally.calc.alarm.AlarmEvent;
import org.steamtally.calc.alarm.AlarmSettings;
import org.steamtally.calc.alarm.AlarmStimulus;
import org.steamtally.calc.fixture.RegenerativeExample;
import org.steamtally.calc.plant.UnitDescription;
import org.steamtally.calc.sim.Fault;
import org.steamtally.calc.sim.LoadProgram;
import org.steamtally.calc.sim.Simulator;
import org.steamtally.calc.sim.TruthModel;

/**
 * The signal check and its alarms on the simulated regenerative example (fernholm unit3): white noise
 * at each sensor's declared uncertainty, one snapshot per second on a clock the test moves.
 */
class SignalAlarmsOnTheSimulatedPlantTest {

    static final Instant T0 = Instant.parse("2026-12-02T06:00:00Z");

    private static final class StepClock implements InstantSource {
        Instant now = T0;

        @Override
        public Instant instant() {
            return now;
        }
    }

    /** Runs the simulator for {@code seconds} and returns the alarm events that went active after {@code from}. */
    static List<AlarmEvent> run(Simulator sim, int seconds, int from) {
        UnitDescription unit = RegenerativeExample.unit();
        StepClock clock = new StepClock();
        AlarmEngine engine = new AlarmEngine(unit, AlarmSettings.DEFAULTS, clock);
        SignalCheck check = AlarmEngine.signalCheck(unit, AlarmSettings.DEFAULTS, SignalSettings.DEFAULTS);
        List<AlarmEvent> raised = new ArrayList<>();
        for (int s = 0; s < seconds; s++) {
            clock.now = T0.plusSeconds(s);
            SignalReport report = check.check(sim.step(clock.now).snapshot());
            for (SensorSignal x : report.sensors()) {
                assertTrue(Double.isFinite(x.scatterRatio()) && Double.isFinite(x.frozenS()));
            }
            for (AlarmEvent e : engine.evaluateSignals(report)) {
                if (s >= from && e.stimulus() == AlarmStimulus.CONDITION_ACTIVE) {
                    raised.add(e);
                }
            }
        }
        return raised;
    }

    @Test
    void aFaultFreeHourWithALoadRampRaisesNoSignalAlarmSeed20261202() {
        // 15 min warm-up, then one hour in which the load falls from 100 % to 70 % over 10 minutes:
        // differences cancel the slow change, so nothing is raised. Seed 20261202; the rate this samples
        // is measured over days in docs/DETECTION.md.
        TruthModel truth = TruthModel.of(RegenerativeExample.unit(), RegenerativeExample.designPoint());
        Simulator sim = Simulator.builder(truth).seed(20261202L).load(new LoadProgram(1.0,
                List.of(new LoadProgram.Ramp(T0.plusSeconds(1800), Duration.ofMinutes(10), 0.7)))).build();
        List<AlarmEvent> raised = run(sim, 900 + 3600, 0);
        assertEquals(List.of(), raised.stream().map(AlarmEvent::text).toList());
    }

    @Test
    void stuckAndNoisySensorsAreNamedWhetherTheBalancesCanSeeThemOrNot() {
        // PT-101 is redundant in name only (checked share 0.00, docs/DETECTION.md); JT-602 weakly checked.
        TruthModel truth = TruthModel.of(RegenerativeExample.unit(), RegenerativeExample.designPoint());
        Instant start = T0.plusSeconds(1000);
        Duration d = Duration.ofSeconds(200);
        Simulator sim = Simulator.builder(truth).seed(7L)
                .fault(new Fault.Stuck("PT-101", start, d, OptionalDouble.empty()))
                .fault(new Fault.NoiseIncrease("JT-602", start, d, 3.0)).build();
        List<AlarmEvent> raised = run(sim, 1120, 0);
        assertEquals(List.of("erratic:JT-602", "frozen:PT-101"), raised.stream().map(AlarmEvent::alarmId).sorted().toList(),
                raised.toString());
        for (AlarmEvent e : raised) {
            long afterStart = Duration.between(start, e.time()).toSeconds();
            assertTrue(afterStart >= 0 && afterStart <= 60, e.alarmId() + " raised " + afterStart + " s after the start");
        }
    }
}
