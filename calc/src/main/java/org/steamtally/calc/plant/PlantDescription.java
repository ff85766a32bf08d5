package org.steamtally.calc.plant;

import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * One site and its generating units, as declared in a plant-description file.
 *
 * @param siteId                the site's id, used in topics and store tags
 * @param siteName              a display name
 * @param atmosphericPressurePa the site's atmospheric pressure, Pa, for gauge-pressure readings
 * @param units                 the generating units
 */
public record PlantDescription(String siteId, String siteName, double atmosphericPressurePa,
                               List<UnitDescription> units) {

    public PlantDescription {
        Objects.requireNonNull(siteId, "siteId");
        Objects.requireNonNull(siteName, "siteName");
        units = List.copyOf(units);
        if (!(atmosphericPressurePa > 50e3 && atmosphericPressurePa < 110e3)) {
            throw new IllegalArgumentException("atmospheric pressure must lie within 50 kPa to 110 kPa, was "
                    + atmosphericPressurePa + " Pa");
        }
    }

    public Optional<UnitDescription> unit(String unitId) {
        return units.stream().filter(u -> u.id().equals(unitId)).findFirst();
    }
}
