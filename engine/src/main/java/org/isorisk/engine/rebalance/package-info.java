/**
 * Rebalancing: from today's holdings to a proposal under the mandate and the trading limits (total turnover,
 * per-asset trade limits, proportional costs, a minimum trade size, a no-trade list), with the trade list,
 * costs, tracking error against today's portfolio, and the shadow price of every binding limit in the
 * project's one convention ∂V*∂limit. The problem is lifted to split buy/sell variables
 * {@code w = w0 + b − s, b, s ≥ 0} and solved by the project's QP. No I/O here.
 */
package org.isorisk.engine.rebalance;
