package org.steamtally.calc.steam;

/**
 * The five regions of IAPWS-IF97 (IAPWS R7-97(2012), Figure 1). Region 4 is the saturation line;
 * a two-phase state lies on it and carries a vapour quality.
 */
public enum Region {
    /** Compressed liquid, 273.15 K to 623.15 K, up to 100 MPa. */
    REGION_1(1),
    /** Vapour, including the metastable-vapour extension near the saturation line. */
    REGION_2(2),
    /** Near-critical liquid and vapour, 623.15 K to the B23 boundary, up to 100 MPa. */
    REGION_3(3),
    /** Saturation: liquid and vapour in equilibrium. */
    REGION_4(4),
    /** High-temperature vapour, 1073.15 K to 2273.15 K, up to 50 MPa. */
    REGION_5(5);

    private final int number;

    Region(int number) {
        this.number = number;
    }

    /** The region's number as printed in the release (1 to 5). */
    public int number() {
        return number;
    }
}
