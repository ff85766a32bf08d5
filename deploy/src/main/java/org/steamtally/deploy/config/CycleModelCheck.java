package org.steamtally.deploy.config;

import java.util.List;
import java.util.function.Function;
import org.steamtally.calc.cycle.CycleModel;
import org.steamtally.calc.cycle.CycleModelException;
import org.steamtally.calc.plant.UnitDescription;

/**
 * Whether the cycle model can be built for a unit that the structural validator passed, and where
 * in the unit's description each problem lies, so that the loader can give it the file line of the
 * sensor, state or component concerned like any other problem of the file.
 */
final class CycleModelCheck {

    private CycleModelCheck() {
    }

    /** The problems of building the unit's cycle model; empty when it builds. */
    static List<CycleModelException.Problem> problems(String siteId, UnitDescription unit) {
        try {
            CycleModel.compile(siteId, unit);
            return List.of();
        } catch (CycleModelException e) {
            return e.located();
        } catch (RuntimeException e) {
            // A description the model fails on in some other way is still the file's problem to
            // show, at the unit, never a stack trace.
            return List.of(new CycleModelException.Problem(CycleModelException.Element.UNIT, unit.id(),
                    "the cycle model of unit \"" + unit.id() + "\" cannot be built: " + e));
        }
    }

    /**
     * The problem's place as a path over the plant description's records, in the validator's form
     * ({@code units[0].states[3]}), or the unit's own path when the element is not found.
     */
    static String path(int unitIndex, UnitDescription unit, CycleModelException.Problem problem) {
        String base = "units[" + unitIndex + "]";
        return switch (problem.element()) {
            case UNIT -> base;
            case SENSOR -> entry(base, "sensors", unit.sensors(), s -> s.id(), problem.id());
            case STATE -> entry(base, "states", unit.states(), s -> s.id(), problem.id());
            case COMPONENT -> entry(base, "components", unit.components(), c -> c.id(), problem.id());
        };
    }

    private static <T> String entry(String base, String list, List<T> items, Function<T, String> id, String wanted) {
        for (int i = 0; i < items.size(); i++) {
            if (id.apply(items.get(i)).equals(wanted)) {
                return base + "." + list + "[" + i + "]";
            }
        }
        return base;
    }
}
