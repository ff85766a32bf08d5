package org.steamtally.calc.steam;

/**
 * Region 2 of IAPWS-IF97, vapour: 273.15 K ≤ T ≤ 623.15 K for 0 &lt; p ≤ ps(T), 623.15 K &lt; T ≤ 863.15 K
 * for 0 &lt; p ≤ p_B23(T), and 863.15 K &lt; T ≤ 1073.15 K for 0 &lt; p ≤ 100 MPa.
 *
 * <p>Forward properties come from the Gibbs free energy of IAPWS R7-97(2012), eq. 15 to 17 with
 * Tables 10 and 11 and the relations of Table 12. Backward equations: T(p,h) for subregions 2a, 2b
 * and 2c (eq. 22 to 24, Tables 20 to 22) with the B2bc boundary (eq. 20 and 21, Table 19); T(p,s)
 * (eq. 25 to 27, Tables 25 to 27); and p(h,s) for 2a, 2b and 2c with the boundary h_2ab(s) from
 * IAPWS SR2-01(2014) (Supp-PHS12), eq. 2 to 5 with Tables 5 to 8.
 *
 * <p>Subregions: 2a for p ≤ 4 MPa; above, 2b and 2c are split by B2bc for (p,h), at
 * s = 5.85 kJ/(kg·K) for (p,s), and for (h,s) 2a is h ≤ h_2ab(s), then 2b for s ≥ 5.85 kJ/(kg·K) and
 * 2c below.
 *
 * <p>No range validation is done here; the caller checks that the state lies in region 2. All
 * quantities are SI: Pa, K, J/kg, J/(kg·K), m³/kg, m/s.
 */
public final class Region2 {

    // IAPWS R7-97(2012), eq. 15: reducing quantities p* = 1 MPa, T* = 540 K; residual in (τ − 0.5).
    private static final double P_STAR_PA = 1.0e6;
    private static final double T_STAR_K = 540.0;
    private static final double TAU_SHIFT = 0.5;

    // IAPWS R7-97(2012), Table 10: ideal-gas part γ⁰, eq. 16, rows {J⁰, n⁰} in printed order.
    static final double[][] TABLE_10 = {
        {0, -0.96927686500217e1},
        {1, 0.10086655968018e2},
        {-5, -0.56087911283020e-2},
        {-4, 0.71452738081455e-1},
        {-3, -0.40710498223928},
        {-2, 0.14240819171444e1},
        {-1, -0.43839511319450e1},
        {2, -0.28408632460772},
        {3, 0.21268463753307e-1},
    };

    // IAPWS R7-97(2012), Table 11: residual part γʳ, eq. 17, rows {I, J, n} in printed order.
    private static final double[][] TABLE_11 = {
        {1, 0, -0.17731742473213e-2},
        {1, 1, -0.17834862292358e-1},
        {1, 2, -0.45996013696365e-1},
        {1, 3, -0.57581259083432e-1},
        {1, 6, -0.50325278727930e-1},
        {2, 1, -0.33032641670203e-4},
        {2, 2, -0.18948987516315e-3},
        {2, 4, -0.39392777243355e-2},
        {2, 7, -0.43797295650573e-1},
        {2, 36, -0.26674547914087e-4},
        {3, 0, 0.20481737692309e-7},
        {3, 1, 0.43870667284435e-6},
        {3, 3, -0.32277677238570e-4},
        {3, 6, -0.15033924542148e-2},
        {3, 35, -0.40668253562649e-1},
        {4, 1, -0.78847309559367e-9},
        {4, 2, 0.12790717852285e-7},
        {4, 3, 0.48225372718507e-6},
        {5, 7, 0.22922076337661e-5},
        {6, 3, -0.16714766451061e-10},
        {6, 16, -0.21171472321355e-2},
        {6, 35, -0.23895741934104e2},
        {7, 0, -0.59059564324270e-17},
        {7, 11, -0.12621808899101e-5},
        {7, 25, -0.38946842435739e-1},
        {8, 8, 0.11256211360459e-10},
        {8, 36, -0.82311340897998e1},
        {9, 13, 0.19809712802088e-7},
        {10, 4, 0.10406965210174e-18},
        {10, 10, -0.10234747095929e-12},
        {10, 14, -0.10018179379511e-8},
        {16, 29, -0.80882908646985e-10},
        {16, 50, 0.10693031879409},
        {18, 57, -0.33662250574171},
        {20, 20, 0.89185845355421e-24},
        {20, 35, 0.30629316876232e-12},
        {20, 48, -0.42002467698208e-5},
        {21, 21, -0.59056029685639e-25},
        {22, 53, 0.37826947613457e-5},
        {23, 39, -0.12768608934681e-14},
        {24, 26, 0.73087610595061e-28},
        {24, 40, 0.55414715350778e-16},
        {24, 58, -0.94369707241210e-6},
    };

