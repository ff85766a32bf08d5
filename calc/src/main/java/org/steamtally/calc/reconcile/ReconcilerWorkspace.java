package org.steamtally.calc.reconcile;

/**
 * The working memory of one {@link Reconciler}: every array a reconciliation of its unit needs
 * while it solves, sized once when the unit is compiled from the largest problem the unit can pose,
 * and reused by every linearisation, factorisation and serial-elimination re-solve of every
 * snapshot. At one reconciliation per unit per second in two channels, these arrays allocated afresh
 * were the daemon's largest source of garbage.
 *
 * <p>Nothing here outlives a call: each user sets or clears the part it reads (the zeros a fresh
 * array would have had included) before reading it, and no array here is ever handed to a caller.
 * Not thread-safe: one reconciliation at a time.
 *
 * <p>Dimensions: at most {@code rows} balances (nc), {@code inputs} measured quantities (nm: only
 * sensors and declared constants are ever measured), {@code size} variables in all and as many
 * unknowns (nu), so that G has at most {@code rows} columns and its rank (the redundancy) is at most
 * {@code rows}.
 */
final class ReconcilerWorkspace {

    /** Balances f(x, y), one per active row. */
    final double[] f;
    /** ∂f/∂z by rows, one column per variable z. */
    final double[][] jac;
    /** Per flowing state, h and its derivatives at the current estimate. */
    final double[] h;
    final double[] dhdp;
    final double[] dhdT;
    /** Per measured quantity, its standard uncertainty. */
    final double[] sigma;
    /** Per unknown, the equilibration of its column of B. */
    final double[] colScale;
    /** B̂ by columns (one per unknown), the layout {@link PivotedQr} factors in; columns made on first use. */
    final double[][] bColumns;
    /** Â = A S^{1/2} by rows. */
    final double[][] aHat;
    final double[] r;
    final double[] adjust;
    /** Qᵀ r. */
    final double[] qtr;
    /** Gᵀ by columns, one per remaining balance. */
    final double[][] gt;
    /** A column of Q. */
    final double[] qColumn;
    /** The normalised adjustments e. */
    final double[] ev;
    /** R11 Δy = −Q₁ᵀ (r + Â e). */
    final double[] t;
    /** A column of the basis of the row space of G. */
    final double[] basisColumn;
    /** Q₁ᵀ Â by rows. */
    final double[][] q1a;
    /** A column of K = R₁₁⁻¹ Q₁ᵀ Â while solving for it (K itself takes the place of Q₁ᵀ Â). */
    final double[] kColumn;
    final double[] dots;
    /** A column of R₁₁⁻¹ R₁₂, and per pivot unknown whether a free one is coupled to it. */
    final double[] nullColumn;
    final boolean[] coupled;
    /** Factorisation of B̂ and of Gᵀ. */
    final PivotedQr qb;
    final PivotedQr qg;
    final Enthalpy enthalpy = new Enthalpy();

    /** Per input, the standard uncertainties given for one call: the sensors', then the constants'. */
    final double[] givenSigma;
    /** Per input: the snapshot's value, whether usable, removed by serial elimination, named a suspect. */
    final double[] measured;
    final boolean[] usable;
    final boolean[] removed;
    final boolean[] suspect;

    private final int rows;

    /**
     * @param rows   balances of the unit
     * @param inputs sensors and declared constants
     * @param states flowing states
     * @param size   variables: inputs, then a flow and an enthalpy per flowing state
     */
    ReconcilerWorkspace(int rows, int inputs, int states, int size) {
        this.rows = rows;
        int atLeastOne = Math.max(rows, 1);
        f = new double[rows];
        jac = new double[rows][size];
        h = new double[states];
        dhdp = new double[states];
        dhdT = new double[states];
        sigma = new double[inputs];
        colScale = new double[size];
        bColumns = new double[size][];
        aHat = new double[rows][inputs];
        r = new double[rows];
        adjust = new double[inputs];
        qtr = new double[rows];
        gt = new double[rows][inputs];
        qColumn = new double[rows];
        ev = new double[inputs];
        t = new double[atLeastOne];
        basisColumn = new double[inputs];
        q1a = new double[rows][inputs];
        kColumn = new double[atLeastOne];
        dots = new double[rows];
        nullColumn = new double[atLeastOne];
        coupled = new boolean[rows];
        qb = new PivotedQr(rows, size);
        qg = new PivotedQr(inputs, rows);
        givenSigma = new double[inputs];
        measured = new double[inputs];
        usable = new boolean[inputs];
        removed = new boolean[inputs];
        suspect = new boolean[inputs];
    }

    /**
     * The first {@code unknowns} columns of B̂, each with room for every balance. A column is made
     * the first time a snapshot has that many unknowns, so a unit that never loses its flow meters
     * never holds room for their flows.
     */
    double[][] bColumns(int unknowns) {
        for (int u = 0; u < unknowns; u++) {
            if (bColumns[u] == null) {
                bColumns[u] = new double[rows];
            }
        }
        return bColumns;
    }
}
