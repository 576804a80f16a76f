/**
 * Views blended with the equilibrium (Black &amp; Litterman 1992, "Global Portfolio Optimization", FAJ 48(5);
 * He &amp; Litterman 1999, "The Intuition Behind Black-Litterman Model Portfolios").
 * <p>
 * {@link org.isorisk.engine.views.Blend} is the front door: a {@link org.isorisk.engine.views.Prior} (returns
 * implied by reference weights and a risk aversion or a Sharpe ratio, or given) and a list of
 * {@link org.isorisk.engine.views.View}s (a portfolio over the assets, its expected total return, and a confidence,
 * a variance or neither) give a {@link org.isorisk.engine.views.Posterior}: posterior expected returns, the
 * uncertainty of the mean M and the posterior covariance Σ + M, the unconstrained optimum and each view's weight
 * in it (He &amp; Litterman's Λ, called view weights here), and a table of each view's implied return before and
 * after. {@link org.isorisk.engine.views.ViewPortfolios} builds view portfolios on groups of assets.
 * <p>
 * Units: decimals, annualised. Implied returns {@code Π = δΣw} are excess returns over the risk-free rate; the
 * prior, the views and the posterior are stated as total returns ({@code r_f + Π}), and the computation converts
 * at the edges. No I/O: reading the views file belongs to {@code engine.io}.
 */
package org.isorisk.engine.views;
