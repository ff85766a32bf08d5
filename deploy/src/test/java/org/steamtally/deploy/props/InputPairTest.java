package org.steamtally.deploy.props;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.junit.jupiter.params.provider.ValueSource;

class InputPairTest {

    @ParameterizedTest
    @EnumSource(InputPair.class)
    void everyPairIsFoundByItsLabel(InputPair pair) {
        assertEquals(pair, InputPair.fromLabel(pair.label()));
    }

    @Test
    void labelsAreTheSixPairsInColumnSymbols() {
        assertEquals("p,T p,h p,s h,s p,x T,x", String.join(" ", new InputPair.Labels()));
    }

    @ParameterizedTest
    @ValueSource(strings = {"P,T", "p,t", "T,p", "pT", "p, T", ""})
    void labelsOtherThanTheSixAreRefused(String label) {
        assertThrows(IllegalArgumentException.class, () -> InputPair.fromLabel(label));
    }
}
