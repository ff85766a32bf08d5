package org.steamtally.collector.units;

import java.util.List;

import org.steamtally.calc.plant.Quantity;

/**
 * An engineering unit that readings and declared values may arrive in, with its affine conversion to
 * the SI unit of its {@link Quantity}: {@code si = (value + zeroOffset) · scale}, plus the site's
 * atmospheric pressure for a gauge-pressure unit.
 *
 * <p>The canonical spelling is the UCUM code (Unified Code for Units of Measure, case-sensitive form)
 * where UCUM has one. UCUM has no notion of gauge pressure, so {@code barg}, {@code psig},
 * {@code kPag} and {@code MPag} are this project's own codes ({@link #isUcum()} is false for them).
 * Spellings are case-sensitive throughout, as in UCUM: {@code MPa} is megapascal, {@code mPa} would be
 * millipascal and is not accepted.
 *
 * <p>Conversion factors: NIST Special Publication 811 (2008 edition), Appendix B.8, from the exact
 * definitions it gives (footnotes cited at each constant). The conventional inch and millimetre of
 * mercury (mercury density 13 595.1 kg/m³ under standard gravity) are used, not the 32 °F or 60 °F
 * columns; the conventional inch of mercury differs from the 32 °F one by less than 3 parts in 10⁶.
 */
public enum EngineeringUnit {

    PASCAL("Pa", true, Quantity.PRESSURE, 1.0, 0.0, false),
    KILOPASCAL("kPa", true, Quantity.PRESSURE, 1e3, 0.0, false, "kPa(a)", "kPaa"),
    MEGAPASCAL("MPa", true, Quantity.PRESSURE, 1e6, 0.0, false, "MPa(a)", "MPaa"),
    /** NIST SP 811 (2008), B.8: bar → Pa 1.0 E+05, exact. */
    BAR("bar", true, Quantity.PRESSURE, 1e5, 0.0, false, "bar(a)", "bara"),
    /** NIST SP 811 (2008), B.8: millibar → Pa 1.0 E+02, exact. */
    MILLIBAR("mbar", true, Quantity.PRESSURE, 1e2, 0.0, false, "mbar(a)", "mbara"),
    /** Pound-force per square inch, absolute; NIST SP 811 (2008), B.8: psi → Pa 6.894 757 E+03. */
    PSI("[psi]", true, Quantity.PRESSURE, Factors.PSI_PA, 0.0, false, "psi", "psia", "psi(a)", "lbf/in2"),
    /** Conventional inch of mercury; NIST SP 811 (2008), B.8: inHg, conventional → Pa 3.386 389 E+03. */
    INCH_OF_MERCURY("[in_i'Hg]", true, Quantity.PRESSURE, Factors.INCH_OF_MERCURY_PA, 0.0, false,
            "inHg", "inHgA", "in Hg"),
    /** Conventional millimetre of mercury; NIST SP 811 (2008), B.8: mmHg → Pa 1.333 224 E+02. */
    MILLIMETRE_OF_MERCURY("mm[Hg]", true, Quantity.PRESSURE, Factors.MILLIMETRE_OF_MERCURY_PA, 0.0, false,
            "mmHg", "mm Hg"),
    KILOPASCAL_GAUGE("kPag", false, Quantity.PRESSURE, 1e3, 0.0, true, "kPa(g)"),
    MEGAPASCAL_GAUGE("MPag", false, Quantity.PRESSURE, 1e6, 0.0, true, "MPa(g)"),
    BAR_GAUGE("barg", false, Quantity.PRESSURE, 1e5, 0.0, true, "bar(g)"),
    PSI_GAUGE("psig", false, Quantity.PRESSURE, Factors.PSI_PA, 0.0, true, "psi(g)"),

    KELVIN("K", true, Quantity.TEMPERATURE, 1.0, 0.0, false),
    /** NIST SP 811 (2008), B.9 (temperature): T/K = t/°C + 273.15, exact. */
    CELSIUS("Cel", true, Quantity.TEMPERATURE, 1.0, 273.15, false, "degC", "°C", "℃", "C", "deg C"),
    /** NIST SP 811 (2008), B.9 (temperature): T/K = (t/°F + 459.67)/1.8, exact. */
    FAHRENHEIT("[degF]", true, Quantity.TEMPERATURE, 1.0 / 1.8, 459.67, false, "degF", "°F", "℉", "F", "deg F"),