    // IAPWS R7-97(2012), Table 19: coefficients n1 ... n5 of the B2bc equation, eq. 20 and 21,
    // with p* = 1 MPa and h* = 1 kJ/kg.
    private static final double B2BC_N1 = 0.90584278514723e3;
    private static final double B2BC_N2 = -0.67955786399241;
    private static final double B2BC_N3 = 0.12809002730136e-3;
    private static final double B2BC_N4 = 0.26526571908428e4;
    private static final double B2BC_N5 = 0.45257578905948e1;

    // IAPWS R7-97(2012), eq. 22 to 24: p* = 1 MPa, T* = 1 K, h* = 2000 kJ/kg; 2a/2b split at 4 MPa.
    private static final double BACKWARD_P_STAR_PA = 1.0e6;
    private static final double PH_H_STAR = 2000.0e3;
    private static final double SUBREGION_2A_MAX_PRESSURE_PA = 4.0e6;

    // IAPWS R7-97(2012), Table 20: backward equation T(p,h) for 2a, eq. 22, in π and (η − 2.1).
    private static final double[][] TABLE_20 = {
        {0, 0, 0.10898952318288e4},
        {0, 1, 0.84951654495535e3},
        {0, 2, -0.10781748091826e3},
        {0, 3, 0.33153654801263e2},
        {0, 7, -0.74232016790248e1},
        {0, 20, 0.11765048724356e2},
        {1, 0, 0.18445749355790e1},
        {1, 1, -0.41792700549624e1},
        {1, 2, 0.62478196935812e1},
        {1, 3, -0.17344563108114e2},
        {1, 7, -0.20058176862096e3},
        {1, 9, 0.27196065473796e3},
        {1, 11, -0.45511318285818e3},
        {1, 18, 0.30919688604755e4},
        {1, 44, 0.25226640357872e6},
        {2, 0, -0.61707422868339e-2},
        {2, 2, -0.31078046629583},
        {2, 7, 0.11670873077107e2},
        {2, 36, 0.12812798404046e9},
        {2, 38, -0.98554909623276e9},
        {2, 40, 0.28224546973002e10},
        {2, 42, -0.35948971410703e10},
        {2, 44, 0.17227349913197e10},
        {3, 24, -0.13551334240775e5},
        {3, 44, 0.12848734664650e8},
        {4, 12, 0.13865724283226e1},
        {4, 32, 0.23598832556514e6},
        {4, 44, -0.13105236545054e8},
        {5, 32, 0.73999835474766e4},
        {5, 36, -0.55196697030060e6},
        {5, 42, 0.37154085996233e7},
        {6, 34, 0.19127729239660e5},
        {6, 44, -0.41535164835634e6},
        {7, 28, -0.62459855192507e2},
    };

    // IAPWS R7-97(2012), Table 21: backward equation T(p,h) for 2b, eq. 23, in (π − 2) and (η − 2.6).
    private static final double[][] TABLE_21 = {
        {0, 0, 0.14895041079516e4},
        {0, 1, 0.74307798314034e3},
        {0, 2, -0.97708318797837e2},
        {0, 12, 0.24742464705674e1},
        {0, 18, -0.63281320016026},
        {0, 24, 0.11385952129658e1},
        {0, 28, -0.47811863648625},
        {0, 40, 0.85208123431544e-2},
        {1, 0, 0.93747147377932},
        {1, 2, 0.33593118604916e1},
        {1, 6, 0.33809355601454e1},
        {1, 12, 0.16844539671904},
        {1, 18, 0.73875745236695},
        {1, 24, -0.47128737436186},
        {1, 28, 0.15020273139707},
        {1, 40, -0.21764114219750e-2},
        {2, 2, -0.21810755324761e-1},
        {2, 8, -0.10829784403677},
        {2, 18, -0.46333324635812e-1},
        {2, 40, 0.71280351959551e-4},
        {3, 1, 0.11032831789999e-3},
        {3, 2, 0.18955248387902e-3},
        {3, 12, 0.30891541160537e-2},
        {3, 24, 0.13555504554949e-2},
        {4, 2, 0.28640237477456e-6},
        {4, 12, -0.10779857357512e-4},
        {4, 18, -0.76462712454814e-4},
        {4, 24, 0.14052392818316e-4},
        {4, 28, -0.31083814331434e-4},
        {4, 40, -0.10302738212103e-5},
        {5, 18, 0.28217281635040e-6},
        {5, 24, 0.12704902271945e-5},
        {5, 40, 0.73803353468292e-7},
        {6, 28, -0.11030139238909e-7},
        {7, 2, -0.81456365207833e-13},
        {7, 28, -0.25180545682962e-10},
        {9, 1, -0.17565233969407e-17},
        {9, 40, 0.86934156344163e-14},
    };

