package org.isorisk.engine.stress;

import java.util.List;
import org.isorisk.engine.error.InputException;

/**
 * Which assets a shock touches: all of them, the members of a group, or one asset.
 *
 * @param kind    all, group or asset
 * @param name    the group's or asset's name; {@code all} for every asset
 * @param members indices into the asset universe (copied); every index for {@link Kind#ALL}
 */
public record Scope(Kind kind, String name, List<Integer> members) {

    /** What a scope names. */
    public enum Kind { ALL, GROUP, ASSET }

    public Scope {
        if (kind == null || name == null || members == null || members.isEmpty()) {
            throw InputException.of("a shock names no asset").fix("give 'all', a group or an asset").build();
        }
        members = List.copyOf(members);
    }

    /** Every asset of a universe of n. */
    public static Scope all(int n) {
        return new Scope(Kind.ALL, "all", java.util.stream.IntStream.range(0, n).boxed().toList());
    }

    /** True when asset i is touched. */
    public boolean contains(int i) {
        return members.contains(i);
    }

    /** In words: "all assets", "group Equity", "asset Commodities". */
    public String describe() {
        return switch (kind) {
            case ALL -> "all assets";
            case GROUP -> "group " + name;
            case ASSET -> name;
        };
    }
}
