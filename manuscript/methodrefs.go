package manuscript

import "sync"

// MethodBib is galley's reference table: the published works behind its
// estimators, tests and critical values, as BibTeX, so that a directive
// can name them by key (Result.Cites) and, with cite-methods: true in
// the front matter, the reference list includes them. Each entry's
// authors, year, title, journal, volume, issue and pages are checked in
// methodrefs_test.go against the bibliographic record named there.
const MethodBib = `
@article{dickey-fuller-1979,
  author = {Dickey, David A. and Fuller, Wayne A.},
  title = {Distribution of the Estimators for Autoregressive Time Series with a Unit Root},
  journal = {Journal of the American Statistical Association}, year = {1979},
  volume = {74}, number = {366}, pages = {427--431}}
@article{said-dickey-1984,
  author = {Said, Said E. and Dickey, David A.},
  title = {Testing for Unit Roots in Autoregressive-Moving Average Models of Unknown Order},
  journal = {Biometrika}, year = {1984}, volume = {71}, number = {3}, pages = {599--607}}
@article{phillips-perron-1988,
  author = {Phillips, Peter C. B. and Perron, Pierre},
  title = {Testing for a Unit Root in Time Series Regression},
  journal = {Biometrika}, year = {1988}, volume = {75}, number = {2}, pages = {335--346}}
@article{kpss-1992,
  author = {Kwiatkowski, Denis and Phillips, Peter C. B. and Schmidt, Peter and Shin, Yongcheol},
  title = {Testing the Null Hypothesis of Stationarity against the Alternative of a Unit Root: How Sure Are We that Economic Time Series Have a Unit Root?},
  journal = {Journal of Econometrics}, year = {1992}, volume = {54}, number = {1--3}, pages = {159--178}}
@article{ers-1996,
  author = {Elliott, Graham and Rothenberg, Thomas J. and Stock, James H.},
  title = {Efficient Tests for an Autoregressive Unit Root},
  journal = {Econometrica}, year = {1996}, volume = {64}, number = {4}, pages = {813--836}}
@article{zivot-andrews-1992,
  author = {Zivot, Eric and Andrews, Donald W. K.},
  title = {Further Evidence on the Great Crash, the Oil-Price Shock, and the Unit-Root Hypothesis},
  journal = {Journal of Business \& Economic Statistics}, year = {1992}, volume = {10}, number = {3}, pages = {251--270}}
@article{ng-perron-2001,
  author = {Ng, Serena and Perron, Pierre},
  title = {Lag Length Selection and the Construction of Unit Root Tests with Good Size and Power},
  journal = {Econometrica}, year = {2001}, volume = {69}, number = {6}, pages = {1519--1554}}
@article{mackinnon-1994,
  author = {MacKinnon, James G.},
  title = {Approximate Asymptotic Distribution Functions for Unit-Root and Cointegration Tests},
  journal = {Journal of Business \& Economic Statistics}, year = {1994}, volume = {12}, number = {2}, pages = {167--176}}
@techreport{mackinnon-2010,
  author = {MacKinnon, James G.},
  title = {Critical Values for Cointegration Tests},
  institution = {Queen's University, Department of Economics}, type = {Queen's Economics Department Working Paper},
  number = {1227}, year = {2010}}
@article{engle-granger-1987,
  author = {Engle, Robert F. and Granger, C. W. J.},
  title = {Co-Integration and Error Correction: Representation, Estimation, and Testing},
  journal = {Econometrica}, year = {1987}, volume = {55}, number = {2}, pages = {251--276}}
@article{phillips-ouliaris-1990,
  author = {Phillips, Peter C. B. and Ouliaris, Sam},
  title = {Asymptotic Properties of Residual Based Tests for Cointegration},
  journal = {Econometrica}, year = {1990}, volume = {58}, number = {1}, pages = {165--193}}
@article{gregory-hansen-1996,
  author = {Gregory, Allan W. and Hansen, Bruce E.},
  title = {Residual-Based Tests for Cointegration in Models with Regime Shifts},
  journal = {Journal of Econometrics}, year = {1996}, volume = {70}, number = {1}, pages = {99--126}}
@article{johansen-1991,
  author = {Johansen, S{\o}ren},
  title = {Estimation and Hypothesis Testing of Cointegration Vectors in Gaussian Vector Autoregressive Models},
  journal = {Econometrica}, year = {1991}, volume = {59}, number = {6}, pages = {1551--1580}}
@article{mhm-1999,
  author = {MacKinnon, James G. and Haug, Alfred A. and Michelis, Leo},
  title = {Numerical Distribution Functions of Likelihood Ratio Tests for Cointegration},
  journal = {Journal of Applied Econometrics}, year = {1999}, volume = {14}, number = {5}, pages = {563--577}}
@article{saikkonen-1991,
  author = {Saikkonen, Pentti},
  title = {Asymptotically Efficient Estimation of Cointegration Regressions},
  journal = {Econometric Theory}, year = {1991}, volume = {7}, number = {1}, pages = {1--21}}
@article{stock-watson-1993,
  author = {Stock, James H. and Watson, Mark W.},
  title = {A Simple Estimator of Cointegrating Vectors in Higher Order Integrated Systems},
  journal = {Econometrica}, year = {1993}, volume = {61}, number = {4}, pages = {783--820}}
@article{phillips-hansen-1990,
  author = {Phillips, Peter C. B. and Hansen, Bruce E.},
  title = {Statistical Inference in Instrumental Variables Regression with {I(1)} Processes},
  journal = {Review of Economic Studies}, year = {1990}, volume = {57}, number = {1}, pages = {99--125}}
@article{hansen-1992,
  author = {Hansen, Bruce E.},
  title = {Tests for Parameter Instability in Regressions with {I(1)} Processes},
  journal = {Journal of Business \& Economic Statistics}, year = {1992}, volume = {10}, number = {3}, pages = {321--335}}
@article{pss-2001,
  author = {Pesaran, M. Hashem and Shin, Yongcheol and Smith, Richard J.},
  title = {Bounds Testing Approaches to the Analysis of Level Relationships},
  journal = {Journal of Applied Econometrics}, year = {2001}, volume = {16}, number = {3}, pages = {289--326}}
@article{narayan-2005,
  author = {Narayan, Paresh Kumar},
  title = {The Saving and Investment Nexus for China: Evidence from Cointegration Tests},
  journal = {Applied Economics}, year = {2005}, volume = {37}, number = {17}, pages = {1979--1990}}
@incollection{sygn-2014,
  author = {Shin, Yongcheol and Yu, Byungchul and Greenwood-Nimmo, Matthew},
  title = {Modelling Asymmetric Cointegration and Dynamic Multipliers in a Nonlinear {ARDL} Framework},
  booktitle = {Festschrift in Honor of Peter Schmidt: Econometric Methods and Applications},
  editor = {Sickles, Robin C. and Horrace, William C.}, publisher = {Springer}, address = {New York},
  year = {2014}, pages = {281--314}}
@article{granger-1969,
  author = {Granger, C. W. J.},
  title = {Investigating Causal Relations by Econometric Models and Cross-spectral Methods},
  journal = {Econometrica}, year = {1969}, volume = {37}, number = {3}, pages = {424--438}}
@article{toda-yamamoto-1995,
  author = {Toda, Hiro Y. and Yamamoto, Taku},
  title = {Statistical Inference in Vector Autoregressions with Possibly Integrated Processes},
  journal = {Journal of Econometrics}, year = {1995}, volume = {66}, number = {1--2}, pages = {225--250}}
@article{pesaran-shin-1998,
  author = {Pesaran, H. Hashem and Shin, Yongcheol},
  title = {Generalized Impulse Response Analysis in Linear Multivariate Models},
  journal = {Economics Letters}, year = {1998}, volume = {58}, number = {1}, pages = {17--29}}
@article{crt-2012,
  author = {Cavaliere, Giuseppe and Rahbek, Anders and Taylor, A. M. Robert},
  title = {Bootstrap Determination of the Co-Integration Rank in Vector Autoregressive Models},
  journal = {Econometrica}, year = {2012}, volume = {80}, number = {4}, pages = {1721--1740}}
@article{park-1992,
  author = {Park, Joon Y.},
  title = {Canonical Cointegrating Regressions},
  journal = {Econometrica}, year = {1992}, volume = {60}, number = {1}, pages = {119--143}}
@article{newey-west-1987,
  author = {Newey, Whitney K. and West, Kenneth D.},
  title = {A Simple, Positive Semi-Definite, Heteroskedasticity and Autocorrelation Consistent Covariance Matrix},
  journal = {Econometrica}, year = {1987}, volume = {55}, number = {3}, pages = {703--708}}
@article{newey-west-1994,
  author = {Newey, Whitney K. and West, Kenneth D.},
  title = {Automatic Lag Selection in Covariance Matrix Estimation},
  journal = {Review of Economic Studies}, year = {1994}, volume = {61}, number = {4}, pages = {631--653}}
@article{white-1980,
  author = {White, Halbert},
  title = {A Heteroskedasticity-Consistent Covariance Matrix Estimator and a Direct Test for Heteroskedasticity},
  journal = {Econometrica}, year = {1980}, volume = {48}, number = {4}, pages = {817--838}}
@article{hansen-johansen-1999,
  author = {Hansen, Henrik and Johansen, Søren},
  title = {Some Tests for Parameter Constancy in Cointegrated VAR-Models},
  journal = {Econometrics Journal}, year = {1999}, volume = {2}, number = {2}, pages = {306--333}}
@article{jmn-2000,
  author = {Johansen, Søren and Mosconi, Rocco and Nielsen, Bent},
  title = {Cointegration Analysis in the Presence of Structural Breaks in the Deterministic Trend},
  journal = {Econometrics Journal}, year = {2000}, volume = {3}, number = {2}, pages = {216--249}}
@article{doornik-1998,
  author = {Doornik, Jurgen A.},
  title = {Approximations to the Asymptotic Distributions of Cointegration Tests},
  journal = {Journal of Economic Surveys}, year = {1998}, volume = {12}, number = {5}, pages = {573--593}}
@article{doornik-hansen-2008,
  author = {Doornik, Jurgen A. and Hansen, Henrik},
  title = {An Omnibus Test for Univariate and Multivariate Normality},
  journal = {Oxford Bulletin of Economics and Statistics}, year = {2008}, volume = {70}, number = {s1}, pages = {927--939}}
@article{edgerton-shukur-1999,
  author = {Edgerton, David and Shukur, Ghazi},
  title = {Testing Autocorrelation in a System Perspective},
  journal = {Econometric Reviews}, year = {1999}, volume = {18}, number = {4}, pages = {343--386}}
@book{lutkepohl-2005,
  author = {Lütkepohl, Helmut},
  title = {New Introduction to Multiple Time Series Analysis},
  publisher = {Springer}, address = {Berlin}, year = {2005}}
@article{bartlett-1937,
  author = {Bartlett, M. S.},
  title = {Properties of Sufficiency and Statistical Tests},
  journal = {Proceedings of the Royal Society of London, Series A}, year = {1937}, volume = {160}, number = {901}, pages = {268--282}}
@article{rocke-1989,
  author = {Rocke, David M.},
  title = {Bootstrap Bartlett Adjustment in Seemingly Unrelated Regression},
  journal = {Journal of the American Statistical Association}, year = {1989}, volume = {84}, number = {406}, pages = {598--601}}
`

const methodFile = "galley's reference table"

// methodLib is galley's reference table as a library, made on first use
// from methodTable, MethodBib as parsed when galley was built (parsing
// the BibTeX text cost a build that cites its methods 0.6 ms).
var methodLib = sync.OnceValue(func() *Library {
	lib := &Library{Entries: map[string]*BibEntry{}}
	for _, e := range methodTable() {
		lib.Entries[e.Key] = e
		lib.Keys = append(lib.Keys, e.Key)
	}
	return lib
})

// MethodLibrary is MethodBib parsed (when galley was built: it cannot
// fail at run time).
func MethodLibrary() *Library { return methodLib() }

// MethodEntry is the work key of galley's reference table.
func MethodEntry(key string) (*BibEntry, bool) {
	e, ok := methodLib().Entries[key]
	return e, ok
}
