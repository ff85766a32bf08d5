package org.steamtally.deploy.props;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvFileSource;

class ShortestDecimalTest {

    @ParameterizedTest
    @CsvFileSource(resources = "shortest-decimal.csv", numLinesToSkip = 1)
    void formatGivesThePublishedShortestDecimal(String input, String expected) {
        assertEquals(expected, ShortestDecimal.format(Double.parseDouble(input)));
    }

    @Test
    void formattedValuesReadBackToTheSameDoubleAndAreNeverLongerThanDoubleToString() {
        // A fixed seed keeps the run reproducible; 20 000 random bit patterns cover all exponents.
        SplittableRandom random = new SplittableRandom(20_240_611L);
        for (int i = 0; i < 20_000; i++) {
            double value = Double.longBitsToDouble(random.nextLong());
            if (!Double.isFinite(value)) {
                continue;
            }
            String text = ShortestDecimal.format(value);
            assertEquals(value, Double.parseDouble(text), text);
            assertTrue(text.length() <= Double.toString(value).length(), text + " vs " + Double.toString(value));
        }
    }
}