    // IAPWS R7-97(2012), Table 22: backward equation T(p,h) for 2c, eq. 24, in (π + 25) and (η − 1.8).
    private static final double[][] TABLE_22 = {
        {-7, 0, -0.32368398555242e13},
        {-7, 4, 0.73263350902181e13},
        {-6, 0, 0.35825089945447e12},
        {-6, 2, -0.58340131851590e12},
        {-5, 0, -0.10783068217470e11},
        {-5, 2, 0.20825544563171e11},
        {-2, 0, 0.61074783564516e6},
        {-2, 1, 0.85977722535580e6},
        {-1, 0, -0.25745723604170e5},
        {-1, 2, 0.31081088422714e5},
        {0, 0, 0.12082315865936e4},
        {0, 1, 0.48219755109255e3},
        {1, 4, 0.37966001272486e1},
        {1, 8, -0.10842984880077e2},
        {2, 4, -0.45364172676660e-1},
        {6, 0, 0.14559115658698e-12},
        {6, 1, 0.11261597407230e-11},
        {6, 4, -0.17804982240686e-10},
        {6, 10, 0.12324579690832e-6},
        {6, 12, -0.11606921130984e-5},
        {6, 16, 0.27846367088554e-4},
        {6, 20, -0.59270038474176e-3},
        {6, 22, 0.12918582991878e-2},
    };

    // IAPWS R7-97(2012), eq. 25 to 27: s* = 2, 0.7853 and 2.9251 kJ/(kg·K) for 2a, 2b, 2c; the
    // 2b/2c split for T(p,s) and p(h,s) is s = 5.85 kJ/(kg·K).
    private static final double PS_S_STAR_2A = 2.0e3;
    private static final double PS_S_STAR_2B = 0.7853e3;
    private static final double PS_S_STAR_2C = 2.9251e3;
    private static final double SUBREGION_2BC_ENTROPY = 5.85e3;

    // IAPWS R7-97(2012), Table 25: backward equation T(p,s) for 2a, eq. 25, in π and (σ − 2). The
    // exponents I are quarter-integers; the series is evaluated in π^(1/4).
    private static final double[][] TABLE_25 = {
        {-1.5, -24, -0.39235983861984e6},
        {-1.5, -23, 0.51526573827270e6},
        {-1.5, -19, 0.40482443161048e5},
        {-1.5, -13, -0.32193790923902e3},
        {-1.5, -11, 0.96961424218694e2},
        {-1.5, -10, -0.22867846371773e2},
        {-1.25, -19, -0.44942914124357e6},
        {-1.25, -15, -0.50118336020166e4},
        {-1.25, -6, 0.35684463560015},
        {-1.0, -26, 0.44235335848190e5},
        {-1.0, -21, -0.13673388811708e5},
        {-1.0, -17, 0.42163260207864e6},
        {-1.0, -16, 0.22516925837475e5},
        {-1.0, -9, 0.47442144865646e3},
        {-1.0, -8, -0.14931130797647e3},
        {-0.75, -15, -0.19781126320452e6},
        {-0.75, -14, -0.23554399470760e5},
        {-0.5, -26, -0.19070616302076e5},
        {-0.5, -13, 0.55375669883164e5},
        {-0.5, -9, 0.38293691437363e4},
        {-0.5, -7, -0.60391860580567e3},
        {-0.25, -27, 0.19363102620331e4},
        {-0.25, -25, 0.42660643698610e4},
        {-0.25, -11, -0.59780638872718e4},
        {-0.25, -6, -0.70401463926862e3},
        {0.25, 1, 0.33836784107553e3},
        {0.25, 4, 0.20862786635187e2},
        {0.25, 8, 0.33834172656196e-1},
        {0.25, 11, -0.43124428414893e-4},
        {0.5, 0, 0.16653791356412e3},
        {0.5, 1, -0.13986292055898e3},
        {0.5, 5, -0.78849547999872},
        {0.5, 6, 0.72132411753872e-1},
        {0.5, 10, -0.59754839398283e-2},
        {0.5, 14, -0.12141358953904e-4},
        {0.5, 16, 0.23227096733871e-6},
        {0.75, 0, -0.10538463566194e2},
        {0.75, 4, 0.20718925496502e1},
        {0.75, 9, -0.72193155260427e-1},
        {0.75, 17, 0.20749887081120e-6},
        {1.0, 7, -0.18340657911379e-1},
        {1.0, 18, 0.29036272348696e-6},
        {1.25, 3, 0.21037527893619},
        {1.25, 15, 0.25681239729999e-3},
        {1.5, 5, -0.12799002933781e-1},
        {1.5, 18, -0.82198102652018e-5},
    };

