package org.steamtally.deploy.daemon;

import java.util.concurrent.Semaphore;

/**
 * How many units may evaluate a snapshot at the same time: one per core by default.
 *
 * <p>Each unit evaluates on a thread of its own. Right after a start, before the JIT has compiled
 * the calculation, one evaluation costs tens of milliseconds instead of one, and a fleet of 100
 * units had 100 threads runnable at once: the compiler threads got one share in a hundred of the
 * cores, so compiling, and with it the start, dragged on for minutes (docs/PERFORMANCE.md, runs Z
 * and Z2). With one slot per core the units queue for a slot instead, the evaluations take the
 * same CPU in the same order, and the compiler and the store's writer are not crowded out. Once
 * the code is compiled an evaluation takes about a millisecond and the slots hardly hold anyone
 * up. The slots are fair: units get them in the order they asked.
 */
final class EvaluationSlots {

    private final int slots;
    private final Semaphore permits;

    /** @param slots evaluations at the same time, at least 1 */
    EvaluationSlots(int slots) {
        if (slots < 1) {
            throw new IllegalArgumentException("evaluation slots " + slots + ": expected at least 1");
        }
        this.slots = slots;
        this.permits = new Semaphore(slots, true);
    }

    /** One slot per core the JVM may use. */
    static EvaluationSlots perCore() {
        return new EvaluationSlots(Runtime.getRuntime().availableProcessors());
    }

    /** As many slots as there could be units: nobody waits (tests of one unit, tools). */
    static EvaluationSlots unlimited() {
        return new EvaluationSlots(Integer.MAX_VALUE);
    }

    /** Waits for a slot. Not interruptible: a slot is held for an evaluation only, never for I/O. */
    void acquire() {
        permits.acquireUninterruptibly();
    }

    void release() {
        permits.release();
    }

    int slots() {
        return slots;
    }

    /** Slots free now. */
    int free() {
        return permits.availablePermits();
    }
}
