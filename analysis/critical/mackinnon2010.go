package critical

import (
	"errors"
	"fmt"
)

// MacKinnonLevels are the significance levels of MacKinnon's (2010)
// response surfaces.
var MacKinnonLevels = []float64{0.01, 0.05, 0.10}

// MaxTauN is the largest number of variables N covered by the response
// surfaces of MacKinnon (2010).
const MaxTauN = 12

// surface holds β∞, β1, β2, β3 of one response surface.
type surface [4]float64

// tau2010 holds the response-surface coefficients of MacKinnon (2010),
// "Critical Values for Cointegration Tests", Queen's Economics Department
// Working Paper 1227, Table 2 (the appendix added in the 2010 reissue),
// indexed [case][N−1][level] with levels 1%, 5%, 10%. The no-constant
// case is tabulated for N = 1 only. Where the paper fits no β3 the entry
// is 0.
//
// The coefficients were transcribed from a public transcription of the
// paper's table (the paper itself was not at hand) and are verified
// against statsmodels 0.13.5 mackinnoncrit in critical_test.go. Doubtful:
// the c, N = 7, 10% row has the same β2, β3 (−5.104, 27.877) as the
// N = 6 row; statsmodels has the same numbers, but this could not be
// checked against the printed paper.
var tau2010 = [4][][3]surface{
	NoConst: {
		{{-2.56574, -2.2358, -3.627, 0}, {-1.94100, -0.2686, -3.365, 31.223}, {-1.61682, 0.2656, -2.714, 25.364}},
	},
	Const: {
		{{-3.43035, -6.5393, -16.786, -79.433}, {-2.86154, -2.8903, -4.234, -40.040}, {-2.56677, -1.5384, -2.809, 0}},
		{{-3.89644, -10.9519, -33.527, 0}, {-3.33613, -6.1101, -6.823, 0}, {-3.04445, -4.2412, -2.720, 0}},
		{{-4.29374, -14.4354, -33.195, 47.433}, {-3.74066, -8.5632, -10.852, 27.982}, {-3.45218, -6.2143, -3.718, 0}},
		{{-4.64332, -18.1031, -37.972, 0}, {-4.09600, -11.2349, -11.175, 0}, {-3.81020, -8.3931, -4.137, 0}},
		{{-4.95756, -21.8883, -45.142, 0}, {-4.41519, -14.0405, -12.575, 0}, {-4.13157, -10.7417, -3.784, 0}},
		{{-5.24568, -25.6688, -57.737, 88.639}, {-4.70693, -16.9178, -17.492, 60.007}, {-4.42501, -13.1875, -5.104, 27.877}},
		{{-5.51233, -29.5760, -69.398, 164.295}, {-4.97684, -19.9021, -22.045, 110.761}, {-4.69648, -15.7315, -5.104, 27.877}},
		{{-5.76202, -33.5258, -82.189, 256.289}, {-5.22924, -23.0023, -24.646, 144.479}, {-4.95007, -18.3959, -7.344, 94.872}},
		{{-5.99742, -37.6572, -87.365, 248.316}, {-5.46697, -26.2057, -26.627, 176.382}, {-5.18897, -21.1377, -9.484, 172.704}},
		{{-6.22103, -41.7154, -102.680, 389.33}, {-5.69244, -29.4521, -30.994, 251.016}, {-5.41533, -24.0006, -7.514, 163.049}},
		{{-6.43377, -46.0084, -106.809, 352.752}, {-5.90714, -32.8336, -30.275, 249.994}, {-5.63086, -26.9693, -4.083, 151.427}},
		{{-6.63790, -50.2095, -124.156, 579.622}, {-6.11279, -36.2681, -32.505, 314.802}, {-5.83724, -29.9864, -2.686, 184.116}},
	},
	ConstTrend: {
		{{-3.95877, -9.0531, -28.428, -134.155}, {-3.41049, -4.3904, -9.036, -45.374}, {-3.12705, -2.5856, -3.925, -22.380}},
		{{-4.32762, -15.4387, -35.679, 0}, {-3.78057, -9.5106, -12.074, 0}, {-3.49631, -7.0815, -7.538, 21.892}},
		{{-4.66305, -18.7688, -49.793, 104.244}, {-4.11890, -11.8922, -19.031, 77.332}, {-3.83511, -9.0723, -8.504, 35.403}},
		{{-4.96940, -22.4694, -52.599, 51.314}, {-4.42871, -14.5876, -18.228, 39.647}, {-4.14633, -11.2500, -9.873, 54.109}},
		{{-5.25276, -26.2183, -59.631, 50.646}, {-4.71537, -17.3569, -22.660, 91.359}, {-4.43422, -13.6078, -10.238, 76.781}},
		{{-5.51727, -29.9760, -75.222, 202.253}, {-4.98228, -20.3050, -25.224, 132.03}, {-4.70233, -16.1253, -9.836, 94.272}},
		{{-5.76537, -33.9165, -84.312, 245.394}, {-5.23299, -23.3328, -28.955, 182.342}, {-4.95405, -18.7352, -10.168, 120.575}},
		{{-6.00003, -37.8892, -96.428, 335.92}, {-5.46971, -26.4771, -31.034, 220.165}, {-5.19183, -21.4328, -10.726, 157.955}},
		{{-6.22288, -41.9496, -109.881, 466.068}, {-5.69447, -29.7152, -33.784, 273.002}, {-5.41738, -24.2882, -8.584, 169.891}},
		{{-6.43551, -46.1151, -120.814, 566.823}, {-5.90887, -33.0251, -37.208, 346.189}, {-5.63255, -27.2042, -6.792, 177.666}},
		{{-6.63894, -50.4287, -128.997, 642.781}, {-6.11404, -36.4610, -36.246, 348.554}, {-5.83850, -30.1995, -5.163, 210.338}},
		{{-6.83488, -54.7119, -139.800, 736.376}, {-6.31127, -39.9676, -37.021, 406.051}, {-6.03650, -33.2381, -6.606, 317.776}},
	},
	ConstTrendSq: {
		{{-4.37113, -11.5882, -35.819, -334.047}, {-3.83239, -5.9057, -12.490, -118.284}, {-3.55326, -3.6596, -5.293, -63.559}},
		{{-4.69276, -20.2284, -64.919, 88.884}, {-4.15387, -13.3114, -28.402, 72.741}, {-3.87346, -10.4637, -17.408, 66.313}},
		{{-4.99071, -23.5873, -76.924, 184.782}, {-4.45311, -15.7732, -32.316, 122.705}, {-4.17280, -12.4909, -17.912, 83.285}},
		{{-5.26780, -27.2836, -78.971, 137.871}, {-4.73244, -18.4833, -31.875, 111.817}, {-4.45268, -14.7199, -17.969, 101.92}},
		{{-5.52826, -30.9051, -92.490, 248.096}, {-4.99491, -21.2360, -37.685, 194.208}, {-4.71587, -17.0820, -18.631, 136.672}},
		{{-5.77379, -34.7010, -105.937, 393.991}, {-5.24217, -24.2177, -39.153, 232.528}, {-4.96397, -19.6064, -18.858, 174.919}},
		{{-6.00609, -38.7383, -108.605, 365.208}, {-5.47664, -27.3005, -39.498, 246.918}, {-5.19921, -22.2617, -17.910, 208.494}},
		{{-6.22758, -42.7154, -119.622, 421.395}, {-5.69983, -30.4365, -44.300, 345.48}, {-5.42320, -24.9686, -19.688, 274.462}},
		{{-6.43933, -46.7581, -136.691, 651.38}, {-5.91298, -33.7584, -42.686, 346.629}, {-5.63704, -27.8965, -13.880, 236.975}},
		{{-6.64235, -50.9783, -145.462, 752.228}, {-6.11753, -37.056, -48.719, 473.905}, {-5.84215, -30.8119, -14.938, 316.006}},
		{{-6.83743, -55.2861, -152.651, 792.577}, {-6.31396, -40.5507, -46.771, 487.185}, {-6.03921, -33.8950, -9.122, 285.164}},
		{{-7.02582, -59.6037, -166.368, 989.879}, {-6.50353, -44.0797, -47.242, 543.889}, {-6.22941, -36.9673, -10.868, 418.414}},
	},
}

