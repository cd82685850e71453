/**
 * Tables for the unit-root and cointegration tests.
 *
 * 1. Response-surface critical values of the (augmented) Dickey–Fuller and
 *    Engle–Granger τ statistics: MacKinnon, J.G. (2010), "Critical values for
 *    cointegration tests", Queen's Economics Department Working Paper 1227,
 *    Table 2 (constant, "c") and Table 3 (constant and trend, "ct"). The
 *    critical value for T observations is β∞ + β₁/T + β₂/T² + β₃/T³; N is the
 *    number of I(1) series (1 for the unit-root test).
 *
 *    Provenance of every cell (see docs/SOURCES.md): the cells were typed from
 *    the copy in statsmodels (tsa/adfvalues.py, tau_c_2010 and tau_ct_2010)
 *    and then held against the paper as reported in two public issue threads
 *    that quote the paper's Table 2 (EconStor copy of WP 1227, page 13):
 *    statsmodels/statsmodels#10271 and bashtage/arch#864. Those reports find
 *    that the widely used copy differs from the paper's Table 2 in five cells
 *    and matches Table 3 exactly. The five cells below carry the paper's
 *    value and say so beside it:
 *      N = 2, 1 %,  β₂: −22.527  (the copy: −33.527)
 *      N = 3, 5 %,  β₁: −8.5631  (the copy: −8.5632)
 *      N = 5, 5 %,  β₁: −14.0406 (the copy: −14.0405)
 *      N = 7, 10 %, β₂: −6.922   (the copy repeats N = 6's −5.104)
 *      N = 7, 10 %, β₃: 67.721   (the copy repeats N = 6's 27.877)
 *    The paper's own page was not at hand when this file was written; the
 *    remaining cells rest on the copy and the issue reports' statement that
 *    they agree with the paper.
 *
 * 2. Approximate asymptotic p-values: MacKinnon, J.G. (1994), "Approximate
 *    asymptotic distribution functions for unit-root and cointegration
 *    tests", Journal of Business & Economic Statistics 12(2), 167–176: the
 *    p-value is Φ(γ₀ + γ₁τ + γ₂τ² [+ γ₃τ³]), with the small-τ polynomial
 *    (degree 2) below τ*, the large-τ one (degree 3) above it, 0 below τ_min
 *    and 1 above τ_max. (The 2010 paper gives critical values only.) Typed
 *    from statsmodels' copy (tsa/adfvalues.py, tau_*_smallp, tau_*_largep,
 *    tau_star/min/max), not verified against the 1994 paper's tables.
 *
 * 3. Johansen trace and maximum-eigenvalue critical values (90 %, 95 %, 99 %)
 *    for 1–12 common stochastic trends: MacKinnon, J.G., Haug, A.A. &
 *    Michelis, L. (1999), "Numerical distribution functions of likelihood
 *    ratio tests for cointegration", Journal of Applied Econometrics 14,
 *    563–577, computed with their johdist program, as tabulated in LeSage's
 *    Econometrics Toolbox (c_sjt, c_sja) and statsmodels (tsa/coint_tables.py).
 *    Three deterministic cases: none (−1), a constant (0), a constant and a
 *    linear trend (1) in the data, as statsmodels' det_order.
 */

export type Deterministic = 'c' | 'ct';
/** Significance levels in the order of every table: 1 %, 5 %, 10 %. */
export const LEVELS = ['1%', '5%', '10%'] as const;

type Row = readonly [number, number, number, number];
type Block = readonly [Row, Row, Row];

