package org.isorisk.engine.model;

import java.util.List;
import org.isorisk.engine.error.InputException;

/**
 * A named set of assets whose total weight is limited, e.g. "Equity between 30 % and 60 %".
 *
 * @param name    group name as written in the policy
 * @param members indices into the asset universe (copied)
 * @param min     lowest total weight, decimal; {@code -Infinity} when absent
 * @param max     highest total weight, decimal; {@code +Infinity} when absent
 */
public record Group(String name, List<Integer> members, double min, double max) {
    public Group {
        if (name == null || name.isBlank()) {
            throw InputException.of("a group has no name").build();
        }
        if (members == null || members.isEmpty()) {
            throw InputException.of("group '" + name + "' names no member").fix("list at least one asset under members").build();
        }
        members = List.copyOf(members);
        if (Double.isNaN(min) || Double.isNaN(max) || min > max) {
            throw InputException.of("group '" + name + "' has min above max").value(min + " > " + max)
                    .fix("make min at most max").build();
        }
    }

    /** Constraint name of the lower limit, as in the JSON contract. */
    public String minName() {
        return "group:" + name + ":min";
    }

    /** Constraint name of the upper limit, as in the JSON contract. */
    public String maxName() {
        return "group:" + name + ":max";
    }
}
