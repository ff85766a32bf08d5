package org.steamtally.calc.reconcile;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.steamtally.calc.cycle.Snapshot;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.DeadState;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.Sensor;
import org.steamtally.calc.plant.StateDefinition;
import org.steamtally.calc.plant.StateFix;
import org.steamtally.calc.plant.UncertaintyBasis;
import org.steamtally.calc.plant.UnitDescription;

/** A unit built sensor by sensor for the small reconciliation cases, with its snapshot values. */
final class SmallUnit {

    private final List<Sensor> sensors = new ArrayList<>();
    private final List<Double> values = new ArrayList<>();
    private final List<StateDefinition> states = new ArrayList<>();
    private final List<Component> components = new ArrayList<>();

    SmallUnit sensor(String id, Quantity q, double value, double sigma) {
        sensors.add(new Sensor(id, q, q.siUnit(), sigma, UncertaintyBasis.STANDARD, q == Quantity.TEMPERATURE ? 273.15 : 0.0,
                q == Quantity.TEMPERATURE ? 900.0 : 1e9, Duration.ofSeconds(5), Optional.empty()));
        values.add(value);
        return this;
    }

    /** A second transmitter on the quantity of sensor {@code of}: same quantity and range, its own value and σ. */
    SmallUnit duplicate(String id, String of, double value, double sigma) {
        Sensor p = sensors.stream().filter(x -> x.id().equals(of)).findFirst().orElseThrow();
        sensors.add(new Sensor(id, p.quantity(), p.engineeringUnit(), sigma, UncertaintyBasis.STANDARD, p.rangeMinSi(),
                p.rangeMaxSi(), p.maxAge(), Optional.empty(), Optional.of(of)));
        values.add(value);
        return this;
    }

    /** A (p, T) state with its two sensors, p_id and T_id, and optionally a flow sensor m_id. */
    SmallUnit measured(String id, double p, double t, double m, double sigmaM) {
        sensor("p_" + id, Quantity.PRESSURE, p, 0.005 * p);
        sensor("T_" + id, Quantity.TEMPERATURE, t, 0.5);
        if (sigmaM > 0) {
            sensor("m_" + id, Quantity.MASS_FLOW, m, sigmaM);
        }
        states.add(new StateDefinition(id, new StateFix.MeasuredPressureTemperature("p_" + id, "T_" + id),
                sigmaM > 0 ? Optional.of("m_" + id) : Optional.empty()));
        return this;
    }

    SmallUnit state(String id, StateFix fix, String flowSensor) {
        states.add(new StateDefinition(id, fix, Optional.ofNullable(flowSensor)));
        return this;
    }

    SmallUnit component(Component c) {
        components.add(c);
        return this;
    }

    UnitDescription unit() {
        return new UnitDescription("u", "u", sensors, states, components, DeadState.STANDARD);
    }

    double[] values() {
        return values.stream().mapToDouble(Double::doubleValue).toArray();
    }

    Snapshot snapshot() {
        return Snapshot.allGood(Instant.parse("2026-12-01T00:00:00Z"), "u", values());
    }
}
