package org.steamtally.calc.sim;

/**
 * The true cycle figures of a truth point, defined as in the result record (docs/RESULTS.md): heat
 * added in the steam generators and reheaters, heat rejected in the condensers, the turbine
 * sections' steam-side work and the pumps' work, all magnitudes in W.
 */
public record TruthFigures(double heatAddedW, double heatRejectedW, double turbineWorkW, double pumpWorkW) {

    /** Turbine work less pump work, W. */
    public double netWorkW() {
        return turbineWorkW - pumpWorkW;
    }

    /** Net work over heat added. */
    public double thermalEfficiency() {
        return netWorkW() / heatAddedW;
    }
}
