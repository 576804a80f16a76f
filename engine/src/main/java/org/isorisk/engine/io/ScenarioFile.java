package org.isorisk.engine.io;

import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.stress.Scenario;
import org.isorisk.engine.stress.Scope;
import org.isorisk.engine.stress.Shock;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads the stress scenario file, a small YAML layout of the project's own (documented in README.md):
 * <pre>
 * groups:                       # optional scopes beyond the policy's groups
 *   Equity: [Domestic Equity, Foreign Developed Equity, Emerging Equity]
 * scenarios:
 *   - name: crisis
 *     description: correlations jump, equity volatility up by half
 *     shocks:
 *       - volatility: {scope: Equity, multiplier: 1.5}
 *       - correlation: {scope: all, towards_one: 0.4}
 *       - correlation: {scope: Equity, set: 0.95}
 *       - return: {scope: Equity, shift: -0.02}
 *       - covariance: {file: crisis-covariance.csv}
 * </pre>
 * A scope is {@code all}, a group (the file's or the policy's) or an asset. Errors name the file, the line and
 * the key. Relative covariance files are read relative to the scenario file's folder.
 */
public final class ScenarioFile {
    private ScenarioFile() {
    }

    /** Reads a covariance file for a {@code covariance:} shock, in the universe's asset order. */
    @FunctionalInterface
    public interface CovarianceReader {
        double[][] read(Path file);
    }

