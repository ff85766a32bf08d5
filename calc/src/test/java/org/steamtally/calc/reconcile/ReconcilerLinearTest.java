package org.steamtally.calc.reconcile;

import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.junit.jupiter.api.Test;
import org.steamtally.calc.cycle.ReconciledQuantity;
import org.steamtally.calc.cycle.ReconciledSensor;
import org.steamtally.calc.cycle.ReconciliationResult;
import org.steamtally.calc.plant.Component;
import org.steamtally.calc.plant.Quantity;
import org.steamtally.calc.plant.StateFix;

/**
 * A flow network with mass balances only, so that the constraints are linear and the reconciled
 * values have the closed form of weighted least squares with linear constraints (VDI 2048-1; any
 * text on Lagrange multipliers): x̂ = x − V Aᵀ (A V Aᵀ)⁻¹ A x, cov(v) = V Aᵀ (A V Aᵀ)⁻¹ A V,
 * u²(x̂_i) = V_ii − cov(v)_ii, χ² = (A x)ᵀ (A V Aᵀ)⁻¹ (A x), worked out below by hand for two
 * constraints.
 *
 * <p>Network: boiler fw → ms; turbine ms → extraction ext and exhaust exh; condenser ext + exh →
 * cond; pump cond → fw. Flows ms, ext, exh, fw metered, cond not. Eliminating cond leaves
 * ms − ext − exh = 0 and fw − ms = 0.
 */
class ReconcilerLinearTest {

    private static final double MS = 100.0;
    private static final double S_MS = 1.0;
    private static final double EXT = 20.5;
    private static final double S_EXT = 0.4;
    private static final double EXH = 78.0;
    private static final double S_EXH = 1.2;
    private static final double FW = 101.5;
    private static final double S_FW = 0.8;

    static SmallUnit network(boolean meterAll) {
        SmallUnit u = new SmallUnit()
                .measured("ms", 10e6, 800.0, MS, S_MS)
                .measured("ext", 1e6, 500.0, EXT, meterAll ? S_EXT : 0)
                .sensor("p_exh", Quantity.PRESSURE, 10e3, 50.0);
        if (meterAll) {
            u.sensor("m_exh", Quantity.MASS_FLOW, EXH, S_EXH);
        }
        u.state("exh", new StateFix.PressureQuality("p_exh", 0.9), meterAll ? "m_exh" : null)
                .sensor("p_cond", Quantity.PRESSURE, 10e3, 50.0)
                .state("cond", new StateFix.SaturatedLiquid("p_cond"), null)
                .measured("fw", 11e6, 320.0, FW, meterAll ? S_FW : 0)
                .component(new Component.SteamGenerator("boiler", "fw", "ms", Optional.empty()))
                .component(new Component.TurbineSection("turbine", "ms", "exh", List.of("ext"), Optional.empty()))
                .component(new Component.Condenser("condenser", List.of("exh", "ext"), "cond", Optional.empty()))
                .component(new Component.Pump("pump", "cond", "fw", Optional.empty(), Optional.empty()));
        return u;
    }

    static Map<String, ReconciledSensor> byId(ReconciliationResult r) {
        return r.sensors().stream().collect(Collectors.toMap(ReconciledSensor::id, Function.identity()));
    }

    static Map<String, ReconciledQuantity> unmeasured(ReconciliationResult r) {
        return r.unmeasured().stream().collect(Collectors.toMap(ReconciledQuantity::id, Function.identity()));
    }

