package org.steamtally.deploy.daemon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;

/** The daemon's evaluation slots: no more units evaluate at once than there are slots, and none is lost. */
class EvaluationSlotsTest {

    @Test
    void noMoreThanTheSlotsHoldAtOnceAndEveryWaiterGetsItsTurn() throws Exception {
        EvaluationSlots slots = new EvaluationSlots(2);
        AtomicInteger inside = new AtomicInteger();
        AtomicInteger most = new AtomicInteger();
        CountDownLatch release = new CountDownLatch(1);
        CountDownLatch done = new CountDownLatch(6);
        List<Thread> units = new ArrayList<>();
        for (int u = 0; u < 6; u++) {
            Thread t = new Thread(() -> {
                slots.acquire();
                try {
                    most.accumulateAndGet(inside.incrementAndGet(), Math::max);
                    release.await();
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                } finally {
                    inside.decrementAndGet();
                    slots.release();
                    done.countDown();
                }
            });
            t.start();
            units.add(t);
        }
        // both slots taken (polling with a deadline, not sleeping for time to pass)
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (slots.free() > 0 && System.nanoTime() < deadline) {
            Thread.onSpinWait();
        }
        assertEquals(0, slots.free(), "both slots held");
        assertEquals(2, inside.get(), "the other four wait");
        release.countDown();
        assertTrue(done.await(10, TimeUnit.SECONDS), "every unit had its turn");
        assertEquals(2, most.get(), "never more than two at once");
        assertEquals(2, slots.free());
    }

    @Test
    void noSlotIsRefusedWithTheValue() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> new EvaluationSlots(0));
        assertTrue(e.getMessage().contains("0"), e.getMessage());
    }

    @Test
    void aDaemonGetsOneSlotPerCore() {
        assertEquals(Runtime.getRuntime().availableProcessors(), EvaluationSlots.perCore().slots());
    }
}