/** MacKinnon (2010) Table 2: constant, no trend. Index N − 1, then 1 %, 5 %, 10 %. */
export const TAU_C_2010: readonly Block[] = [
  [[-3.43035, -6.5393, -16.786, -79.433], [-2.86154, -2.8903, -4.234, -40.040], [-2.56677, -1.5384, -2.809, 0]], // N = 1
  [[-3.89644, -10.9519, -22.527 /* paper; the copy has −33.527 */, 0], [-3.33613, -6.1101, -6.823, 0], [-3.04445, -4.2412, -2.720, 0]], // N = 2
  [[-4.29374, -14.4354, -33.195, 47.433], [-3.74066, -8.5631 /* paper; the copy has −8.5632 */, -10.852, 27.982], [-3.45218, -6.2143, -3.718, 0]], // N = 3
  [[-4.64332, -18.1031, -37.972, 0], [-4.09600, -11.2349, -11.175, 0], [-3.81020, -8.3931, -4.137, 0]], // N = 4
  [[-4.95756, -21.8883, -45.142, 0], [-4.41519, -14.0406 /* paper; the copy has −14.0405 */, -12.575, 0], [-4.13157, -10.7417, -3.784, 0]], // N = 5
  [[-5.24568, -25.6688, -57.737, 88.639], [-4.70693, -16.9178, -17.492, 60.007], [-4.42501, -13.1875, -5.104, 27.877]], // N = 6
  [[-5.51233, -29.5760, -69.398, 164.295], [-4.97684, -19.9021, -22.045, 110.761], [-4.69648, -15.7315, -6.922 /* paper; the copy repeats N = 6 */, 67.721 /* paper; the copy repeats N = 6 */]], // N = 7
  [[-5.76202, -33.5258, -82.189, 256.289], [-5.22924, -23.0023, -24.646, 144.479], [-4.95007, -18.3959, -7.344, 94.872]], // N = 8
  [[-5.99742, -37.6572, -87.365, 248.316], [-5.46697, -26.2057, -26.627, 176.382], [-5.18897, -21.1377, -9.484, 172.704]], // N = 9
  [[-6.22103, -41.7154, -102.680, 389.33], [-5.69244, -29.4521, -30.994, 251.016], [-5.41533, -24.0006, -7.514, 163.049]], // N = 10
  [[-6.43377, -46.0084, -106.809, 352.752], [-5.90714, -32.8336, -30.275, 249.994], [-5.63086, -26.9693, -4.083, 151.427]], // N = 11
  [[-6.63790, -50.2095, -124.156, 579.622], [-6.11279, -36.2681, -32.505, 314.802], [-5.83724, -29.9864, -2.686, 184.116]], // N = 12
];

/** MacKinnon (2010) Table 3: constant and linear trend. */
export const TAU_CT_2010: readonly Block[] = [
  [[-3.95877, -9.0531, -28.428, -134.155], [-3.41049, -4.3904, -9.036, -45.374], [-3.12705, -2.5856, -3.925, -22.380]],
  [[-4.32762, -15.4387, -35.679, 0], [-3.78057, -9.5106, -12.074, 0], [-3.49631, -7.0815, -7.538, 21.892]],
  [[-4.66305, -18.7688, -49.793, 104.244], [-4.11890, -11.8922, -19.031, 77.332], [-3.83511, -9.0723, -8.504, 35.403]],
  [[-4.96940, -22.4694, -52.599, 51.314], [-4.42871, -14.5876, -18.228, 39.647], [-4.14633, -11.2500, -9.873, 54.109]],
  [[-5.25276, -26.2183, -59.631, 50.646], [-4.71537, -17.3569, -22.660, 91.359], [-4.43422, -13.6078, -10.238, 76.781]],
  [[-5.51727, -29.9760, -75.222, 202.253], [-4.98228, -20.3050, -25.224, 132.03], [-4.70233, -16.1253, -9.836, 94.272]],
  [[-5.76537, -33.9165, -84.312, 245.394], [-5.23299, -23.3328, -28.955, 182.342], [-4.95405, -18.7352, -10.168, 120.575]],
  [[-6.00003, -37.8892, -96.428, 335.92], [-5.46971, -26.4771, -31.034, 220.165], [-5.19183, -21.4328, -10.726, 157.955]],
  [[-6.22288, -41.9496, -109.881, 466.068], [-5.69447, -29.7152, -33.784, 273.002], [-5.41738, -24.2882, -8.584, 169.891]],
  [[-6.43551, -46.1151, -120.814, 566.823], [-5.90887, -33.0251, -37.208, 346.189], [-5.63255, -27.2042, -6.792, 177.666]],
  [[-6.63894, -50.4287, -128.997, 642.781], [-6.11404, -36.4610, -36.246, 348.554], [-5.83850, -30.1995, -5.163, 210.338]],
  [[-6.83488, -54.7119, -139.800, 736.376], [-6.31127, -39.9676, -37.021, 406.051], [-6.03650, -33.2381, -6.606, 317.776]],
];

