package org.isorisk.engine.rebalance;

import java.util.List;

/**
 * A limit of the policy that today's holdings break, and the proposed trades that cure it.
 *
 * @param constraint  the limit's name in the JSON contract: {@code upper:<asset>}, {@code lower:<asset>},
 *                    {@code group:<name>:min|max}, {@code fixed:<asset>}, {@code budget}, or a general constraint
 * @param current     today's value of the constrained quantity (a weight or a group total), decimal
 * @param limit       the limit, decimal
 * @param excess      how far today's value is beyond the limit (positive), decimal
 * @param proposed    the proposal's value of the same quantity; NaN when there is no proposal
 *                    ({@link Rebalancer#breaches})
 * @param cures       the trades of the proposal in the assets involved that move the quantity back within the limit
 *                    (empty when there is no proposal)
 * @param description a plain sentence
 */
public record Breach(String constraint, double current, double limit, double excess, double proposed,
                     List<Trade> cures, String description) {
    public Breach {
        cures = List.copyOf(cures);
    }
}
