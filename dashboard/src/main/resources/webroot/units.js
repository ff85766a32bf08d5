'use strict';
// Conversions from the API's SI values to what the page shows. The US customary factors are those of
// NIST Special Publication 811 (2008 edition), Appendix B.8 and B.9:
//   1 psi           = 6.894 757 E+03 Pa
//   1 lb            = 4.535 923 7 E-01 kg        (exact)
//   1 Btu_IT/lb     = 2.326 E+03 J/kg            (exact)
//   1 Btu_IT/(lb·°F)= 4.1868 E+03 J/(kg·K)       (exact; the same per °R)
//   1 Btu_IT        = 1.055 056 E+03 J
//   t/°F            = 1.8 · (T/K) − 459.67       (exact)
// Power stays in MW in both systems (common practice in US plant reporting).
const Units = (() => {
  const PA_PER_PSI = 6894.757;
  const KG_PER_LB = 0.45359237;
  const J_PER_KG_PER_BTU_PER_LB = 2326.0;
  const J_PER_KGK_PER_BTU_PER_LBR = 4186.8;
  const J_PER_BTU = 1055.056;

  function fixed(v, digits) {
    return v.toLocaleString('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });
  }

  const systems = {
    SI: {
      pressure(pa) {
        return pa >= 1e6 ? { text: fixed(pa / 1e6, 2), unit: 'MPa' } : { text: fixed(pa / 1e3, 1), unit: 'kPa' };
      },
      temperature(k) { return { text: fixed(k - 273.15, 1), unit: '°C' }; },
      enthalpy(j) { return { text: fixed(j / 1e3, 1), unit: 'kJ/kg' }; },
      entropy(j) { return { text: fixed(j / 1e3, 4), unit: 'kJ/(kg·K)' }; },
      flow(kg) { return { text: fixed(kg, 1), unit: 'kg/s' }; },
      heatRate(kjPerKwh) { return { text: fixed(kjPerKwh, 0), unit: 'kJ/kWh' }; },
      // Axis helpers for the T–s diagram: value in display units from SI.
      tAxis(k) { return k - 273.15; },
      tAxisUnit: '°C',
      sAxis(j) { return j / 1e3; },
      sAxisUnit: 'kJ/(kg·K)',
      pressureLabel(pa) {
        return pa >= 1e6 ? fixed(pa / 1e6, 1) + ' MPa' : fixed(pa / 1e3, pa >= 1e5 ? 0 : 1) + ' kPa';
      },
    },
    US: {
      pressure(pa) { return { text: fixed(pa / PA_PER_PSI, pa >= 1e6 ? 0 : 2), unit: 'psia' }; },
      temperature(k) { return { text: fixed(1.8 * k - 459.67, 1), unit: '°F' }; },
      enthalpy(j) { return { text: fixed(j / J_PER_KG_PER_BTU_PER_LB, 1), unit: 'Btu/lb' }; },
      entropy(j) { return { text: fixed(j / J_PER_KGK_PER_BTU_PER_LBR, 4), unit: 'Btu/(lb·°R)' }; },
      flow(kg) { return { text: fixed(kg / KG_PER_LB, 0), unit: 'lb/s' }; },
      // kJ/kWh → kBtu/kWh.
      heatRate(kjPerKwh) { return { text: fixed(kjPerKwh * 1e3 / J_PER_BTU / 1e3, 3), unit: 'kBtu/kWh' }; },
      tAxis(k) { return 1.8 * k - 459.67; },
      tAxisUnit: '°F',
      sAxis(j) { return j / J_PER_KGK_PER_BTU_PER_LBR; },
      sAxisUnit: 'Btu/(lb·°R)',
      pressureLabel(pa) { return fixed(pa / PA_PER_PSI, pa >= PA_PER_PSI * 10 ? 0 : 2) + ' psia'; },
    },
  };

  function power(w) { return { text: fixed(w / 1e6, 1), unit: 'MW' }; }
  function percent(f) { return { text: fixed(f * 100, 2), unit: '%' }; }
  function ratio(f) { return { text: fixed(f, 4), unit: '' }; }
  function quality(x) { return { text: fixed(x, 3), unit: '' }; }

  return { systems, power, percent, ratio, quality, fixed };
})();
