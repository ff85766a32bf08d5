package org.steamtally.deploy.replay;

import org.steamtally.calc.plant.UnitDescription;

/** Prepares the evaluator of one unit once, before its snapshots arrive. */
@FunctionalInterface
public interface UnitEvaluatorFactory {

    /**
     * @param siteId the site the unit belongs to, written into each result record
     * @param unit   the unit's description
     * @throws IllegalArgumentException when the unit cannot be evaluated as described; the message says why
     */
    UnitEvaluator compile(String siteId, UnitDescription unit);
}
