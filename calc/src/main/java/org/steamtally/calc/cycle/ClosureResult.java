package org.steamtally.calc.cycle;

import java.util.Objects;

/**
 * One first-law balance checked against independent measurements: the residual between two ways of
 * obtaining the same energy flow, its standard uncertainty by first-order propagation of the sensors'
 * and constants' uncertainties (GUM, ISO/IEC Guide 98-3, eq. 10), and the normalised residual.
 *
 * <p>JSON (result record, array {@code closure}): {@code id, residual_W, sigma_W, z}.
 *
 * @param id        {@code "cycle"} for the whole cycle, else the component's id and the check, e.g.
 *                  {@code "hp_turbine+generator"}
 * @param residualW r, W
 * @param sigmaW    u(r), W, &gt; 0
 * @param z         r / u(r)
 */
public record ClosureResult(String id, double residualW, double sigmaW, double z) {

    public ClosureResult {
        Objects.requireNonNull(id, "id");
        if (!Double.isFinite(residualW) || !(sigmaW > 0.0) || !Double.isFinite(sigmaW) || !Double.isFinite(z)) {
            throw new IllegalArgumentException("closure " + id + ": residual " + residualW + " W, sigma " + sigmaW
                    + " W and z " + z + " must be finite with sigma > 0");
        }
    }
}
