package org.steamtally.calc.steam;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.lang.reflect.Method;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.util.Random;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The generated straight-line sums against the table-driven {@link PowerSeries} they were written
 * from. Both do the same floating-point operations in the same order, so they agree exactly.
 */
class GeneratedSumsTest {

    /** Seeded, so that a failure can be reproduced. */
    private static final long SEED = 20240611L;
    private static final int POINTS = 2000;

    static Stream<Arguments> units() {
        return SumsSourceGenerator.units().stream().map(unit -> Arguments.of(unit.className(), unit));
    }

    static Stream<Arguments> entries() {
        return SumsSourceGenerator.units().stream().flatMap(unit -> unit.entries().stream()
                .map(entry -> Arguments.of(unit.className() + "." + entry.method(), unit, entry)));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("units")
    void committedSourceIsWhatTheGeneratorWritesFromTheTables(String className, SumsSourceGenerator.Unit unit)
            throws IOException {
        String committed = Files.readString(
                SumsSourceGenerator.SOURCE_DIRECTORY.resolve(className + ".java"), StandardCharsets.UTF_8);
        assertEquals(SumsSourceGenerator.source(unit), committed,
                className + ".java is out of date: run SumsSourceGenerator");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("entries")
    void generatedSumEqualsTheTableDrivenSumExactly(String name, SumsSourceGenerator.Unit unit,
                                                    SumsSourceGenerator.Entry entry) throws Exception {
        Class<?> type = Class.forName("org.steamtally.calc.steam." + unit.className());
        Method method = entry.singleArgument()
                ? type.getDeclaredMethod(entry.method(), double.class)
                : type.getDeclaredMethod(entry.method(), double.class, double.class);
        Random random = new Random(SEED);
        for (int k = 0; k < POINTS; k++) {
            // Magnitudes from 0.25 to 2.5 of either sign: every power of every table stays finite
            // and non-zero, so each term of the comparison is exercised.
            double x = sample(random);
            double y = sample(random);
            double expected = entry.series().sum(x, y);
            double actual = entry.singleArgument()
                    ? (double) method.invoke(null, y)
                    : (double) method.invoke(null, x, y);
            assertEquals(expected, actual, 0.0, name + " at x = " + x + ", y = " + y);
        }
    }

    private static double sample(Random random) {
        double magnitude = 0.25 + 2.25 * random.nextDouble();
        return random.nextBoolean() ? magnitude : -magnitude;
    }
}
