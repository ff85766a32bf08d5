package org.steamtally.calc.plant;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.function.Function;
import java.util.stream.Collectors;

/**
 * One generating unit: its instruments, the states of its cycle, and its components. Built by the
 * plant-description loader after validation, so the references between them are known to resolve.
 *
 * @param id         unit id, unique within the site, e.g. {@code "unit1"}
 * @param name       a display name
 * @param sensors    the unit's sensors, in declaration order
 * @param states     the cycle's states, in declaration order (cycle order, for diagrams)
 * @param components the components, in declaration order
 * @param deadState  the environment for exergy
 */
public record UnitDescription(String id, String name, List<Sensor> sensors, List<StateDefinition> states,
                              List<Component> components, DeadState deadState) {

    public UnitDescription {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(name, "name");
        sensors = List.copyOf(sensors);
        states = List.copyOf(states);
        components = List.copyOf(components);
        Objects.requireNonNull(deadState, "deadState");
    }

    public Optional<Sensor> sensor(String sensorId) {
        return sensors.stream().filter(s -> s.id().equals(sensorId)).findFirst();
    }

    public Optional<StateDefinition> state(String stateId) {
        return states.stream().filter(s -> s.id().equals(stateId)).findFirst();
    }

    public Optional<Component> component(String componentId) {
        return components.stream().filter(c -> c.id().equals(componentId)).findFirst();
    }

    /** Sensors by id, in declaration order. */
    public Map<String, Sensor> sensorsById() {
        return sensors.stream().collect(Collectors.toMap(Sensor::id, Function.identity(),
                (a, b) -> a, LinkedHashMap::new));
    }
}