/** Critical values (1 %, 5 %, 10 %) of τ for N I(1) series and T observations (T = Infinity: asymptotic). */
export function tauCritical(n: number, deterministic: Deterministic, t: number): [number, number, number] {
  const table = deterministic === 'c' ? TAU_C_2010 : TAU_CT_2010;
  if (!Number.isInteger(n) || n < 1 || n > table.length) throw new Error(`critical values exist for 1 to ${table.length} series, not ${n}`);
  const x = Number.isFinite(t) ? 1 / t : 0;
  return table[n - 1].map(([b0, b1, b2, b3]) => b0 + x * (b1 + x * (b2 + x * b3))) as [number, number, number];
}

/** MacKinnon (1994) p-value polynomials, N = 1…6, as statsmodels scales them. */
const P_1994: Record<Deterministic, { star: number[]; min: number[]; max: number[]; small: number[][]; large: number[][] }> = {
  c: {
    star: [-1.61, -2.62, -3.13, -3.47, -3.78, -3.93],
    min: [-18.83, -18.86, -23.48, -28.07, -25.96, -23.27],
    max: [2.74, 0.92, 0.55, 0.61, 0.79, 1],
    small: [[2.1659, 1.4412, 3.8269], [2.92, 1.5012, 3.9796], [3.4699, 1.4856, 3.164], [3.9673, 1.4777, 2.6315], [4.5509, 1.5338, 2.9545], [5.1399, 1.6036, 3.4445]],
    large: [[1.7339, 9.3202, -1.2745, -1.0368], [2.1945, 6.4695, -2.9198, -4.2377], [2.5893, 4.5168, -3.6529, -5.0074], [3.0387, 4.5452, -3.3666, -4.1921], [3.5049, 5.2098, -2.9158, -3.3468], [3.9489, 5.8933, -2.5359, -2.721]],
  },
  ct: {
    star: [-2.89, -3.19, -3.50, -3.65, -3.80, -4.36],
    min: [-16.18, -21.15, -25.37, -26.63, -26.53, -26.18],
    max: [0.7, 0.63, 0.71, 0.93, 1.19, 1.42],
    small: [[3.2512, 1.6047, 4.9588], [3.6646, 1.5419, 3.6448], [4.0983, 1.5173, 2.9898], [4.5844, 1.5338, 2.8796], [5.0722, 1.5634, 2.9472], [5.53, 1.5914, 3.0392]],
    large: [[2.5261, 6.1654, -3.7956, -6.0285], [2.85, 5.272, -3.6622, -5.1695], [3.221, 5.255, -3.2685, -4.1501], [3.652, 5.9758, -2.7483, -3.2081], [4.0712, 6.6428, -2.3464, -2.546], [4.4735, 7.1757, -2.0681, -2.1196]],
  },
};
const SMALL_SCALE = [1, 1, 1e-2];
const LARGE_SCALE = [1, 1e-1, 1e-1, 1e-2];

/** The argument of Φ in MacKinnon's (1994) approximation, or ±Infinity outside [τ_min, τ_max]. */
export function tauPValueArgument(tau: number, n: number, deterministic: Deterministic): number {
  const p = P_1994[deterministic];
  if (!Number.isInteger(n) || n < 1 || n > p.star.length) throw new Error(`p-values exist for 1 to ${p.star.length} series, not ${n}`);
  if (tau > p.max[n - 1]) return Infinity;
  if (tau < p.min[n - 1]) return -Infinity;
  const small = tau <= p.star[n - 1];
  const coef = (small ? p.small : p.large)[n - 1];
  const scale = small ? SMALL_SCALE : LARGE_SCALE;
  let v = 0;
  for (let i = coef.length - 1; i >= 0; i--) v = v * tau + coef[i] * scale[i];
  return v;
}

