package org.steamtally.calc.cycle;

/**
 * Which values the states, components and cycle figures of a result record were computed from.
 * JSON: {@code metrics_basis}.
 */
public enum MetricsBasis {
    /** The reconciled values: reconciliation passed its global test, so every balance holds exactly. */
    RECONCILED("reconciled"),
    /** The values as measured: reconciliation failed without a confirmed suspect, or could not run. */
    RAW("raw"),
    /**
     * The values as measured, except the confirmed suspect sensors, whose values were replaced by
     * what the balances give from the remaining sensors.
     */
    RAW_EXCLUDING_SUSPECTS("raw_excluding_suspects");

    private final String label;

    MetricsBasis(String label) {
        this.label = label;
    }

    /** The name used in the result record. */
    public String label() {
        return label;
    }
}
