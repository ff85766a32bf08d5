package org.steamtally.calc.cycle;

import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * Heat and work of one component. Sign convention: {@code heatInW} is positive into the working
 * fluid, {@code workOutW} positive out of it (a turbine's work is positive, a pump's negative, a
 * condenser's heat negative).
 *
 * <p>JSON (result record): {@code id, type, heat_in_W, work_out_W, isentropic_efficiency,
 * exergy_destruction_W, valid, reason}.
 */
public record ComponentResult(
        String id,
        String type,
        OptionalDouble heatInW,
        OptionalDouble workOutW,
        OptionalDouble isentropicEfficiency,
        OptionalDouble exergyDestructionW,
        boolean valid,
        Optional<String> reason) {

    public ComponentResult {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(type, "type");
        if (valid == reason.isPresent()) {
            throw new IllegalArgumentException("component " + id + ": a reason is given exactly when it is invalid");
        }
    }
}
