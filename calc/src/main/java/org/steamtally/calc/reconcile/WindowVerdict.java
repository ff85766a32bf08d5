package org.steamtally.calc.reconcile;

import java.util.Objects;
import java.util.Optional;
import org.steamtally.calc.cycle.UnitResult;

/**
 * What the window gave for one snapshot: the result record of its mean, or the reason it withheld
 * its verdict (the window was not representative, {@link WindowRule}) and ran no reconciliation.
 *
 * @param result   the mean's result record; empty when withheld
 * @param withheld why no verdict was given; empty when {@code result} is present
 */
public record WindowVerdict(Optional<UnitResult> result, Optional<String> withheld) {

    public WindowVerdict {
        Objects.requireNonNull(result, "result");
        Objects.requireNonNull(withheld, "withheld");
        if (result.isPresent() == withheld.isPresent()) {
            throw new IllegalArgumentException("a window verdict has either a result or a reason it was withheld, got "
                    + (result.isPresent() ? "both" : "neither"));
        }
    }

    static WindowVerdict of(UnitResult result) {
        return new WindowVerdict(Optional.of(result), Optional.empty());
    }

    static WindowVerdict withheld(String reason) {
        return new WindowVerdict(Optional.empty(), Optional.of(reason));
    }

    /** Whether the verdict was withheld. */
    public boolean isWithheld() {
        return withheld.isPresent();
    }
}