/** Johansen critical values [90 %, 95 %, 99 %] by the number of common trends (n − r = 1…12). */
const TRACE: Record<-1 | 0 | 1, number[][]> = {
  [-1]: [[2.9762, 4.1296, 6.9406], [10.4741, 12.3212, 16.3640], [21.7781, 24.2761, 29.5147], [37.0339, 40.1749, 46.5716], [56.2839, 60.0627, 67.6367], [79.5329, 83.9383, 92.7136], [106.7351, 111.7797, 121.7375], [137.9954, 143.6691, 154.7977], [173.2292, 179.5199, 191.8122], [212.4721, 219.4051, 232.8291], [255.6732, 263.2603, 277.9962], [302.9054, 311.1288, 326.9716]],
  0: [[2.7055, 3.8415, 6.6349], [13.4294, 15.4943, 19.9349], [27.0669, 29.7961, 35.4628], [44.4929, 47.8545, 54.6815], [65.8202, 69.8189, 77.8202], [91.1090, 95.7542, 104.9637], [120.3673, 125.6185, 135.9825], [153.6341, 159.5290, 171.0905], [190.8714, 197.3772, 210.0366], [232.1030, 239.2468, 253.2526], [277.3740, 285.1402, 300.2821], [326.5354, 334.9795, 351.2150]],
  1: [[2.7055, 3.8415, 6.6349], [16.1619, 18.3985, 23.1485], [32.0645, 35.0116, 41.0815], [51.6492, 55.2459, 62.5202], [75.1027, 79.3422, 87.7748], [102.4674, 107.3429, 116.9829], [133.7852, 139.2780, 150.0778], [169.0618, 175.1584, 187.1891], [208.3582, 215.1268, 228.2226], [251.6293, 259.0267, 273.3838], [298.8836, 306.8988, 322.4264], [350.1125, 358.7190, 375.3203]],
};
const MAX_EIG: Record<-1 | 0 | 1, number[][]> = {
  [-1]: [[2.9762, 4.1296, 6.9406], [9.4748, 11.2246, 15.0923], [15.7175, 17.7961, 22.2519], [21.8370, 24.1592, 29.0609], [27.9160, 30.4428, 35.7359], [33.9271, 36.6301, 42.2333], [39.9085, 42.7679, 48.6606], [45.8930, 48.8795, 55.0335], [51.8528, 54.9629, 61.3449], [57.7954, 61.0404, 67.6415], [63.7248, 67.0756, 73.8856], [69.6513, 73.0946, 80.0937]],
  0: [[2.7055, 3.8415, 6.6349], [12.2971, 14.2639, 18.5200], [18.8928, 21.1314, 25.8650], [25.1236, 27.5858, 32.7172], [31.2379, 33.8777, 39.3693], [37.2786, 40.0763, 45.8662], [43.2947, 46.2299, 52.3069], [49.2855, 52.3622, 58.6634], [55.2412, 58.4332, 64.9960], [61.2041, 64.5040, 71.2525], [67.1307, 70.5392, 77.4877], [73.0563, 76.5734, 83.7105]],
  1: [[2.7055, 3.8415, 6.6349], [15.0006, 17.1481, 21.7465], [21.8731, 24.2522, 29.2631], [28.2398, 30.8151, 36.1930], [34.4202, 37.1646, 42.8612], [40.5244, 43.4183, 49.4095], [46.5583, 49.5875, 55.8171], [52.5858, 55.7302, 62.1741], [58.5316, 61.8051, 68.5030], [64.5292, 67.9040, 74.7434], [70.4630, 73.9355, 81.0678], [76.4081, 79.9878, 87.2395]],
};

/** [90 %, 95 %, 99 %] critical values of Johansen's trace and maximum-eigenvalue statistics for `trends` = n − r common trends. */
export function johansenCritical(trends: number, detOrder: -1 | 0 | 1): { trace: [number, number, number]; maxEig: [number, number, number] } {
  if (!Number.isInteger(trends) || trends < 1 || trends > 12) throw new Error(`Johansen critical values exist for 1 to 12 series, not ${trends}`);
  return { trace: TRACE[detOrder][trends - 1].slice() as [number, number, number], maxEig: MAX_EIG[detOrder][trends - 1].slice() as [number, number, number] };
}
