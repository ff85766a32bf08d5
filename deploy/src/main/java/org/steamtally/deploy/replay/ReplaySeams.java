package org.steamtally.deploy.replay;

import java.util.Objects;
import java.util.Optional;
import java.util.ServiceLoader;

/**
 * What {@code replay} needs from the rest of steamtally: the plant-description loader, the
 * engineering-unit conversion and the cycle evaluator.
 *
 * <p>A build provides them through one {@link Provider} listed in
 * {@code META-INF/services/org.steamtally.deploy.replay.ReplaySeams$Provider}; without one,
 * {@code replay} says so and exits with status 2.
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

    /** The seams of this build, if a provider is installed. */
    public static Optional<ReplaySeams> installed() {
        return ServiceLoader.load(Provider.class).findFirst().map(Provider::seams);
    }

    /** Supplies the seams; found through {@link ServiceLoader}. */
    public interface Provider {
        ReplaySeams seams();
    }
}