    // IAPWS R7-97(2012), Table 26: backward equation T(p,s) for 2b, eq. 26, in π and (10 − σ).
    private static final double[][] TABLE_26 = {
        {-6, 0, 0.31687665083497e6},
        {-6, 11, 0.20864175881858e2},
        {-5, 0, -0.39859399803599e6},
        {-5, 11, -0.21816058518877e2},
        {-4, 0, 0.22369785194242e6},
        {-4, 1, -0.27841703445817e4},
        {-4, 11, 0.99207436071480e1},
        {-3, 0, -0.75197512299157e5},
        {-3, 1, 0.29708605951158e4},
        {-3, 11, -0.34406878548526e1},
        {-3, 12, 0.38815564249115},
        {-2, 0, 0.17511295085750e5},
        {-2, 1, -0.14237112854449e4},
        {-2, 6, 0.10943803364167e1},
        {-2, 10, 0.89971619308495},
        {-1, 0, -0.33759740098958e4},
        {-1, 1, 0.47162885818355e3},
        {-1, 5, -0.19188241993679e1},
        {-1, 8, 0.41078580492196},
        {-1, 9, -0.33465378172097},
        {0, 0, 0.13870034777505e4},
        {0, 1, -0.40663326195838e3},
        {0, 2, 0.41727347159610e2},
        {0, 4, 0.21932549434532e1},
        {0, 5, -0.10320050009077e1},
        {0, 6, 0.35882943516703},
        {0, 9, 0.52511453726066e-2},
        {1, 0, 0.12838916450705e2},
        {1, 1, -0.28642437219381e1},
        {1, 2, 0.56912683664855},
        {1, 3, -0.99962954584931e-1},
        {1, 7, -0.32632037778459e-2},
        {1, 8, 0.23320922576723e-3},
        {2, 0, -0.15334809857450},
        {2, 1, 0.29072288239902e-1},
        {2, 5, 0.37534702741167e-3},
        {3, 0, 0.17296691702411e-2},
        {3, 1, -0.38556050844504e-3},
        {3, 3, -0.35017712292608e-4},
        {4, 0, -0.14566393631492e-4},
        {4, 1, 0.56420857267269e-5},
        {5, 0, 0.41286150074605e-7},
        {5, 1, -0.20684671118824e-7},
        {5, 2, 0.16409393674725e-8},
    };

    // IAPWS R7-97(2012), Table 27: backward equation T(p,s) for 2c, eq. 27, in π and (2 − σ).
    private static final double[][] TABLE_27 = {
        {-2, 0, 0.90968501005365e3},
        {-2, 1, 0.24045667088420e4},
        {-1, 0, -0.59162326387130e3},
        {0, 0, 0.54145404128074e3},
        {0, 1, -0.27098308411192e3},
        {0, 2, 0.97976525097926e3},
        {0, 3, -0.46966772959435e3},
        {1, 0, 0.14399274604723e2},
        {1, 1, -0.19104204230429e2},
        {1, 3, 0.53299167111971e1},
        {1, 4, -0.21252975375934e2},
        {2, 0, -0.31147334413760},
        {2, 1, 0.60334840894623},
        {2, 2, -0.42764839702509e-1},
        {3, 0, 0.58185597255259e-2},
        {3, 1, -0.14597008284753e-1},
        {3, 5, 0.56631175631027e-2},
        {4, 0, -0.76155864584577e-4},
        {4, 1, 0.22440342919332e-3},
        {4, 4, -0.12561095013413e-4},
        {5, 0, 0.63323132660934e-6},
        {5, 1, -0.20541989675375e-5},
        {5, 2, 0.36405370390082e-7},
        {6, 0, -0.29759897789215e-8},
        {6, 1, 0.10136618529763e-7},
        {7, 0, 0.59925719692351e-11},
        {7, 1, -0.20677870105164e-10},
        {7, 3, -0.20874278181886e-10},
        {7, 4, 0.10162166825089e-9},
        {7, 5, -0.16429828281347e-9},
    };

    // IAPWS SR2-01(2014), Table 5: boundary h_2ab(s), eq. 2, η = n1 + n2σ + n3σ² + n4σ³ with
    // h* = 1 kJ/kg and s* = 1 kJ/(kg·K).
    private static final double H2AB_N1 = -0.349898083432139e4;
    private static final double H2AB_N2 = 0.257560716905876e4;
    private static final double H2AB_N3 = -0.421073558227969e3;
    private static final double H2AB_N4 = 0.276349063799944e2;

