package org.isorisk.engine.stress;

import java.util.List;
import org.isorisk.engine.error.InputException;

/**
 * A named set of shocks applied together, in order.
 *
 * @param name        short name shown in tables, e.g. {@code crisis}
 * @param description a sentence for the reader; may be empty
 * @param shocks      the shocks (copied)
 */
public record Scenario(String name, String description, List<Shock> shocks) {
    public Scenario {
        if (name == null || name.isBlank()) {
            throw InputException.of("a scenario has no name").fix("give every scenario a name").build();
        }
        description = description == null ? "" : description;
        shocks = List.copyOf(shocks);
    }

    /** What the scenario does, in words: the description, or the shocks joined. */
    public String summary() {
        if (!description.isBlank()) {
            return description;
        }
        return String.join("; ", shocks.stream().map(Shock::describe).toList());
    }
}