// MacKinnonTau returns the lower-tail critical value at the given level
// (0.01, 0.05 or 0.10) of the Dickey–Fuller τ statistic (n = 1) or of the
// Engle–Granger residual-based cointegration τ with n variables
// (n = 2..12), for sample size t, from the response surfaces of
// MacKinnon (2010, Table 2):
//
//	cv(T) = β∞ + β1/T + β2/T² + β3/T³.
//
// T is the number of observations in the test regression; t = 0 gives
// the asymptotic value β∞. The no-constant case is covered for n = 1
// only, as in the paper.
func MacKinnonTau(n int, c Case, t int, level float64) (float64, error) {
	s, err := tauSurfaces(n, c)
	if err != nil {
		return 0, err
	}
	if t < 0 {
		return 0, fmt.Errorf("critical: sample size %d is negative (use 0 for the asymptotic value)", t)
	}
	i, err := levelIndex(level, MacKinnonLevels)
	if err != nil {
		return 0, fmt.Errorf("critical: MacKinnon (2010): %w", err)
	}
	return evalSurface(s[i], t), nil
}

// MacKinnonTauAll returns the 1%, 5% and 10% values of MacKinnonTau.
func MacKinnonTauAll(n int, c Case, t int) ([]Value, error) {
	s, err := tauSurfaces(n, c)
	if err != nil {
		return nil, err
	}
	if t < 0 {
		return nil, fmt.Errorf("critical: sample size %d is negative (use 0 for the asymptotic value)", t)
	}
	out := make([]Value, len(MacKinnonLevels))
	for i, l := range MacKinnonLevels {
		out[i] = Value{Level: l, Value: evalSurface(s[i], t)}
	}
	return out, nil
}

func tauSurfaces(n int, c Case) ([3]surface, error) {
	if !c.valid() {
		return [3]surface{}, fmt.Errorf("critical: unsupported deterministic case %d (want n, c, ct or ctt)", int(c))
	}
	if n < 1 || n > MaxTauN {
		return [3]surface{}, fmt.Errorf("critical: MacKinnon (2010) response surfaces cover N = 1..%d variables, not %d", MaxTauN, n)
	}
	if c == NoConst && n != 1 {
		return [3]surface{}, errors.New("critical: MacKinnon (2010) tabulates the no-constant case (n) for N = 1 only")
	}
	return tau2010[c][n-1], nil
}

func evalSurface(b surface, t int) float64 {
	if t == 0 {
		return b[0]
	}
	x := 1 / float64(t)
	return b[0] + x*(b[1]+x*(b[2]+x*b[3]))
}
