package org.isorisk.cli.commands;

import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.Names;
import org.isorisk.engine.io.NumberText;

/** Reading pieces shared by {@code rebalance} and {@code stress}: asset=value options and asset names. */
final class TradingOptions {
    private TradingOptions() {
    }

    /** Index of an asset named on the command line, or an error listing the names. */
    static int asset(String option, String name, List<String> assets) {
        int i = assets.indexOf(name.strip());
        if (i < 0) {
            throw Names.hint(InputException.of(option + " names an asset that is not in the expected-returns file")
                    .asset(name.strip()), name.strip(), assets, "use one of the asset names: "
                    + String.join(", ", assets)).build();
        }
        return i;
    }

    /** A decimal typed on the command line, with the input files' strict rules. */
    static double decimal(String option, String asset, String text) {
        NumberText.Problem p = NumberText.problem(text);
        if (p != null) {
            throw InputException.of(option + ": " + p.problem()).asset(asset).value(text).fix(p.fix()).build();
        }
        return NumberText.parse(text);
    }

    /** Per-asset values of a repeatable {@code ASSET=VALUE} option; {@code all} sets every asset first. */
    static double[] perAsset(String option, Map<String, String> given, List<String> assets, double none) {
        double[] v = new double[assets.size()];
        Arrays.fill(v, none);
        Map<String, String> rest = new LinkedHashMap<>(given);
        String all = rest.remove("all");
        if (all != null) {
            Arrays.fill(v, decimal(option, "all", all));
        }
        for (Map.Entry<String, String> e : rest.entrySet()) {
            v[asset(option, e.getKey(), assets)] = decimal(option, e.getKey(), e.getValue());
        }
        return v;
    }
}
