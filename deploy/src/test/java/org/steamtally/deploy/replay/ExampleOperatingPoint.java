package org.steamtally.deploy.replay;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * A consistent steady operating point of one shipped example unit, built by hand in a test from the
 * independent IF97 ({@link IndependentIf97}): what each sensor reads, in the unit the plant
 * description declares for it, and the cycle figures the hand-built heat balance gives.
 *
 * @param example     file name of the plant description under {@code deploy/examples}, e.g. {@code reheat.yaml}
 * @param topicPrefix the sensors' topic prefix, e.g. {@code fernholm/unit2/}
 * @param readings    sensor id to its reading in the declared engineering unit, in the order published
 * @param units       sensor id to that declared unit, as written into each message
 * @param closures    ids of the closures a consistent snapshot reports (the condenser's is not among
 *                    them where the cooling water fixes the wet exhaust)
 * @param figures     the hand-computed cycle figures, SI
 */
record ExampleOperatingPoint(String example, String topicPrefix, Map<String, Double> readings,
                             Map<String, String> units, List<String> closures, Figures figures) {

    ExampleOperatingPoint {
        Objects.requireNonNull(example, "example");
        readings = new LinkedHashMap<>(readings);
        units = new LinkedHashMap<>(units);
        closures = List.copyOf(closures);
        if (!readings.keySet().equals(units.keySet())) {
            throw new IllegalArgumentException("one unit per reading");
        }
    }

    @Override
    public String toString() {
        return example;
    }

    /** The recording's file name beside the plant description, e.g. {@code reheat-readings.jsonl}. */
    String readingsFile() {
        return example.replace(".yaml", "-readings.jsonl");
    }

    /** The golden result file beside the plant description, e.g. {@code reheat-results.jsonl}. */
    String resultsFile() {
        return example.replace(".yaml", "-results.jsonl");
    }

    /**
     * Cycle totals of the hand-built heat balance, W, each a magnitude, and the figures that follow
     * from them by their definitions in docs/RESULTS.md.
     */
    record Figures(double heatAddedW, double heatRejectedW, double turbineWorkW, double pumpWorkW) {

        double netWorkW() {
            return turbineWorkW - pumpWorkW;
        }

        /** Net work over heat added in the boiler and reheater. */
        double thermalEfficiency() {
            return netWorkW() / heatAddedW;
        }

        double backWorkRatio() {
            return pumpWorkW / turbineWorkW;
        }

        /** 3600 kJ/kWh divided by the efficiency: kJ of heat per kWh of net work. */
        double heatRateKJPerKWh() {
            return 3600.0 / thermalEfficiency();
        }
    }
}