    KILOGRAM_PER_SECOND("kg/s", true, Quantity.MASS_FLOW, 1.0, 0.0, false),
    KILOGRAM_PER_HOUR("kg/h", true, Quantity.MASS_FLOW, 1.0 / Factors.HOUR_S, 0.0, false, "kg/hr"),
    /** Tonne per hour; NIST SP 811 (2008), B.8: tonne → kg 1.0 E+03, exact; hour → s 3.6 E+03, exact. */
    TONNE_PER_HOUR("t/h", true, Quantity.MASS_FLOW, 1e3 / Factors.HOUR_S, 0.0, false, "tph", "t/hr"),
    /** Pound (avoirdupois) per hour; NIST SP 811 (2008), B.8: lb/h → kg/s 1.259 979 E-04. */
    POUND_PER_HOUR("[lb_av]/h", true, Quantity.MASS_FLOW, Factors.POUND_KG / Factors.HOUR_S, 0.0, false,
            "lb/h", "lb/hr", "lbm/h", "lbm/hr", "pph"),

    WATT("W", true, Quantity.POWER, 1.0, 0.0, false),
    KILOWATT("kW", true, Quantity.POWER, 1e3, 0.0, false),
    MEGAWATT("MW", true, Quantity.POWER, 1e6, 0.0, false),
    KILOJOULE_PER_SECOND("kJ/s", true, Quantity.ENERGY_RATE, 1e3, 0.0, false),
    MEGAJOULE_PER_HOUR("MJ/h", true, Quantity.ENERGY_RATE, 1e6 / Factors.HOUR_S, 0.0, false, "MJ/hr"),
    /** NIST SP 811 (2008), B.8: Btu_IT/h → W 2.930 711 E-01. */
    BTU_PER_HOUR("[Btu_IT]/h", true, Quantity.ENERGY_RATE, Factors.BTU_IT_J / Factors.HOUR_S, 0.0, false,
            "Btu/h", "Btu/hr", "BTU/h", "BTU/hr"),

    JOULE_PER_KILOGRAM("J/kg", true, Quantity.SPECIFIC_ENERGY, 1.0, 0.0, false),
    KILOJOULE_PER_KILOGRAM("kJ/kg", true, Quantity.SPECIFIC_ENERGY, 1e3, 0.0, false),
    MEGAJOULE_PER_KILOGRAM("MJ/kg", true, Quantity.SPECIFIC_ENERGY, 1e6, 0.0, false),
    /** NIST SP 811 (2008), B.8: Btu_IT/lb → J/kg 2.326 E+03, exact. */
    BTU_PER_POUND("[Btu_IT]/[lb_av]", true, Quantity.SPECIFIC_ENERGY, Factors.BTU_IT_J / Factors.POUND_KG, 0.0,
            false, "Btu/lb", "BTU/lb", "Btu/lbm");

    private final String code;
    private final boolean ucum;
    private final Quantity quantity;
    private final double scale;
    private final double zeroOffset;
    private final boolean gauge;
    private final List<String> aliases;

    EngineeringUnit(String code, boolean ucum, Quantity quantity, double scale, double zeroOffset, boolean gauge,
                    String... aliases) {
        this.code = code;
        this.ucum = ucum;
        this.quantity = quantity;
        this.scale = scale;
        this.zeroOffset = zeroOffset;
        this.gauge = gauge;
        this.aliases = List.of(aliases);
    }

    /** The canonical spelling: the UCUM code where UCUM has one, e.g. {@code "[psi]"}, else ours. */
    public String code() {
        return code;
    }

    /** True when {@link #code()} is a UCUM (case-sensitive) code. */
    public boolean isUcum() {
        return ucum;
    }

    /** Other accepted spellings, e.g. {@code "psi"}, {@code "psia"}; matched case-sensitively. */
    public List<String> aliases() {
        return aliases;
    }

    /** The quantity this unit is declared for. */
    public Quantity quantity() {
        return quantity;
    }

    /**
     * True when values in this unit may stand for {@code other}: the same quantity, or one with the same
     * SI unit (a power may be given in {@code kJ/s}, a heat rate in {@code MW}).
     */
    public boolean measures(Quantity other) {
        return quantity == other || quantity.siUnit().equals(other.siUnit());
    }

    /** True for a gauge-pressure unit, whose zero is the site's atmospheric pressure. */
    public boolean isGauge() {
        return gauge;
    }

    /** SI units per one of this unit, the factor that also converts a difference or an uncertainty. */
    public double scale() {
        return scale;
    }

    /**
     * Converts a value to SI for an absolute unit.
     *
     * @param value a finite value in this unit
     * @return the value in the SI unit of {@link #quantity()}
     * @throws IllegalStateException    for a gauge unit, which needs the atmospheric pressure
     * @throws IllegalArgumentException for a non-finite value
     */
    public double toSi(double value) {
        if (gauge) {
            throw new IllegalStateException(code + " is a gauge pressure: convert it with the site's atmospheric"
                    + " pressure, toSi(value, atmosphericPa)");
        }
        return (requireFinite(value) + zeroOffset) * scale;
    }

