// Package simulate computes Monte Carlo critical values of unit-root and
// cointegration statistics at the exact sample size, number of variables
// and deterministic case of an application, under the null hypothesis:
//
//   - "adf": a Gaussian random walk of length T and the augmented
//     Dickey–Fuller regression with the case's deterministic terms and a
//     fixed number of lagged differences; τ = γ̂/se(γ̂).
//   - "eg": N independent Gaussian random walks of length T; the static
//     regression of the first on the case's deterministic terms and the
//     other N−1; the Dickey–Fuller τ of its residuals with the fixed lags
//     and no deterministic terms (Engle and Granger 1987).
//   - "johansen-trace", "johansen-maxeig": K = N independent Gaussian
//     random walks (cointegrating rank 0) and the statistic for H(0) with
//     K − r = K in one of Johansen's five cases with the fixed lags
//     (Johansen 1995, ch. 6). In cases c and ct the last walk carries a
//     dominating linear (c) or quadratic (ct) trend, the assumption under
//     which those cases' null distributions are tabulated (see johKernel).
//     With a Design (Spec.Design) the regressions also hold the model's
//     dummies and conditioning regressors, unrestricted or restricted to
//     the relations as estimated, held fixed in every replication: the
//     null distribution for that design at that T (step dummies in the
//     relations shift it even asymptotically; Johansen, Mosconi and
//     Nielsen 2000).
//
// Replications are split into blocks of BlockSize; block b draws from its
// own PCG generator seeded from (Seed, b) (see streamSeed), blocks are
// handed to the workers as they become free, and each statistic is stored
// at its replication index, so a result depends on the seed and not on
// the number of workers. Each worker reuses its buffers: a replication
// allocates nothing.
//
// Quantiles are the linear interpolation between order statistics
// (Hyndman and Fan 1996, definition 7); their Monte Carlo standard errors
// use the asymptotic variance of a sample quantile, p(1−p)/(n f(q)²),
// with 1/f(q) estimated by the difference quotient of the empirical
// quantile function over the Hall–Sheather bandwidth (Siddiqui 1960;
// Hall and Sheather 1988; Koenker 2005, §3.4.2).
//
// References:
//
//	Engle, R. F. and Granger, C. W. J. (1987). Co-integration and error
//	  correction. Econometrica 55, 251–276.
//	Hall, P. and Sheather, S. J. (1988). On the distribution of a
//	  studentized quantile. JRSS B 50, 381–391.
//	Hyndman, R. J. and Fan, Y. (1996). Sample quantiles in statistical
//	  packages. The American Statistician 50, 361–365.
//	Johansen, S. (1995). Likelihood-Based Inference in Cointegrated Vector
//	  Autoregressive Models. Oxford University Press.
//	Johansen, S., Mosconi, R. and Nielsen, B. (2000). Cointegration
//	  analysis in the presence of structural breaks in the deterministic
//	  trend. Econometrics Journal 3, 216–249.
//	Koenker, R. (2005). Quantile Regression. Cambridge University Press.
//	MacKinnon, J. G. (2010). Critical values for cointegration tests.
//	  Queen's Economics Department Working Paper 1227.
//	Siddiqui, M. M. (1960). Distribution of quantiles in samples from a
//	  bivariate population. J. Res. NBS 64B, 145–150.
//
// The package does no I/O; caching results is left to the caller, which
// can key them by Spec.Key.
package simulate