    /**
     * Reads and validates a scenario file (not modified).
     *
     * @param file         the YAML file
     * @param assets       the universe's assets
     * @param policyGroups the policy's groups by name (member indices), usable as scopes
     * @param covariances  reader for {@code covariance:} shocks; null when none is available
     */
    public static List<Scenario> read(Path file, List<String> assets, Map<String, List<Integer>> policyGroups,
                                      CovarianceReader covariances) {
        String text;
        try {
            text = Files.readString(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw InputException.of("cannot read the scenario file: " + e.getMessage()).file(file.toString())
                    .fix("check the path and that the file is readable").build();
        }
        return parse(new StringReader(text), file.toString(), file.toAbsolutePath().getParent(), assets, policyGroups,
                covariances);
    }

    /** Reads a replacement covariance named in a scenario file that was read as an {@link InputFile}. */
    @FunctionalInterface
    public interface CovarianceInput {
        double[][] read(InputFile file);
    }

    /**
     * Reads and validates a scenario file wherever it lives (a local path, a Hadoop file system path); replacement
     * covariance files are resolved relative to it.
     *
     * @param covariances reader for {@code covariance:} shocks; null when none is available
     */
    public static List<Scenario> read(InputFile file, List<String> assets, Map<String, List<Integer>> policyGroups,
                                      CovarianceInput covariances) {
        String text = new String(file.readAll("scenario"), StandardCharsets.UTF_8);
        return parse(new StringReader(text), file.path(), assets, policyGroups,
                covariances == null ? null : f -> covariances.read(file.resolve(f)));
    }

    /** Parses scenario YAML from a reader; {@code name} is used in messages, {@code base} resolves files. */
    public static List<Scenario> parse(Reader in, String name, Path base, List<String> assets,
                                       Map<String, List<Integer>> policyGroups, CovarianceReader covariances) {
        return parse(in, name, assets, policyGroups, covariances == null ? null
                : f -> covariances.read(base == null ? Path.of(f) : base.resolve(f)));
    }

    private static List<Scenario> parse(Reader in, String name, List<String> assets,
                                        Map<String, List<Integer>> policyGroups,
                                        java.util.function.Function<String, double[][]> covariances) {
        Node root;
        try {
            root = new Yaml(new LoaderOptions()).compose(in);
        } catch (MarkedYAMLException e) {
            int line = e.getProblemMark() == null ? 0 : e.getProblemMark().getLine() + 1;
            throw InputException.of(String.format(Locale.ROOT, "line %d: not valid YAML (%s)", line, e.getProblem()))
                    .file(name).fix("check the indentation and the colons on that line").build();
        }
        Ctx c = new Ctx(name, assets, policyGroups == null ? Map.of() : policyGroups, covariances);
        if (!(root instanceof MappingNode top)) {
            throw c.error(root, "top", "the file must be a mapping with the key 'scenarios'",
                    "start the file with 'scenarios:' followed by a list of scenarios");
        }
        Node scenarios = null;
        for (NodeTuple t : top.getValue()) {
            String key = c.key(t);
            switch (key) {
                case "groups" -> c.groups(t.getValueNode());
                case "scenarios" -> scenarios = t.getValueNode();
                default -> throw c.error(t.getKeyNode(), key, "unknown key", "use 'groups' or 'scenarios'");
            }
        }
        if (!(scenarios instanceof SequenceNode list) || list.getValue().isEmpty()) {
            throw c.error(scenarios == null ? top : scenarios, "scenarios", "no scenarios given",
                    "list at least one scenario under 'scenarios:' (each starting with '- name:')");
        }
        List<Scenario> out = new ArrayList<>();
        Set<String> names = new HashSet<>();
        for (Node s : list.getValue()) {
            Scenario sc = c.scenario(s);
            if (!names.add(sc.name())) {
                throw c.error(s, "name", "scenario '" + sc.name() + "' is given twice", "give each scenario its own name");
            }
            out.add(sc);
        }
        return out;
    }

    private static final class Ctx {
        final String file;
        final List<String> assets;
        final Map<String, List<Integer>> groups = new LinkedHashMap<>();
        /** The covariance a relative file name stands for; null when none can be read. */
        final java.util.function.Function<String, double[][]> covariances;

        Ctx(String file, List<String> assets, Map<String, List<Integer>> policy,
            java.util.function.Function<String, double[][]> cov) {
            this.file = file;
            this.assets = assets;
            this.groups.putAll(policy);
            this.covariances = cov;
        }

        InputException error(Node at, String key, String problem, String fix) {
            int line = at == null ? 0 : at.getStartMark().getLine() + 1;
            return InputException.of(String.format(Locale.ROOT, "line %d, key '%s': %s", line, key, problem))
                    .file(file).fix(fix).build();
        }

        String key(NodeTuple t) {
            if (t.getKeyNode() instanceof ScalarNode s) {
                return s.getValue();
            }
            throw error(t.getKeyNode(), "?", "a key must be a plain word", "write keys as e.g. 'name:'");
        }

        String text(Node n, String key) {
            if (n instanceof ScalarNode s && !s.getValue().isBlank()) {
                return s.getValue().trim();
            }
            throw error(n, key, "expected a value", "write a value after '" + key + ":'");
        }

        double number(Node n, String key) {
            String t = text(n, key);
            try {
                double v = Double.parseDouble(t);
                if (Double.isFinite(v)) {
                    return v;
                }
            } catch (NumberFormatException e) {
                // fall through to the error below
            }
            throw error(n, key, "expected a number, got '" + t + "'",
                    "write a decimal number with a point, e.g. 1.5 or -0.02 (no percent sign)");
        }

        void groups(Node n) {
            if (!(n instanceof MappingNode m)) {
                throw error(n, "groups", "expected a mapping of group name to a list of assets",
                        "write e.g. 'Equity: [Domestic Equity, Emerging Equity]'");
            }
            for (NodeTuple t : m.getValue()) {
                String g = key(t);
                if (!(t.getValueNode() instanceof SequenceNode list) || list.getValue().isEmpty()) {
                    throw error(t.getValueNode(), "groups." + g, "expected a list of assets",
                            "write e.g. '" + g + ": [Domestic Equity, Emerging Equity]'");
                }
                List<Integer> members = new ArrayList<>();
                for (Node a : list.getValue()) {
                    String asset = text(a, "groups." + g);
                    int i = assets.indexOf(asset);
                    if (i < 0) {
                        throw error(a, "groups." + g, "unknown asset '" + asset + "'",
                                "use an asset named in the expected-return file");
                    }
                    members.add(i);
                }
                groups.put(g, members);
            }
        }

        Scenario scenario(Node n) {
            if (!(n instanceof MappingNode m)) {
                throw error(n, "scenarios", "each scenario must be a mapping with 'name' and 'shocks'",
                        "start each scenario with '- name: ...'");
            }
            String name = null;
            String description = "";
            List<Shock> shocks = new ArrayList<>();
            Node shocksNode = null;
            for (NodeTuple t : m.getValue()) {
                String key = key(t);
                switch (key) {
                    case "name" -> name = text(t.getValueNode(), "name");
                    case "description" -> description = text(t.getValueNode(), "description");
                    case "shocks" -> shocksNode = t.getValueNode();
                    default -> throw error(t.getKeyNode(), key, "unknown key in a scenario",
                            "use 'name', 'description' and 'shocks'");
                }
            }
            if (name == null) {
                throw error(n, "name", "a scenario has no name", "add 'name: ...' to the scenario");
            }
            if (!(shocksNode instanceof SequenceNode list) || list.getValue().isEmpty()) {
                throw error(shocksNode == null ? n : shocksNode, "shocks", "scenario '" + name + "' has no shocks",
                        "list its shocks under 'shocks:', e.g. '- volatility: {scope: all, multiplier: 1.5}'");
            }
            for (Node s : list.getValue()) {
                shocks.add(shock(s, name));
            }
            return new Scenario(name, description, shocks);
        }

        Shock shock(Node n, String scenario) {
            if (!(n instanceof MappingNode m) || m.getValue().size() != 1) {
                throw error(n, "shocks", "each shock is one of volatility, correlation, return or covariance",
                        "write e.g. '- volatility: {scope: all, multiplier: 1.5}'");
            }
            NodeTuple t = m.getValue().get(0);
            String kind = key(t);
            Map<String, Node> args = new LinkedHashMap<>();
            if (!(t.getValueNode() instanceof MappingNode a)) {
                throw error(t.getValueNode(), kind, "expected its settings in braces",
                        "write e.g. '" + kind + ": {scope: all, ...}'");
            }
            for (NodeTuple at : a.getValue()) {
                args.put(key(at), at.getValueNode());
            }
            String where = kind + " (scenario " + scenario + ")";
            switch (kind) {
                case "volatility" -> {
                    allow(args, where, "scope", "multiplier");
                    return wrap(where, () -> new Shock.VolatilityMultiplier(scope(args, t, where),
                            number(need(args, t, where, "multiplier"), kind + ".multiplier")), args.get("multiplier"));
                }
                case "correlation" -> {
                    allow(args, where, "scope", "towards_one", "set");
                    Scope s = scope(args, t, where);
                    if (args.containsKey("towards_one") == args.containsKey("set")) {
                        throw error(t.getValueNode(), kind, "give exactly one of 'towards_one' and 'set'",
                                "write 'towards_one: 0.3' (move 30 % of the way to 1) or 'set: 0.9'");
                    }
                    if (args.containsKey("towards_one")) {
                        Node v = args.get("towards_one");
                        return wrap(where, () -> new Shock.CorrelationShift(s, number(v, kind + ".towards_one")), v);
                    }
                    if (s.members().size() < 2) {
                        throw error(t.getValueNode(), kind + ".scope", "setting correlations needs a scope of at "
                                + "least two assets", "use 'all' or a group");
                    }
                    Node v = args.get("set");
                    return wrap(where, () -> new Shock.CorrelationSet(s, number(v, kind + ".set")), v);
                }
                case "return" -> {
                    allow(args, where, "scope", "shift");
                    Node v = need(args, t, where, "shift");
                    return wrap(where, () -> new Shock.ReturnShift(scope(args, t, where), number(v, kind + ".shift")),
                            v);
                }
                case "covariance" -> {
                    allow(args, where, "file");
                    Node v = need(args, t, where, "file");
                    String f = text(v, "covariance.file");
                    if (covariances == null) {
                        throw error(v, "covariance.file", "a replacement covariance cannot be read here",
                                "give the scenario file to a command that reads covariance files (isorisk stress)");
                    }
                    return new Shock.Covariance(f, covariances.apply(f));
                }
                default -> throw error(t.getKeyNode(), kind, "unknown shock",
                        "use volatility, correlation, return or covariance");
            }
        }

        Shock wrap(String where, java.util.function.Supplier<Shock> make, Node at) {
            try {
                return make.get();
            } catch (InputException e) {
                if (e.file().isPresent()) {
                    throw e;
                }
                throw error(at, where, e.problem() + e.value().map(v -> " (value '" + v + "')").orElse(""),
                        e.fix().orElse("correct the value"));
            }
        }

        void allow(Map<String, Node> args, String where, String... keys) {
            Set<String> ok = Set.of(keys);
            for (Map.Entry<String, Node> e : args.entrySet()) {
                if (!ok.contains(e.getKey())) {
                    throw error(e.getValue(), where + "." + e.getKey(), "unknown setting",
                            "use " + String.join(", ", keys));
                }
            }
        }

        Node need(Map<String, Node> args, NodeTuple t, String where, String key) {
            Node v = args.get(key);
            if (v == null) {
                throw error(t.getValueNode(), where, "'" + key + "' is missing", "add '" + key + ": ...'");
            }
            return v;
        }

        Scope scope(Map<String, Node> args, NodeTuple t, String where) {
            Node v = args.get("scope");
            if (v == null) {
                throw error(t.getValueNode(), where, "'scope' is missing", "add 'scope: all', a group or an asset");
            }
            String s = text(v, "scope");
            if (s.equals("all")) {
                return Scope.all(assets.size());
            }
            boolean isGroup = groups.containsKey(s);
            int asset = assets.indexOf(s);
            if (isGroup && asset >= 0) {
                throw error(v, "scope", "'" + s + "' is both a group and an asset", "rename the group");
            }
            if (isGroup) {
                return new Scope(Scope.Kind.GROUP, s, groups.get(s));
            }
            if (asset >= 0) {
                return new Scope(Scope.Kind.ASSET, s, List.of(asset));
            }
            throw error(v, "scope", "'" + s + "' is neither 'all', a group nor an asset",
                    "use 'all', a group of the policy or of this file's 'groups:', or an asset name");
        }
    }
}