    // IAPWS SR2-01(2014), eq. 3 to 5: π^(1/4) as a series in (η − a) and (σ − b); p = π⁴·p*.
    private static final double HS_P_STAR_2A_PA = 4.0e6;
    private static final double HS_H_STAR_2A = 4200.0e3;
    private static final double HS_S_STAR_2A = 12.0e3;
    private static final double HS_P_STAR_2BC_PA = 100.0e6;
    private static final double HS_H_STAR_2B = 4100.0e3;
    private static final double HS_S_STAR_2B = 7.9e3;
    private static final double HS_H_STAR_2C = 3500.0e3;
    private static final double HS_S_STAR_2C = 5.9e3;

    // IAPWS SR2-01(2014), Table 6: backward equation p(h,s) for 2a, eq. 3, in (η − 0.5) and (σ − 1.2).
    private static final double[][] SUPP_PHS12_TABLE_6 = {
        {0, 1, -0.182575361923032e-1},
        {0, 3, -0.125229548799536},
        {0, 6, 0.592290437320145},
        {0, 16, 0.604769706185122e1},
        {0, 20, 0.238624965444474e3},
        {0, 22, -0.298639090222922e3},
        {1, 0, 0.512250813040750e-1},
        {1, 1, -0.437266515606486},
        {1, 2, 0.413336902999504},
        {1, 3, -0.516468254574773e1},
        {1, 5, -0.557014838445711e1},
        {1, 6, 0.128555037824478e2},
        {1, 10, 0.114144108953290e2},
        {1, 16, -0.119504225652714e3},
        {1, 20, -0.284777985961560e4},
        {1, 22, 0.431757846408006e4},
        {2, 3, 0.112894040802650e1},
        {2, 16, 0.197409186206319e4},
        {2, 20, 0.151612444706087e4},
        {3, 0, 0.141324451421235e-1},
        {3, 2, 0.585501282219601},
        {3, 3, -0.297258075863012e1},
        {3, 6, 0.594567314847319e1},
        {3, 16, -0.623656565798905e4},
        {4, 16, 0.965986235133332e4},
        {5, 3, 0.681500934948134e1},
        {5, 16, -0.633207286824489e4},
        {6, 3, -0.558919224465760e1},
        {7, 1, 0.400645798472063e-1},
    };

    // IAPWS SR2-01(2014), Table 7: backward equation p(h,s) for 2b, eq. 4, in (η − 0.6) and (σ − 1.01).
    private static final double[][] SUPP_PHS12_TABLE_7 = {
        {0, 0, 0.801496989929495e-1},
        {0, 1, -0.543862807146111},
        {0, 2, 0.337455597421283},
        {0, 4, 0.890555451157450e1},
        {0, 8, 0.313840736431485e3},
        {1, 0, 0.797367065977789},
        {1, 1, -0.121616973556240e1},
        {1, 2, 0.872803386937477e1},
        {1, 3, -0.169769781757602e2},
        {1, 5, -0.186552827328416e3},
        {1, 12, 0.951159274344237e5},
        {2, 1, -0.189168510120494e2},
        {2, 6, -0.433407037194840e4},
        {2, 18, 0.543212633012715e9},
        {3, 0, 0.144793408386013},
        {3, 1, 0.128024559637516e3},
        {3, 7, -0.672309534071268e5},
        {3, 12, 0.336972380095287e8},
        {4, 1, -0.586634196762720e3},
        {4, 16, -0.221403224769889e11},
        {5, 1, 0.171606668708389e4},
        {5, 12, -0.570817595806302e9},
        {6, 1, -0.312109693178482e4},
        {6, 8, -0.207841384633010e7},
        {6, 18, 0.305605946157786e13},
        {7, 1, 0.322157004314333e4},
        {7, 16, 0.326810259797295e12},
        {8, 1, -0.144104158934487e4},
        {8, 3, 0.410694867802691e3},
        {8, 14, 0.109077066873024e12},
        {8, 18, -0.247964654258893e14},
        {12, 10, 0.188801906865134e10},
        {14, 16, -0.123651009018773e15},
    };

