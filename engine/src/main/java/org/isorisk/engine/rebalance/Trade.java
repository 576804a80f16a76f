package org.isorisk.engine.rebalance;

/**
 * One line of the trade list.
 *
 * @param asset   asset name
 * @param current today's weight, decimal
 * @param target  proposed weight, decimal
 * @param trade   {@code target − current}, decimal weight
 * @param amount  {@code trade × fund size} in the fund's currency; NaN when the fund size is unknown
 * @param cost    estimated cost, decimal fraction of the fund ({@code c_i |trade|})
 * @param side    buy, sell or hold
 * @param frozen  why the asset was not traded, or null: {@code no-trade} (on the no-trade list) or
 *                {@code min-trade} (its trade was below the minimum trade size and was dropped)
 */
public record Trade(String asset, double current, double target, double trade, double amount, double cost, Side side,
                    String frozen) {

    /** Direction of a trade. */
    public enum Side {
        BUY("buy"), SELL("sell"), HOLD("hold");

        private final String label;

        Side(String label) {
            this.label = label;
        }

        public String label() {
            return label;
        }
    }
}
