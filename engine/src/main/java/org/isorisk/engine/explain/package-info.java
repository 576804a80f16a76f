/**
 * Words for numbers: the one caution text every output carries, and plain sentences that read multipliers
 * ("raising the return target by 0.10 % raises volatility by 0.07 %"). Shared by the command line, the charts
 * and the committee pack so that they all say the same thing.
 */
package org.isorisk.engine.explain;