    /**
     * Converts an SI value to this absolute unit.
     *
     * @param si a finite value in the SI unit of {@link #quantity()}
     * @return the value in this unit
     * @throws IllegalStateException    for a gauge unit, which needs the atmospheric pressure
     * @throws IllegalArgumentException for a non-finite value
     */
    public double fromSi(double si) {
        if (gauge) {
            throw new IllegalStateException(code + " is a gauge pressure: convert it with the site's atmospheric"
                    + " pressure, fromSi(si, atmosphericPa)");
        }
        return requireFinite(si) / scale - zeroOffset;
    }

    /**
     * Converts a value to SI; a gauge pressure is added to the atmospheric pressure.
     *
     * @param value         a finite value in this unit
     * @param atmosphericPa the site's atmospheric pressure, Pa, &gt; 0; used by gauge units only
     * @return the value in the SI unit of {@link #quantity()} (absolute pressure for pressure units)
     * @throws IllegalArgumentException for a non-finite value or, with a gauge unit, a non-positive or
     *                                  non-finite atmospheric pressure
     */
    public double toSi(double value, double atmosphericPa) {
        double si = (requireFinite(value) + zeroOffset) * scale;
        return gauge ? si + requireAtmospheric(atmosphericPa) : si;
    }

    /**
     * Converts an SI value back to this unit, the inverse of {@link #toSi(double, double)}.
     *
     * @param si            a finite value in the SI unit of {@link #quantity()}
     * @param atmosphericPa the site's atmospheric pressure, Pa; used by gauge units only
     * @return the value in this unit
     */
    public double fromSi(double si, double atmosphericPa) {
        double absolute = gauge ? requireFinite(si) - requireAtmospheric(atmosphericPa) : requireFinite(si);
        return absolute / scale - zeroOffset;
    }

    /**
     * Converts an uncertainty (or any difference) to SI: the scale alone, since an offset or the
     * atmospheric pressure cancels in a difference.
     *
     * @param uncertainty a finite uncertainty in this unit
     * @return the uncertainty in the SI unit of {@link #quantity()}
     */
    public double uncertaintyToSi(double uncertainty) {
        return requireFinite(uncertainty) * scale;
    }

    @Override
    public String toString() {
        return code;
    }

    private static double requireFinite(double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("value must be a finite number, was " + value);
        }
        return value;
    }

    private static double requireAtmospheric(double atmosphericPa) {
        if (!(atmosphericPa > 0.0) || !Double.isFinite(atmosphericPa)) {
            throw new IllegalArgumentException("atmospheric pressure must be a positive number of pascals, was "
                    + atmosphericPa);
        }
        return atmosphericPa;
    }

    /** Exact definitions the factors are built from; kept apart so the enum constants can use them. */
    static final class Factors {
        /** NIST SP 811 (2008), B.8, footnote 22: pound (avoirdupois) = 0.453 592 37 kg, exact. */
        static final double POUND_KG = 0.45359237;
        /** NIST SP 811 (2008), B.8: inch → m 2.54 E-02, exact. */
        static final double INCH_M = 0.0254;
        /** Standard acceleration of gravity g_n = 9.806 65 m/s², exact (NIST SP 811 (2008), B.8, footnote 23). */
        static final double STANDARD_GRAVITY = 9.80665;
        /**
         * Conventional density of mercury, 13 595.1 kg/m³, on which NIST SP 811 (2008), B.8, footnote 12
         * bases the conventional mercury units (footnote wording recalled from memory; the product with g_n
         * and the inch reproduces the printed 3.386 389 E+03 Pa, which the tests check).
         */
        static final double MERCURY_DENSITY = 13595.1;
        /** NIST SP 811 (2008), B.8, footnote 9: Btu_IT = 1055.055 852 62 J, exact. */
        static final double BTU_IT_J = 1055.05585262;
        /** NIST SP 811 (2008), B.8: hour → s 3.6 E+03, exact. */
        static final double HOUR_S = 3600.0;

        /** Pound-force per square inch: lb · g_n / in², exact from the three definitions above. */
        static final double PSI_PA = POUND_KG * STANDARD_GRAVITY / (INCH_M * INCH_M);
        /** Conventional inch of mercury: ρ_Hg · g_n · 1 in. */
        static final double INCH_OF_MERCURY_PA = MERCURY_DENSITY * STANDARD_GRAVITY * INCH_M;
        /** Conventional millimetre of mercury: ρ_Hg · g_n · 1 mm. */
        static final double MILLIMETRE_OF_MERCURY_PA = MERCURY_DENSITY * STANDARD_GRAVITY * 1e-3;

        private Factors() {
        }
    }
}
