package org.steamtally.deploy.replay;

import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.cycle.UnitResult;

/** Computes one unit's result record from one snapshot of its sensors. */
@FunctionalInterface
public interface UnitEvaluator {

    /**
     * @param snapshot the unit's sensor values in SI, in the unit description's sensor order
     * @return the result record; invalid states and components carry their reason rather than
     *         making the call fail
     */
    UnitResult evaluate(Snapshot snapshot);
}
