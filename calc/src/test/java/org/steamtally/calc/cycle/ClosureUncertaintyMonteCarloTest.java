package org.steamtally.calc.cycle;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.steamtally.calc.plant.Sensor;

/**
 * The first-order uncertainty u(r) of every closure residual (GUM, ISO/IEC Guide 98-3, eq. 10)
 * against a Monte Carlo propagation of the same inputs in the manner of GUM Supplement 1
 * (JCGM 101:2008): every sensor and every declared constant drawn from a normal distribution with
 * its standard uncertainty, the whole evaluation repeated, and the standard deviation of the
 * residual taken.
 */
class ClosureUncertaintyMonteCarloTest {

    private static final long SEED = 20_260_301L;
    private static final int DRAWS = 20_000;
    /**
     * 5 %: the Monte Carlo standard deviation from 20,000 draws has a relative standard error of
     * about 1/sqrt(2 × 20,000) = 0.5 %, and the model is close to linear over a few standard
     * uncertainties, so a correct first-order u(r) lands well inside; a missing or doubled
     * sensitivity would not.
     */
    private static final double RELATIVE_TOLERANCE = 0.05;

    static Stream<Arguments> units() {
        return Stream.of(Arguments.of("reheat", ExampleUnits.reheat()),
                Arguments.of("regenerative", ExampleUnits.regenerative()));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("units")
    void firstOrderUncertaintyAgreesWithMonteCarloPropagation(String name, UnitBuilder unit) {
        CycleModel model = unit.model();
        UnitResult nominal = model.evaluate(unit.snapshot());
        List<ClosureResult> closures = nominal.closure();
        assertTrue(closures.size() >= 2, closures.toString());
        double[] x0 = unit.values();
        List<Sensor> sensors = unit.unit().sensors();
        int constants = model.constantCount();
        double[] c0 = new double[constants];
        for (int k = 0; k < constants; k++) {
            c0[k] = model.constantValue(k);
        }
        SplittableRandom random = new SplittableRandom(SEED);
        double[] sum = new double[closures.size()];
        double[] sumSquares = new double[closures.size()];
        double[] x = new double[x0.length];
        for (int draw = 0; draw < DRAWS; draw++) {
            for (int i = 0; i < x.length; i++) {
                x[i] = x0[i] + sensors.get(i).standardUncertaintySi() * gaussian(random);
            }
            for (int k = 0; k < constants; k++) {
                model.setConstantValue(k, c0[k] + model.constantUncertainty(k) * gaussian(random));
            }
            UnitResult r = model.evaluate(Snapshot.allGood(UnitBuilder.TIME, unit.unit().id(), x.clone()));
            for (int k = 0; k < closures.size(); k++) {
                double residual = Results.closure(r, closures.get(k).id()).residualW();
                sum[k] += residual;
                sumSquares[k] += residual * residual;
            }
        }
        for (int k = 0; k < closures.size(); k++) {
            double mean = sum[k] / DRAWS;
            double sd = Math.sqrt((sumSquares[k] - DRAWS * mean * mean) / (DRAWS - 1));
            double u = closures.get(k).sigmaW();
            assertEquals(sd, u, RELATIVE_TOLERANCE * sd,
                    name + " " + closures.get(k).id() + ": Monte Carlo sd " + sd + " W, first-order u " + u
                            + " W (seed " + SEED + ")");
        }
    }

    /** A standard normal deviate by the Box–Muller transform. */
    private static double gaussian(SplittableRandom random) {
        double u1 = 1.0 - random.nextDouble();
        double u2 = random.nextDouble();
        return Math.sqrt(-2.0 * Math.log(u1)) * Math.cos(2.0 * Math.PI * u2);
    }
}
