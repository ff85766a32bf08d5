package org.steamtally.deploy.replay;

import java.util.Objects;
import org.steamtally.calc.reconcile.ReconcilingEvaluator;
import org.steamtally.collector.units.Units;
import org.steamtally.deploy.config.PlantDescriptionLoader;

/**
 * What {@code replay} needs from the rest of steamtally: the plant-description loader, the
 * engineering-unit conversion and the cycle evaluator. Tests pass fakes; {@link #standard()} wires
 * the real ones.
 *
 * @param plantSource      reads {@code --config}
 * @param unitConverter    engineering unit to SI
 * @param evaluatorFactory one evaluator per unit
 */
public record ReplaySeams(PlantSource plantSource, UnitConverter unitConverter, UnitEvaluatorFactory evaluatorFactory) {

    public ReplaySeams {
        Objects.requireNonNull(plantSource, "plantSource");
        Objects.requireNonNull(unitConverter, "unitConverter");
        Objects.requireNonNull(evaluatorFactory, "evaluatorFactory");
    }

    /**
     * The plant-description loader of {@code deploy.config}, the unit table of
     * {@code collector.units} (gauge units with the site's atmospheric pressure) and the cycle model
     * with the reconciliation of {@code calc.reconcile}, one full result record per snapshot.
     */
    public static ReplaySeams standard() {
        return new ReplaySeams(
                PlantDescriptionLoader::load,
                (quantity, unit, value, atmosphericPa) -> Units.parse(unit, quantity).toSi(value, atmosphericPa),
                (siteId, unit) -> ReconcilingEvaluator.compile(siteId, unit)::evaluate);
    }
}
