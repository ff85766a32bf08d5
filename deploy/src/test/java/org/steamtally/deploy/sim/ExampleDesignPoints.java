package org.steamtally.deploy.sim;

import org.steamtally.calc.sim.DesignPoint;

/**
 * The design points of the three shipped example units, as the main code holds them
 * ({@link org.steamtally.deploy.daemon.ExampleDesignPoints}), under the names the tests use.
 */
final class ExampleDesignPoints {

    private ExampleDesignPoints() {
    }

    static DesignPoint simple() {
        return org.steamtally.deploy.daemon.ExampleDesignPoints.simple();
    }

    static DesignPoint reheat() {
        return org.steamtally.deploy.daemon.ExampleDesignPoints.reheat();
    }

    static DesignPoint regenerative() {
        return org.steamtally.deploy.daemon.ExampleDesignPoints.regenerative();
    }
}