    // IAPWS SR2-01(2014), Table 8: backward equation p(h,s) for 2c, eq. 5, in (η − 0.7) and (σ − 1.1).
    private static final double[][] SUPP_PHS12_TABLE_8 = {
        {0, 0, 0.112225607199012},
        {0, 1, -0.339005953606712e1},
        {0, 2, -0.320503911730094e2},
        {0, 3, -0.197597305104900e3},
        {0, 4, -0.407693861553446e3},
        {0, 8, 0.132943775222331e5},
        {1, 0, 0.170846839774007e1},
        {1, 2, 0.373694198142245e2},
        {1, 5, 0.358144365815434e4},
        {1, 8, 0.423014446424664e6},
        {1, 14, -0.751071025760063e9},
        {2, 2, 0.523446127607898e2},
        {2, 3, -0.228351290812417e3},
        {2, 7, -0.960652417056937e6},
        {2, 10, -0.807059292526074e8},
        {2, 18, 0.162698017225669e13},
        {3, 0, 0.772465073604171},
        {3, 5, 0.463929973837746e5},
        {3, 8, -0.137317885134128e8},
        {3, 16, 0.170470392630512e13},
        {3, 18, -0.251104628187308e14},
        {4, 18, 0.317748830835520e14},
        {5, 1, 0.538685623675312e2},
        {5, 4, -0.553089094625169e5},
        {5, 6, -0.102861522421405e7},
        {5, 14, 0.204249418756234e13},
        {6, 8, 0.273918446626977e9},
        {6, 18, -0.263963146312685e16},
        {10, 7, -0.107890854108088e10},
        {12, 7, -0.296492620980124e11},
        {16, 10, -0.111754907323424e16},
    };

    static final VapourGibbs GIBBS =
            new VapourGibbs("Region 2", P_STAR_PA, T_STAR_K, TABLE_10, TABLE_11, TAU_SHIFT) {
                @Override
                double idealSum(double tau) {
                    return Region2Sums.ideal(tau);
                }

                @Override
                double idealTauSum(double tau) {
                    return Region2Sums.idealTau(tau);
                }

                @Override
                double idealTauTauSum(double tau) {
                    return Region2Sums.idealTauTau(tau);
                }

                @Override
                double residualSum(double pi, double y) {
                    return Region2Sums.residual(pi, y);
                }

                @Override
                double residualPiSum(double pi, double y) {
                    return Region2Sums.residualPi(pi, y);
                }

                @Override
                double residualTauSum(double pi, double y) {
                    return Region2Sums.residualTau(pi, y);
                }

                @Override
                double residualPiPiSum(double pi, double y) {
                    return Region2Sums.residualPiPi(pi, y);
                }

                @Override
                double residualPiTauSum(double pi, double y) {
                    return Region2Sums.residualPiTau(pi, y);
                }

                @Override
                double residualTauTauSum(double pi, double y) {
                    return Region2Sums.residualTauTau(pi, y);
                }
            };

    static final PowerSeries THETA_PH_2A = PowerSeries.ofRows(TABLE_20);
    static final PowerSeries THETA_PH_2B = PowerSeries.ofRows(TABLE_21);
    static final PowerSeries THETA_PH_2C = PowerSeries.ofRows(TABLE_22);
    static final PowerSeries THETA_PS_2A = PowerSeries.ofRows(TABLE_25, 4);
    static final PowerSeries THETA_PS_2B = PowerSeries.ofRows(TABLE_26);
    static final PowerSeries THETA_PS_2C = PowerSeries.ofRows(TABLE_27);
    private static final PowerSeries PI_HS_2A = PowerSeries.ofRows(SUPP_PHS12_TABLE_6);
    private static final PowerSeries PI_HS_2B = PowerSeries.ofRows(SUPP_PHS12_TABLE_7);
    private static final PowerSeries PI_HS_2C = PowerSeries.ofRows(SUPP_PHS12_TABLE_8);

    /** Newton iterations allowed before a refined backward method gives up. */
    static final int MAX_NEWTON_ITERATIONS = 8;
    /**
     * A Newton step below this fraction of the variable ends the iteration. Newton converges
     * quadratically, so the error left after such a step is of order (1e-9)², below one ulp.
     */
    static final double NEWTON_TOLERANCE = 1e-9;

    private Region2() {
    }

    /**
     * Specific volume v(p,T) = (RT/p)·π·(γ⁰π + γʳπ), IAPWS R7-97(2012), Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return v, m³/kg
     */
    public static double specificVolume(double pressurePa, double temperatureK) {
        return GIBBS.specificVolume(pressurePa, temperatureK);
    }

    /**
     * Specific enthalpy h(p,T) = RT·τ·(γ⁰τ + γʳτ), IAPWS R7-97(2012), Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return h, J/kg
     */
    public static double enthalpy(double pressurePa, double temperatureK) {
        return GIBBS.enthalpy(pressurePa, temperatureK);
    }

    /**
     * Specific entropy s(p,T) = R·(τ·(γ⁰τ + γʳτ) − (γ⁰ + γʳ)), IAPWS R7-97(2012), Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return s, J/(kg·K)
     */
    public static double entropy(double pressurePa, double temperatureK) {
        return GIBBS.entropy(pressurePa, temperatureK);
    }

