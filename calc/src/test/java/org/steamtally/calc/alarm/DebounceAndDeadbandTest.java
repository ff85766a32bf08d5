package org.steamtally.calc.alarm;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.Random;

import org.junit.jupiter.api.Test;

/**
 * The deadband and the on/off delays keep a closure alarm from chattering on a noisy |z| near its
 * limit. One evaluation per simulated second, as the daemon runs at 1 Hz.
 */
class DebounceAndDeadbandTest {

    private static final long SEED = 20261202L;

    private static AlarmSettings closure(AlarmDefinition d) {
        var kinds = AlarmSettings.defaultKinds();
        kinds.put(AlarmKind.CLOSURE, d);
        return new AlarmSettings(kinds, Map.of(), AlarmSettings.MAX_SHELVE_DEFAULT);
    }

    /** Feeds z values, one per second; returns how often the alarm became active. */
    private static int activations(AlarmDefinition d, double[] z) {
        TestClock clock = new TestClock();
        AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), closure(d), clock);
        int count = 0;
        for (double value : z) {
            for (AlarmEvent e : OneClosureUnit.feed(engine, clock, value)) {
                if (e.stimulus() == AlarmStimulus.CONDITION_ACTIVE) {
                    count++;
                }
            }
            clock.seconds(1);
        }
        return count;
    }

    /** An hour of z hovering at the limit: mean 3, standard deviation 0.2, independent draws. */
    private static double[] noisyAtTheLimit() {
        Random random = new Random(SEED);
        double[] z = new double[3600];
        for (int i = 0; i < z.length; i++) {
            z[i] = 3.0 + 0.2 * random.nextGaussian();
        }
        return z;
    }

    @Test
    void noisyValueAtTheLimitChattersWithoutDeadbandAndDelays() {
        AlarmDefinition bare = AlarmSettings.CLOSURE_DEFAULT.withDeadband(0.0).withDelays(Duration.ZERO, Duration.ZERO);
        int count = activations(bare, noisyAtTheLimit());
        // About half the draws lie above 3 and the rest below, so the alarm toggles on roughly every
        // other snapshot: some 900 activations an hour (seed in SEED).
        assertTrue(count > 600, "seed " + SEED + ": " + count + " activations");
    }

    @Test
    void noisyValueAtTheLimitRaisesOneAlarmWithTheDefaults() {
        // Clearing needs z below 2.5, 2.5 standard deviations under the mean, for 30 s in a row:
        // that does not happen within the hour.
        assertEquals(1, activations(AlarmSettings.CLOSURE_DEFAULT, noisyAtTheLimit()), "seed " + SEED);
    }

    @Test
    void deadbandAloneStopsToggleOnValuesEitherSideOfTheLimit() {
        double[] z = new double[100];
        for (int i = 0; i < z.length; i++) {
            z[i] = i % 2 == 0 ? 3.1 : 2.9;
        }
        AlarmDefinition noDelays = AlarmSettings.CLOSURE_DEFAULT.withDelays(Duration.ZERO, Duration.ZERO);
        assertEquals(50, activations(noDelays.withDeadband(0.0), z));
        assertEquals(1, activations(noDelays, z));
    }

    @Test
    void onDelayIgnoresAnExcursionShorterThanItself() {
        // 9 s above the limit, then back: with a 10 s on-delay nothing is raised.
        double[] z = new double[60];
        for (int i = 10; i < 19; i++) {
            z[i] = 4.0;
        }
        assertEquals(0, activations(AlarmSettings.CLOSURE_DEFAULT, z));
        z[19] = 4.0;
        // Ten snapshots, 9 s apart from first to last: still short of 10 s.
        assertEquals(0, activations(AlarmSettings.CLOSURE_DEFAULT, z));
        z[20] = 4.0;
        assertEquals(1, activations(AlarmSettings.CLOSURE_DEFAULT, z));
    }

    @Test
    void alarmIsRaisedExactlyWhenTheConditionHasHeldForTheOnDelay() {
        TestClock clock = new TestClock();
        AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), AlarmSettings.DEFAULTS, clock);
        assertEquals(List.of(), OneClosureUnit.feed(engine, clock, 4.0));
        clock.advance(Duration.ofMillis(9_999));
        assertEquals(List.of(), OneClosureUnit.feed(engine, clock, 4.0));
        clock.advance(Duration.ofMillis(1));
        List<AlarmEvent> events = OneClosureUnit.feed(engine, clock, 4.0);
        assertEquals(1, events.size());
        AlarmEvent e = events.get(0);
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, e.to());
        assertEquals(4.0, e.value().getAsDouble());
        assertEquals(3.0, e.limit().getAsDouble());
        assertEquals(AlarmPriority.MEDIUM, e.priority());
    }

    @Test
    void offDelayKeepsTheAlarmThroughAShortDipAndClearsAfterIt() {
        TestClock clock = new TestClock();
        AlarmEngine engine = new AlarmEngine(OneClosureUnit.unit(), AlarmSettings.DEFAULTS, clock);
        for (int s = 0; s <= 10; s++) {
            OneClosureUnit.feed(engine, clock, 4.0);
            clock.seconds(1);
        }
        assertEquals(AlarmState.ACTIVE_UNACKNOWLEDGED, engine.alarm(OneClosureUnit.CLOSURE).orElseThrow().state());
        // 29 s below the deadband, then above again: the alarm never returned.
        for (int s = 0; s < 30; s++) {
            assertEquals(List.of(), OneClosureUnit.feed(engine, clock, 1.0));
            clock.seconds(1);
        }
        assertEquals(List.of(), OneClosureUnit.feed(engine, clock, 4.0));
        // Now clear for the full 30 s.
        List<AlarmEvent> cleared = List.of();
        for (int s = 0; s <= 30 && cleared.isEmpty(); s++) {
            clock.seconds(1);
            cleared = OneClosureUnit.feed(engine, clock, 1.0);
        }
        assertEquals(AlarmState.RETURNED_UNACKNOWLEDGED, cleared.get(0).to());
    }

    @Test
    void negativeZAlarmsLikePositive() {
        AlarmDefinition noDelays = AlarmSettings.CLOSURE_DEFAULT.withDelays(Duration.ZERO, Duration.ZERO);
        assertEquals(1, activations(noDelays, new double[] {0.0, -3.5, -3.4}));
    }
}
