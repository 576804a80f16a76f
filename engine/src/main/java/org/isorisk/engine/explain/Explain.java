package org.isorisk.engine.explain;

import java.util.Locale;
import org.isorisk.engine.model.Multiplier;

/** Plain-language readings of shadow prices, for a small step in the constraint's limit. */
public final class Explain {
    private Explain() {
    }

    /** Step used for return-target sentences: 0.10 % (decimal 0.001). */
    public static final double RETURN_STEP = 0.001;
    /** Step used for weight limits (bounds, groups, budget, fixed weights): 1.00 % (decimal 0.01). */
    public static final double WEIGHT_STEP = 0.01;

    /** Formats a decimal as a percent with two decimals, locale-independent: 0.0123 → "1.23 %". */
    public static String percent(double decimal) {
        return String.format(Locale.ROOT, "%.2f %%", decimal * 100);
    }

    /**
     * One sentence saying what a small step in the constraint's limit does to volatility, to first order.
     * Slack inequalities get a sentence saying so.
     */
    public static String sentence(Multiplier m) {
        String c = m.constraint();
        if (!m.binding()) {
            String d = describe(c);
            return Character.toUpperCase(d.charAt(0)) + d.substring(1) + " is not binding: moving it a little changes "
                    + "nothing.";
        }
        boolean isReturn = c.equals("target_return") || c.startsWith("return");
        double step = isReturn ? RETURN_STEP : WEIGHT_STEP;
        double dv = m.volatilityPerUnit() * step;
        String verb = dv > 0 ? "raises" : dv < 0 ? "lowers" : "leaves";
        // Below half a basis point the two-decimal percent would read "0.00 %", which looks like no effect at all.
        String tail = dv == 0 ? "volatility unchanged"
                : Math.abs(dv) < 0.00005 ? "volatility by less than 0.01 %" : "volatility by " + percent(Math.abs(dv));
        String lead = switch (kind(c)) {
            case "target_return" -> "Raising the return target by " + percent(step);
            case "budget" -> "Raising the budget (sum of weights) by " + percent(step);
            case "upper" -> "Raising the upper limit of " + c.substring(6) + " by " + percent(step);
            case "lower" -> "Raising the lower limit of " + c.substring(6) + " by " + percent(step);
            case "fixed" -> "Raising the fixed weight of " + c.substring(6) + " by " + percent(step);
            case "group", "turnover", "trade_limit" -> "Raising " + describe(c) + " by " + percent(step);
            default -> "Raising the limit of " + describe(c) + " by " + percent(step);
        };
        String extra = c.equals("target_return") ? " (the marginal risk of tightening the return target)" : "";
        return lead + " " + verb + " " + tail + extra + ".";
    }

    private static String kind(String c) {
        if (c.equals("target_return") || c.equals("budget")) {
            return c;
        }
        int colon = c.indexOf(':');
        return colon < 0 ? c : c.substring(0, colon);
    }

    /** A constraint name in words: {@code group:Equity:max} → "the maximum of group Equity". */
    public static String describe(String c) {
        if (c.equals("target_return")) {
            return "The return target";
        }
        if (c.equals("budget")) {
            return "The budget";
        }
        if (c.startsWith("group:")) {
            String rest = c.substring(6);
            if (rest.endsWith(":max")) {
                return "the maximum of group " + rest.substring(0, rest.length() - 4);
            }
            if (rest.endsWith(":min")) {
                return "the minimum of group " + rest.substring(0, rest.length() - 4);
            }
            return "the total of group " + rest;
        }
        if (c.startsWith("upper:")) {
            return "the upper limit of " + c.substring(6);
        }
        if (c.startsWith("lower:")) {
            return "the lower limit of " + c.substring(6);
        }
        if (c.startsWith("fixed:")) {
            return "the fixed weight of " + c.substring(6);
        }
        if (c.equals("turnover")) {
            return "the turnover limit";
        }
        if (c.startsWith("trade_limit:")) {
            return "the trade limit of " + c.substring(12);
        }
        return "constraint " + c;
    }
}