    @Test
    void reconciledFlowsAndUncertaintiesMatchTheClosedFormSolution() {
        SmallUnit u = network(true);
        ReconciliationResult r = Reconciler.compile(u.unit()).reconcile(u.snapshot()).result();

        // x = (ms, ext, exh, fw); A = [[1, −1, −1, 0], [−1, 0, 0, 1]]; V = diag(s²).
        double v1 = S_MS * S_MS;
        double v2 = S_EXT * S_EXT;
        double v3 = S_EXH * S_EXH;
        double v4 = S_FW * S_FW;
        // M = A V Aᵀ = [[v1 + v2 + v3, −v1], [−v1, v1 + v4]]
        double m11 = v1 + v2 + v3;
        double m12 = -v1;
        double m22 = v1 + v4;
        double det = m11 * m22 - m12 * m12;
        double i11 = m22 / det;
        double i12 = -m12 / det;
        double i22 = m11 / det;
        double r1 = MS - EXT - EXH;
        double r2 = FW - MS;
        double l1 = i11 * r1 + i12 * r2;
        double l2 = i12 * r1 + i22 * r2;
        // v = −V Aᵀ λ, Aᵀ λ = (l1 − l2, −l1, −l1, l2)
        double[] adjust = {-v1 * (l1 - l2), v2 * l1, v3 * l1, -v4 * l2};
        double chi2 = r1 * l1 + r2 * l2;
        // cov(v) = V Aᵀ M⁻¹ A V: its diagonal, with the columns of A V: (v1, −v2, −v3, 0) and (−v1, 0, 0, v4)
        double[][] av = {{v1, -v2, -v3, 0.0}, {-v1, 0.0, 0.0, v4}};
        double[] covV = new double[4];
        for (int i = 0; i < 4; i++) {
            covV[i] = av[0][i] * (i11 * av[0][i] + i12 * av[1][i]) + av[1][i] * (i12 * av[0][i] + i22 * av[1][i]);
        }
        double[] x = {MS, EXT, EXH, FW};
        double[] var = {v1, v2, v3, v4};
        String[] ids = {"m_ms", "m_ext", "m_exh", "m_fw"};
        Map<String, ReconciledSensor> s = byId(r);
        // The solve is linear here: rounding of a few eliminations, far below 1e-9 kg/s.
        double tol = 1e-9;
        assertAll(
                () -> assertEquals(ReconciliationResult.PASSED, r.status()),
                () -> assertEquals(2, r.redundancy()),
                () -> assertEquals(chi2, r.chi2(), 1e-9),
                () -> assertEquals(5.991, r.chi2Limit().getAsDouble(), 0.0005));
        for (int i = 0; i < 4; i++) {
            ReconciledSensor sensor = s.get(ids[i]);
            int k = i;
            assertAll(ids[i],
                    () -> assertEquals(x[k] + adjust[k], sensor.reconciled().getAsDouble(), tol),
                    () -> assertEquals(Math.sqrt(var[k] - covV[k]), sensor.sigmaReconciled().getAsDouble(), tol),
                    () -> assertEquals(Math.abs(adjust[k]) / Math.sqrt(covV[k]), sensor.testValue().getAsDouble(), 1e-7),
                    () -> assertEquals("redundant", sensor.redundancy()));
        }
        // cond = fw after the pump: its reconciled value and uncertainty are those of fw.
        ReconciledQuantity cond = unmeasured(r).get("cond.m_kg_per_s");
        assertAll(
                () -> assertTrue(cond.observable()),
                () -> assertEquals(FW + adjust[3], cond.reconciled().getAsDouble(), tol),
                () -> assertEquals(Math.sqrt(v4 - covV[3]), cond.sigmaReconciled().getAsDouble(), tol));
    }

    @Test
    void stateWithoutAnIf97StateLosesItsEnthalpyAndTheFlowsAreStillReconciled() {
        SmallUnit u = network(true);
        double[] v = u.values();
        // p_ms = 0 Pa is within the sensor's plausible range here but outside IF97
        v[0] = 0.0;
        ReconciliationResult r = Reconciler.compile(u.unit())
                .reconcile(org.steamtally.calc.cycle.Snapshot.allGood(u.snapshot().timestamp(), "u", v)).result();
        assertAll(
                () -> assertEquals(ReconciliationResult.PASSED, r.status()),
                () -> assertEquals(2, r.redundancy()),
                () -> assertFalse(unmeasured(r).get("ms.h_J_per_kg").observable()),
                () -> assertEquals("just_determined", byId(r).get("p_ms").redundancy()));
    }

    @Test
    void pressuresAndTemperaturesInNoBalanceAreJustDetermined() {
        SmallUnit u = network(true);
        Map<String, ReconciledSensor> s = byId(Reconciler.compile(u.unit()).reconcile(u.snapshot()).result());
        ReconciledSensor t = s.get("T_ms");
        assertAll(
                () -> assertEquals("just_determined", t.redundancy()),
                () -> assertTrue(t.testValue().isEmpty()),
                () -> assertEquals(800.0, t.reconciled().getAsDouble()),
                () -> assertEquals(0.5, t.sigmaReconciled().getAsDouble(), 1e-12));
    }

    @Test
    void withOneMeterThereIsNoRedundancyAndTheSplitOfTheTurbineFlowIsUnobservable() {
        SmallUnit u = network(false);
        ReconciliationResult r = Reconciler.compile(u.unit()).reconcile(u.snapshot()).result();
        Map<String, ReconciledQuantity> q = unmeasured(r);
        assertAll(
                () -> assertEquals(ReconciliationResult.NO_REDUNDANCY, r.status()),
                () -> assertFalse(r.passed()),
                () -> assertEquals(0, r.redundancy()),
                () -> assertEquals(0.0, r.chi2()),
                () -> assertTrue(r.chi2Limit().isEmpty()),
                () -> assertEquals("just_determined", byId(r).get("m_ms").redundancy()),
                () -> assertEquals(MS, byId(r).get("m_ms").reconciled().getAsDouble(), 1e-12),
                // ext + exh = ms is known, neither alone
                () -> assertFalse(q.get("ext.m_kg_per_s").observable()),
                () -> assertTrue(q.get("ext.m_kg_per_s").reconciled().isEmpty()),
                () -> assertFalse(q.get("exh.m_kg_per_s").observable()),
                // fw and cond follow from ms through the boiler and pump
                () -> assertTrue(q.get("fw.m_kg_per_s").observable()),
                () -> assertEquals(MS, q.get("cond.m_kg_per_s").reconciled().getAsDouble(), 1e-9),
                () -> assertEquals(S_MS, q.get("cond.m_kg_per_s").sigmaReconciled().getAsDouble(), 1e-9));
    }
}
