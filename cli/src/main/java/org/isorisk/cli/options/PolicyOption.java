package org.isorisk.cli.options;

import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.io.LoadedUniverse;
import org.isorisk.engine.io.PolicyReader;
import org.isorisk.engine.io.SourceFile;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Policy;
import picocli.CommandLine.Option;

/**
 * {@code --policy FILE}: the mandate policy (YAML, see the README's "Policy file"), read by
 * {@link PolicyReader} against the assets of the loaded universe. The one way every command takes a policy: mix it
 * in with {@code @Mixin PolicyOption policyOption;} and call {@link #load(InputOptions)}, or
 * {@link #load(LoadedUniverse)} when the inputs are loaded otherwise (the demo).
 */
public final class PolicyOption {

    @Option(names = "--policy", paramLabel = "FILE",
            description = "Mandate policy (YAML): budget, bounds, groups, fixed weights, linear constraints, return "
                    + "target rule. Without it only the budget applies and short positions are allowed.")
    Path policy;

    /** A policy option naming {@code file}, for commands that read a policy of their own (the demo). */
    public static PolicyOption of(Path file) {
        PolicyOption o = new PolicyOption();
        o.policy = file;
        return o;
    }

    /** The policy file, if one was given. */
    public Optional<Path> path() {
        return Optional.ofNullable(policy);
    }

    /**
     * Loads the inputs, which must include the expected returns (every command that solves under a mandate needs
     * them), then reads the policy against them: the one loading step of solve, frontier, rebalance, stress and the
     * frontier-based charts.
     *
     * @see InputOptions#load(boolean)
     */
    public Loaded load(InputOptions inputs) {
        return load(inputs.load(true));
    }

    /**
     * Reads the policy for the universe's assets and records the file (name and SHA-256) in the inputs'
     * provenance.
     *
     * @param inputs the universe as loaded; its asset names are the ones the policy must use
     * @return the inputs (with the policy file among them) and the policy, empty when no {@code --policy} was given
     * @throws InputException naming the file, line and key of the first problem
     */
    public Loaded load(LoadedUniverse inputs) {
        if (policy == null) {
            return new Loaded(inputs, Optional.empty(), null);
        }
        PolicyReader.boundsFile(policy).ifPresent(f -> RunFiles.reading("bounds file named in --policy", f));
        Policy p = PolicyReader.read(policy, inputs.assets());
        SourceFile source = Fingerprint.of("policy", policy, "--policy");
        LoadedUniverse with = new LoadedUniverse(inputs.universe(), inputs.hasExpectedReturns(), inputs.spectrum(),
                inputs.provenance().withInput(source), inputs.warnings());
        return new Loaded(with, Optional.of(p), source.name());
    }

    /**
     * A policy read against a universe.
     *
     * @param inputs the universe, the policy file recorded in its provenance when one was read
     * @param policy the policy; empty without {@code --policy}
     * @param name   the policy file's name (no folder), null without a policy
     */
    public record Loaded(LoadedUniverse inputs, Optional<Policy> policy, String name) {

        /** True when a policy was given. */
        public boolean present() {
            return policy.isPresent();
        }

        /**
         * The policy, or without {@code --policy} the budget alone (short positions allowed) and no trading limits
         * or return target.
         */
        public Policy policyOrBudget() {
            return policy.orElseGet(() -> new Policy(Mandate.fullyInvested(inputs.assets().size()), null, null, null,
                    "(no policy: budget only)"));
        }

        /** The mandate to solve under: the policy's, or without a policy the budget alone. */
        public Mandate mandate() {
            return mandate(Map.of());
        }

        /** The mandate's groups by name, their members as asset indices, in the policy's order. */
        public Map<String, List<Integer>> groups() {
            Map<String, List<Integer>> groups = new LinkedHashMap<>();
            for (Group g : mandate().groups()) {
                groups.put(g.name(), g.members());
            }
            return groups;
        }

        /**
         * The mandate to solve under: the policy's, with {@code extraFixed} (asset index → weight, e.g. from
         * {@code --fix}) added to or replacing its fixed weights; without a policy, the budget alone with those
         * fixed weights.
         */
        public Mandate mandate(Map<Integer, Double> extraFixed) {
            Mandate base = policy.map(Policy::mandate).orElseGet(() -> Mandate.fullyInvested(inputs.assets().size()));
            if (extraFixed.isEmpty()) {
                return base;
            }
            Map<Integer, Double> fixed = new LinkedHashMap<>(base.fixed());
            fixed.putAll(extraFixed);
            return new Mandate(base.budget(), base.lower(), base.upper(), fixed, base.groups(), base.constraints());
        }
    }
}