    /**
     * Specific internal energy u(p,T), IAPWS R7-97(2012), Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return u, J/kg
     */
    public static double internalEnergy(double pressurePa, double temperatureK) {
        return GIBBS.internalEnergy(pressurePa, temperatureK);
    }

    /**
     * Specific isobaric heat capacity cp(p,T) = −R·τ²·(γ⁰ττ + γʳττ), IAPWS R7-97(2012), Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return cp, J/(kg·K)
     */
    public static double isobaricHeatCapacity(double pressurePa, double temperatureK) {
        return GIBBS.isobaricHeatCapacity(pressurePa, temperatureK);
    }

    /**
     * Specific isochoric heat capacity cv(p,T), IAPWS R7-97(2012), Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return cv, J/(kg·K)
     */
    public static double isochoricHeatCapacity(double pressurePa, double temperatureK) {
        return GIBBS.isochoricHeatCapacity(pressurePa, temperatureK);
    }

    /**
     * Speed of sound w(p,T), IAPWS R7-97(2012), Table 12.
     *
     * @param pressurePa   p, Pa
     * @param temperatureK T, K
     * @return w, m/s
     */
    public static double speedOfSound(double pressurePa, double temperatureK) {
        return GIBBS.speedOfSound(pressurePa, temperatureK);
    }

    /**
     * The B2bc boundary as pressure from enthalpy, IAPWS R7-97(2012), eq. 20 with Table 19.
     * Valid from 3.5 MPa / 2.78 MJ/kg up to 100 MPa / 3.52 MJ/kg (the line from the saturation
     * curve at about 554.5 K to 1019.3 K at 100 MPa).
     *
     * @param enthalpy h, J/kg
     * @return p on B2bc, Pa
     */
    public static double boundaryPressure2bc(double enthalpy) {
        double eta = enthalpy / 1.0e3;
        return (B2BC_N1 + eta * (B2BC_N2 + eta * B2BC_N3)) * BACKWARD_P_STAR_PA;
    }

    /**
     * The B2bc boundary as enthalpy from pressure, IAPWS R7-97(2012), eq. 21 with Table 19.
     *
     * @param pressurePa p, Pa, from about 6.5 MPa to 100 MPa
     * @return h on B2bc, J/kg
     */
    public static double boundaryEnthalpy2bc(double pressurePa) {
        double pi = pressurePa / BACKWARD_P_STAR_PA;
        return (B2BC_N4 + Math.sqrt(Math.max((pi - B2BC_N5) / B2BC_N3, 0.0))) * 1.0e3;
    }

    /**
     * The boundary between subregions 2a and 2b for (h,s) input, h_2ab(s), IAPWS SR2-01(2014)
     * (Supp-PHS12), eq. 2 with Table 5; it approximates the isobar p = 4 MPa.
     *
     * @param entropy s, J/(kg·K), from s''(4 MPa) ≈ 6.07 kJ/(kg·K) to 9.16 kJ/(kg·K)
     * @return h on the boundary, J/kg
     */
    public static double boundaryEnthalpy2ab(double entropy) {
        double sigma = entropy / 1.0e3;
        return (H2AB_N1 + sigma * (H2AB_N2 + sigma * (H2AB_N3 + sigma * H2AB_N4))) * 1.0e3;
    }

    /**
     * The published backward equation T(p,h) of IAPWS R7-97(2012), choosing subregion 2a
     * (eq. 22, p ≤ 4 MPa), 2b (eq. 23, p ≤ p_B2bc(h)) or 2c (eq. 24) internally.
     *
     * @param pressurePa p, Pa
     * @param enthalpy   h, J/kg
     * @return T, K
     */
    public static double backwardTemperaturePH(double pressurePa, double enthalpy) {
        double pi = pressurePa / BACKWARD_P_STAR_PA;
        double eta = enthalpy / PH_H_STAR;
        if (pressurePa <= SUBREGION_2A_MAX_PRESSURE_PA) {
            return Region2Sums.thetaPH2a(pi, eta - 2.1);
        }
        if (pressurePa <= boundaryPressure2bc(enthalpy)) {
            return Region2Sums.thetaPH2b(pi - 2.0, eta - 2.6);
        }
        return Region2Sums.thetaPH2c(pi + 25.0, eta - 1.8);
    }

    /**
     * The published backward equation T(p,s) of IAPWS R7-97(2012), choosing subregion 2a
     * (eq. 25, p ≤ 4 MPa), 2b (eq. 26, s ≥ 5.85 kJ/(kg·K)) or 2c (eq. 27) internally.
     *
     * @param pressurePa p, Pa
     * @param entropy    s, J/(kg·K)
     * @return T, K
     */
    public static double backwardTemperaturePS(double pressurePa, double entropy) {
        double pi = pressurePa / BACKWARD_P_STAR_PA;
        if (pressurePa <= SUBREGION_2A_MAX_PRESSURE_PA) {
            return Region2Sums.thetaPS2a(Math.sqrt(Math.sqrt(pi)), entropy / PS_S_STAR_2A - 2.0);
        }
        if (entropy >= SUBREGION_2BC_ENTROPY) {
            return Region2Sums.thetaPS2b(pi, 10.0 - entropy / PS_S_STAR_2B);
        }
        return Region2Sums.thetaPS2c(pi, 2.0 - entropy / PS_S_STAR_2C);
    }

    /**
     * The published backward equation p(h,s) of IAPWS SR2-01(2014) (Supp-PHS12), choosing
     * subregion 2a (eq. 3, h ≤ h_2ab(s)), 2b (eq. 4, s ≥ 5.85 kJ/(kg·K)) or 2c (eq. 5) internally.
     *
     * @param enthalpy h, J/kg
     * @param entropy  s, J/(kg·K)
     * @return p, Pa
     */
    public static double backwardPressureHS(double enthalpy, double entropy) {
        double root;
        double pStar;
        if (enthalpy <= boundaryEnthalpy2ab(entropy)) {
            root = PI_HS_2A.sum(enthalpy / HS_H_STAR_2A - 0.5, entropy / HS_S_STAR_2A - 1.2);
            pStar = HS_P_STAR_2A_PA;
        } else if (entropy >= SUBREGION_2BC_ENTROPY) {
            root = PI_HS_2B.sum(enthalpy / HS_H_STAR_2B - 0.6, entropy / HS_S_STAR_2B - 1.01);
            pStar = HS_P_STAR_2BC_PA;
        } else {
            root = PI_HS_2C.sum(enthalpy / HS_H_STAR_2C - 0.7, entropy / HS_S_STAR_2C - 1.1);
            pStar = HS_P_STAR_2BC_PA;
        }
        double root2 = root * root;
        return root2 * root2 * pStar;
    }

    /**
     * Temperature from pressure and enthalpy, consistent with the forward equation: starts from
     * the backward equation and takes Newton steps on eq. 15 until {@link #enthalpy} at the result
     * equals h to rounding (typically two or three steps).
     *
     * @param pressurePa p, Pa
     * @param enthalpy   h, J/kg
     * @return T, K
     * @throws IllegalStateException if the iteration does not converge, naming p and h
     */
    public static double temperaturePH(double pressurePa, double enthalpy) {
        return temperaturePH(pressurePa, enthalpy, MAX_NEWTON_ITERATIONS);
    }

    static double temperaturePH(double pressurePa, double enthalpy, int maxIterations) {
        return GIBBS.temperaturePH(pressurePa, enthalpy, backwardTemperaturePH(pressurePa, enthalpy),
                maxIterations, NEWTON_TOLERANCE);
    }

    /**
     * Temperature from pressure and entropy, consistent with the forward equation: starts from
     * the backward equation and takes Newton steps on eq. 15 until {@link #entropy} at the result
     * equals s to rounding.
     *
     * @param pressurePa p, Pa
     * @param entropy    s, J/(kg·K)
     * @return T, K
     * @throws IllegalStateException if the iteration does not converge, naming p and s
     */
    public static double temperaturePS(double pressurePa, double entropy) {
        return temperaturePS(pressurePa, entropy, MAX_NEWTON_ITERATIONS);
    }

    static double temperaturePS(double pressurePa, double entropy, int maxIterations) {
        return GIBBS.temperaturePS(pressurePa, entropy, backwardTemperaturePS(pressurePa, entropy),
                maxIterations, NEWTON_TOLERANCE, false);
    }

    /**
     * Pressure from enthalpy and entropy, consistent with the forward equation: starts from the
     * Supp-PHS12 backward equation (and T(p,h) for the temperature) and takes two-dimensional
     * Newton steps in (ln p, T) on eq. 15 until {@link #enthalpy} and {@link #entropy} at the
     * result equal h and s to rounding.
     *
     * @param enthalpy h, J/kg
     * @param entropy  s, J/(kg·K)
     * @return p, Pa
     * @throws IllegalStateException if the iteration does not converge, naming h and s
     */
    public static double pressureHS(double enthalpy, double entropy) {
        return pressureHS(enthalpy, entropy, MAX_NEWTON_ITERATIONS);
    }

    static double pressureHS(double enthalpy, double entropy, int maxIterations) {
        double p0 = backwardPressureHS(enthalpy, entropy);
        double t0 = backwardTemperaturePH(p0, enthalpy);
        return GIBBS.pressureHS(enthalpy, entropy, p0, t0, maxIterations, NEWTON_TOLERANCE);
    }
}
