package org.isorisk.engine.io;

import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.Set;
import org.isorisk.engine.error.InputException;
import org.isorisk.engine.model.Group;
import org.isorisk.engine.model.LinearConstraint;
import org.isorisk.engine.model.Mandate;
import org.isorisk.engine.model.Policy;
import org.isorisk.engine.model.Relation;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;
import org.yaml.snakeyaml.nodes.Tag;

/**
 * Reads isorisk's YAML mandate policy into a {@link Policy}. The file is composed into SnakeYAML's node tree
 * ({@code Yaml.compose}), not bound to objects, so every error can name the line and the key path, e.g.
 * {@code policy.yaml, line 12, key 'groups.Equity.min'}. The format is documented in the README ("Policy file").
 *
 * <p>Weights and limits are decimals (0.35 for 35 %); a value that looks like a percent (a {@code %} sign, or a
 * weight above the budget) is refused with the decimal to write instead. Inputs are never modified.
 */
public final class PolicyReader {
    private static final Set<String> TOP = Set.of("budget", "bounds", "bounds_file", "groups", "fixed", "turnover",
            "costs_bps", "constraints", "target_return", "trading");
    private static final Set<String> MIN_MAX = Set.of("min", "max");
    private static final Set<String> BOUNDS = Set.of("default", "assets");
    private static final Set<String> GROUP = Set.of("members", "min", "max");
    private static final Set<String> CONSTRAINT = Set.of("name", "coefficients", "relation", "limit");
    private static final Set<String> TURNOVER = Set.of("max");
    private static final Set<String> COSTS = Set.of("default", "assets");
    private static final Set<String> TRADING = Set.of("max_trade", "min_trade", "no_trade");

    private final String file;
    private final Path baseDir;
    private final List<String> assets;
    private final Map<String, Integer> index = new HashMap<>();
    private double budget = 1.0;

    private PolicyReader(String file, Path baseDir, List<String> assets) {
        this.file = file;
        this.baseDir = baseDir;
        this.assets = List.copyOf(assets);
        for (int i = 0; i < assets.size(); i++) {
            index.put(assets.get(i), i);
        }
    }

    /**
     * Reads a policy file for the given assets (in the order of the asset universe).
     *
     * @param path   the YAML file; a {@code bounds_file} inside it is resolved relative to its folder
     * @param assets asset names, in the order every vector follows
     * @throws InputException naming file, line and key for every problem
     */
    public static Policy read(Path path, List<String> assets) {
        String text;
        try {
            text = Files.readString(path, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw InputException.of("cannot read the policy file: " + e.getMessage()).file(path.toString())
                    .fix("check the path given to --policy").build();
        }
        Path dir = path.toAbsolutePath().getParent();
        return read(new StringReader(text), path.toString(), dir, assets);
    }

    /**
     * The per-asset table a policy file names with {@code bounds_file}, resolved against the policy's folder as
     * {@link #read(Path, List)} resolves it, without reading the table or checking the rest of the policy; empty
     * when the policy names none or is not readable YAML (reading it then reports the problem). For callers that
     * must know every file a run reads, e.g. so that no output of the run replaces one.
     */
    public static java.util.Optional<Path> boundsFile(Path policy) {
        try (Reader in = Files.newBufferedReader(policy, StandardCharsets.UTF_8)) {
            LoaderOptions options = new LoaderOptions();
            options.setAllowDuplicateKeys(true);
            if (new Yaml(options).compose(in) instanceof MappingNode m) {
                for (NodeTuple t : m.getValue()) {
                    if (t.getKeyNode() instanceof ScalarNode k && k.getValue().equals("bounds_file")
                            && t.getValueNode() instanceof ScalarNode v && !v.getValue().isBlank()) {
                        return java.util.Optional.of(policy.toAbsolutePath().getParent().resolve(v.getValue()));
                    }
                }
            }
        } catch (IOException | YAMLException | java.nio.file.InvalidPathException e) {
            // read() reports an unreadable or invalid policy with its line and a fix
        }
        return java.util.Optional.empty();
    }

    /**
     * Reads a policy from {@code reader} (not closed).
     *
     * @param fileName name used in messages
     * @param baseDir  folder against which {@code bounds_file} is resolved (may be null when it is not used)
     */
    public static Policy read(Reader reader, String fileName, Path baseDir, List<String> assets) {
        return new PolicyReader(fileName, baseDir, assets).parse(reader);
    }

    private Policy parse(Reader reader) {
        Node root;
        try {
            LoaderOptions options = new LoaderOptions();
            options.setAllowDuplicateKeys(true); // duplicates are reported below, with their line
            root = new Yaml(options).compose(reader);
        } catch (MarkedYAMLException e) {
            int line = e.getProblemMark() == null ? 1 : e.getProblemMark().getLine() + 1;
            throw InputException.of("not valid YAML: " + e.getProblem()).file(file).line(line)
                    .fix("check the indentation and the punctuation (':' after every key, '-' before list items)")
                    .build();
        } catch (YAMLException e) {
            throw InputException.of("not valid YAML: " + e.getMessage()).file(file)
                    .fix("check the file is a YAML mapping of policy keys").build();
        }
        if (root == null) {
            throw InputException.of("the policy file is empty").file(file)
                    .fix("give at least 'budget' and 'bounds' (see the README, section Policy file)").build();
        }
        Map<String, NodeTuple> top = mapping(root, "", TOP);
        int n = assets.size();
        if (top.containsKey("budget")) {
            Node b = top.get("budget").getValueNode();
            budget = number(b, "budget");
            if (Math.abs(budget) > 2) {
                throw error(b, "budget", "the budget looks like a percent", scalar(b))
                        .fix("write the budget as a decimal sum of weights, e.g. 1.0 for fully invested").build();
            }
        }
        double[] lo = new double[n];
        double[] hi = new double[n];
        Arrays.fill(lo, 0.0);
        Arrays.fill(hi, Double.POSITIVE_INFINITY);
        boolean[] named = new boolean[n];
        if (top.containsKey("bounds")) {
            bounds(top.get("bounds").getValueNode(), lo, hi, named);
        }
        Map<String, List<Integer>> fileMembers = new LinkedHashMap<>();
        Map<String, Integer> fileMemberLine = new HashMap<>();
        String limitsName = null;
        if (top.containsKey("bounds_file")) {
            Node f = top.get("bounds_file").getValueNode();
            limitsName = text(f, "bounds_file");
            limitsFile(f, limitsName, lo, hi, named, fileMembers, fileMemberLine);
        }
        Map<Integer, Double> fixed = new LinkedHashMap<>();
        if (top.containsKey("fixed")) {
            Map<String, NodeTuple> fx = mapping(top.get("fixed").getValueNode(), "fixed", null);
            for (Map.Entry<String, NodeTuple> e : fx.entrySet()) {
                String key = "fixed." + e.getKey();
                int i = asset(e.getValue().getKeyNode(), e.getKey(), key);
                fixed.put(i, weight(e.getValue().getValueNode(), key));
            }
        }
        List<Group> groups = new ArrayList<>();
        if (top.containsKey("groups")) {
            groups = groups(top.get("groups").getValueNode(), fileMembers);
        }
        for (String g : fileMembers.keySet()) {
            if (groups.stream().noneMatch(x -> x.name().equals(g))) {
                throw InputException.of("group '" + g + "' is not defined under 'groups' in " + file).file(limitsName)
                        .row(fileMemberLine.get(g)).column("group").value(g)
                        .fix("add '" + g + "' with its min and max under 'groups', or leave the group cell empty")
                        .build();
            }
        }
        List<LinearConstraint> constraints = new ArrayList<>();
        if (top.containsKey("constraints")) {
            constraints = constraints(top.get("constraints").getValueNode(), groups);
        }
        OptionalDouble target = OptionalDouble.empty();
        if (top.containsKey("target_return")) {
            Node t = top.get("target_return").getValueNode();
            double v = number(t, "target_return");
            if (Math.abs(v) > 1) {
                throw error(t, "target_return", "the return target looks like a percent", scalar(t))
                        .fix(String.format(Locale.ROOT, "write it as a decimal, e.g. %s for %s %%", decimal(v / 100),
                                scalar(t))).build();
            }
            target = OptionalDouble.of(v);
        }
        OptionalDouble turnover = OptionalDouble.empty();
        if (top.containsKey("turnover")) {
            Map<String, NodeTuple> t = mapping(top.get("turnover").getValueNode(), "turnover", TURNOVER);
            if (!t.containsKey("max")) {
                throw error(top.get("turnover").getValueNode(), "turnover", "turnover needs 'max'", null)
                        .fix("write turnover: {max: 0.20} for at most 20 % turnover").build();
            }
            Node v = t.get("max").getValueNode();
            double x = number(v, "turnover.max");
            if (x < 0) {
                throw error(v, "turnover.max", "turnover cannot be negative", scalar(v))
                        .fix("give a decimal between 0 and 2, e.g. 0.20").build();
            }
            if (x > 2) {
                throw error(v, "turnover.max", "the turnover limit looks like a percent", scalar(v))
                        .fix(String.format(Locale.ROOT, "write it as a decimal, e.g. %s for %s %%", decimal(x / 100),
                                scalar(v))).build();
            }
            turnover = OptionalDouble.of(x);
        }
        double[] costs = null;
        if (top.containsKey("costs_bps")) {
            costs = costs(top.get("costs_bps").getValueNode());
        }
        for (int i = 0; i < n; i++) {
            if (lo[i] > hi[i]) {
                throw InputException.of("the default bounds give min above max").file(file).asset(assets.get(i))
                        .fix("make bounds.default.min at most bounds.default.max").build();
            }
        }
        Mandate mandate = new Mandate(budget, lo, hi, fixed, groups, constraints);
        double[] maxTrade = null;
        double minTrade = 0;
        Set<Integer> noTrade = new java.util.TreeSet<>();
        if (top.containsKey("trading")) {
            Map<String, NodeTuple> t = mapping(top.get("trading").getValueNode(), "trading", TRADING);
            if (t.containsKey("max_trade")) {
                maxTrade = maxTrades(t.get("max_trade").getValueNode());
            }
            if (t.containsKey("min_trade")) {
                Node v = t.get("min_trade").getValueNode();
                minTrade = weight(v, "trading.min_trade");
                if (minTrade < 0) {
                    throw error(v, "trading.min_trade", "the minimum trade size cannot be negative", scalar(v))
                            .fix("give a decimal weight, e.g. 0.0025 for 0.25 % of the fund").build();
                }
            }
            if (t.containsKey("no_trade")) {
                Node v = t.get("no_trade").getValueNode();
                if (!(v instanceof SequenceNode list)) {
                    throw error(v, "trading.no_trade", "expected a list of assets", scalar(v))
                            .fix("write e.g. no_trade: [Infrastructure, Listed Real Estate]").build();
                }
                for (Node a : list.getValue()) {
                    noTrade.add(asset(a, text(a, "trading.no_trade"), "trading.no_trade"));
                }
            }
        }
        return new Policy(mandate, target, turnover, costs, file, maxTrade, minTrade, noTrade);
    }

    // ---- sections -----------------------------------------------------------------------------------------------

    private void bounds(Node node, double[] lo, double[] hi, boolean[] named) {
        Map<String, NodeTuple> b = mapping(node, "bounds", BOUNDS);
        if (b.containsKey("default")) {
            double[] d = minMax(b.get("default").getValueNode(), "bounds.default", 0.0, Double.POSITIVE_INFINITY);
            Arrays.fill(lo, d[0]);
            Arrays.fill(hi, d[1]);
        }
        if (b.containsKey("assets")) {
            Map<String, NodeTuple> a = mapping(b.get("assets").getValueNode(), "bounds.assets", null);
            for (Map.Entry<String, NodeTuple> e : a.entrySet()) {
                String key = "bounds.assets." + e.getKey();
                int i = asset(e.getValue().getKeyNode(), e.getKey(), key);
                double[] d = minMax(e.getValue().getValueNode(), key, lo[i], hi[i]);
                lo[i] = d[0];
                hi[i] = d[1];
                named[i] = true;
            }
        }
    }

    /** Reads {min, max}; absent keys keep the given defaults; YAML null means no limit. */
    private double[] minMax(Node node, String key, double defMin, double defMax) {
        Map<String, NodeTuple> mm = mapping(node, key, MIN_MAX);
        double min = defMin;
        double max = defMax;
        if (mm.containsKey("min")) {
            Node v = mm.get("min").getValueNode();
            min = isNull(v) ? Double.NEGATIVE_INFINITY : weight(v, key + ".min");
        }
        if (mm.containsKey("max")) {
            Node v = mm.get("max").getValueNode();
            max = isNull(v) ? Double.POSITIVE_INFINITY : weight(v, key + ".max");
        }
        if (min > max) {
            Node at = mm.containsKey("min") ? mm.get("min").getValueNode() : node;
            throw error(at, key, "min is above max", decimal(min) + " > " + decimal(max))
                    .fix("make min at most max").build();
        }
        return new double[] {min, max};
    }

    private List<Group> groups(Node node, Map<String, List<Integer>> fileMembers) {
        Map<String, NodeTuple> gs = mapping(node, "groups", null);
        List<Group> out = new ArrayList<>();
        for (Map.Entry<String, NodeTuple> e : gs.entrySet()) {
            String name = e.getKey();
            String key = "groups." + name;
            Node gn = e.getValue().getValueNode();
            Map<String, NodeTuple> g = mapping(gn, key, GROUP);
            List<Integer> members = new ArrayList<>();
            Set<Integer> seen = new HashSet<>();
            if (g.containsKey("members")) {
                Node mn = g.get("members").getValueNode();
                if (!(mn instanceof SequenceNode seq)) {
                    throw error(mn, key + ".members", "members must be a list of asset names", null)
                            .fix("write members: [Asset One, Asset Two]").build();
                }
                for (Node item : seq.getValue()) {
                    String a = text(item, key + ".members");
                    int i = asset(item, a, key + ".members");
                    if (!seen.add(i)) {
                        throw error(item, key + ".members", "asset '" + a + "' is listed twice", a)
                                .fix("list each member once").build();
                    }
                    members.add(i);
                }
            }
            for (int i : fileMembers.getOrDefault(name, List.of())) {
                if (seen.add(i)) {
                    members.add(i);
                }
            }
            if (members.isEmpty()) {
                throw error(gn, key, "group '" + name + "' names no member", null)
                        .fix("list its assets under members (or in the group column of the bounds file)").build();
            }
            double min = Double.NEGATIVE_INFINITY;
            double max = Double.POSITIVE_INFINITY;
            if (g.containsKey("min") && !isNull(g.get("min").getValueNode())) {
                min = weight(g.get("min").getValueNode(), key + ".min");
            }
            if (g.containsKey("max") && !isNull(g.get("max").getValueNode())) {
                max = weight(g.get("max").getValueNode(), key + ".max");
            }
            if (!Double.isFinite(min) && !Double.isFinite(max)) {
                throw error(gn, key, "group '" + name + "' has neither min nor max", null)
                        .fix("give min, max or both, e.g. {members: [...], min: 0.30, max: 0.60}").build();
            }
            if (min > max) {
                throw error(g.get("min").getValueNode(), key, "min is above max", decimal(min) + " > " + decimal(max))
                        .fix("make min at most max").build();
            }
            out.add(new Group(name, members, min, max));
        }
        return out;
    }

    private List<LinearConstraint> constraints(Node node, List<Group> groups) {
        if (!(node instanceof SequenceNode seq)) {
            throw error(node, "constraints", "constraints must be a list", null)
                    .fix("write each constraint as a list item starting with '- name: ...'").build();
        }
        List<LinearConstraint> out = new ArrayList<>();
        Set<String> names = new HashSet<>();
        int k = 0;
        for (Node item : seq.getValue()) {
            String key = "constraints[" + (k++) + "]";
            Map<String, NodeTuple> c = mapping(item, key, CONSTRAINT);
            for (String need : List.of("name", "coefficients", "relation", "limit")) {
                if (!c.containsKey(need)) {
                    throw error(item, key, "constraint needs '" + need + "'", null)
                            .fix("give name, coefficients, relation and limit").build();
                }
            }
            Node nameNode = c.get("name").getValueNode();
            String name = text(nameNode, key + ".name");
            key = "constraints." + name;
            if (name.isBlank() || name.contains(":") || name.equals("budget") || name.equals("target_return")) {
                throw error(nameNode, key + ".name", "constraint name '" + name + "' is reserved or malformed", name)
                        .fix("use a plain name without ':', other than budget and target_return").build();
            }
            if (!names.add(name)) {
                throw error(nameNode, key + ".name", "constraint name '" + name + "' is used twice", name)
                        .fix("give each constraint its own name").build();
            }
            Map<String, NodeTuple> co = mapping(c.get("coefficients").getValueNode(), key + ".coefficients", null);
            if (co.isEmpty()) {
                throw error(c.get("coefficients").getValueNode(), key + ".coefficients", "no coefficients", null)
                        .fix("give at least one asset with its coefficient").build();
            }
            double[] a = new double[assets.size()];
            for (Map.Entry<String, NodeTuple> e : co.entrySet()) {
                int i = asset(e.getValue().getKeyNode(), e.getKey(), key + ".coefficients." + e.getKey());
                a[i] = number(e.getValue().getValueNode(), key + ".coefficients." + e.getKey());
            }
            Node relNode = c.get("relation").getValueNode();
            String r = text(relNode, key + ".relation");
            Relation rel = switch (r) {
                case "<=" -> Relation.AT_MOST;
                case ">=" -> Relation.AT_LEAST;
                case "=", "==" -> Relation.EQUAL;
                default -> throw error(relNode, key + ".relation", "unknown relation '" + r + "'", r)
                        .fix("use \"<=\", \">=\" or \"=\" (in quotes)").build();
            };
            double limit = number(c.get("limit").getValueNode(), key + ".limit");
            if (limit != 0 && containsPercentSign(c.get("limit").getValueNode())) {
                throw error(c.get("limit").getValueNode(), key + ".limit", "the limit looks like a percent", null)
                        .build();
            }
            out.add(new LinearConstraint(name, a, rel, limit));
        }
        return out;
    }

    private double[] costs(Node node) {
        Map<String, NodeTuple> c = mapping(node, "costs_bps", COSTS);
        double[] out = new double[assets.size()];
        if (c.containsKey("default")) {
            Arrays.fill(out, bps(c.get("default").getValueNode(), "costs_bps.default"));
        }
        if (c.containsKey("assets")) {
            Map<String, NodeTuple> a = mapping(c.get("assets").getValueNode(), "costs_bps.assets", null);
            for (Map.Entry<String, NodeTuple> e : a.entrySet()) {
                String key = "costs_bps.assets." + e.getKey();
                int i = asset(e.getValue().getKeyNode(), e.getKey(), key);
                out[i] = bps(e.getValue().getValueNode(), key);
            }
        }
        return out;
    }

    /** Per-asset largest trade: {@code {default: 0.10, assets: {Infrastructure: 0.02}}}; no limit where absent. */
    private double[] maxTrades(Node node) {
        Map<String, NodeTuple> c = mapping(node, "trading.max_trade", COSTS);
        double[] out = new double[assets.size()];
        Arrays.fill(out, Double.POSITIVE_INFINITY);
        if (c.containsKey("default")) {
            Arrays.fill(out, tradeLimit(c.get("default").getValueNode(), "trading.max_trade.default"));
        }
        if (c.containsKey("assets")) {
            Map<String, NodeTuple> a = mapping(c.get("assets").getValueNode(), "trading.max_trade.assets", null);
            for (Map.Entry<String, NodeTuple> e : a.entrySet()) {
                String key = "trading.max_trade.assets." + e.getKey();
                int i = asset(e.getValue().getKeyNode(), e.getKey(), key);
                out[i] = tradeLimit(e.getValue().getValueNode(), key);
            }
        }
        return out;
    }

    private double tradeLimit(Node v, String key) {
        double x = weight(v, key);
        if (x < 0) {
            throw error(v, key, "a trade limit cannot be negative", scalar(v))
                    .fix("give the largest trade as a decimal weight, e.g. 0.05").build();
        }
        return x;
    }

    private double bps(Node v, String key) {
        double x = number(v, key);
        if (x < 0 || x > 10_000) {
            throw error(v, key, "a trading cost must be between 0 and 10000 basis points", scalar(v))
                    .fix("give the cost in basis points, e.g. 10 for 0.10 %").build();
        }
        return x;
    }

    /** The optional per-asset table {@code asset,min,max[,group]}, resolved against the policy's folder. */
    private void limitsFile(Node at, String name, double[] lo, double[] hi, boolean[] named,
                            Map<String, List<Integer>> members, Map<String, Integer> memberLine) {
        if (baseDir == null) {
            throw error(at, "bounds_file", "bounds_file cannot be resolved here", name)
                    .fix("read the policy from a file so that the bounds file can be found beside it").build();
        }
        Path path = baseDir.resolve(name);
        if (!Files.isRegularFile(path)) {
            throw error(at, "bounds_file", "cannot read the bounds file '" + name + "'", name)
                    .fix("give a path relative to the policy file's folder").build();
        }
        CsvTable table = Csv.read(path, "bounds");
        List<String> h = table.header().stream().map(x -> x.trim().toLowerCase(Locale.ROOT)).toList();
        if (!h.equals(List.of("asset", "min", "max")) && !h.equals(List.of("asset", "min", "max", "group"))) {
            throw InputException.of("the bounds file's header is not asset,min,max[,group]").file(name)
                    .row(table.headerRow()).value(String.join(",", table.header()))
                    .fix("make the first line: asset,min,max,group (group optional)").build();
        }
        Set<Integer> seen = new HashSet<>();
        for (CsvRow r : table.rows()) {
            int row = r.number();
            String a = r.cell(0).trim();
            Integer i = index.get(a);
            if (i == null) {
                throw InputException.of("unknown asset '" + a + "'").file(name).row(row).column("asset").value(a)
                        .fix(suggest(a)).build();
            }
            if (!seen.add(i) || named[i]) {
                throw InputException.of("asset '" + a + "' has bounds twice").file(name).row(row).column("asset")
                        .value(a).fix("give each asset's bounds once, in the table or under bounds.assets").build();
            }
            double min = cell(r.cell(1), lo[i], name, row, "min");
            double max = cell(r.cell(2), hi[i], name, row, "max");
            if (min > max) {
                throw InputException.of("min is above max").file(name).row(row).column("min")
                        .value(decimal(min) + " > " + decimal(max)).fix("make min at most max").build();
            }
            lo[i] = min;
            hi[i] = max;
            if (h.size() == 4 && !r.cell(3).isBlank()) {
                String g = r.cell(3).trim();
                members.computeIfAbsent(g, x -> new ArrayList<>()).add(i);
                memberLine.putIfAbsent(g, row);
            }
        }
    }

    private double cell(String s, double def, String name, int row, String column) {
        String t = s.trim();
        if (t.isEmpty()) {
            return def;
        }
        if (t.endsWith("%")) {
            throw InputException.of("a weight limit is written as a percent").file(name).row(row).column(column)
                    .value(t).fix("write decimals, e.g. " + percentToDecimal(t)).build();
        }
        if (t.contains(",") || !t.matches("[-+]?(\\d+\\.?\\d*|\\.\\d+)([eE][-+]?\\d+)?")) {
            throw InputException.of("not a number").file(name).row(row).column(column).value(t)
                    .fix("write a decimal with a point, e.g. 0.35").build();
        }
        double v = Double.parseDouble(t);
        if (Math.abs(v) > Math.max(1, Math.abs(budget))) {
            throw InputException.of("a weight limit looks like a percent").file(name).row(row).column(column).value(t)
                    .fix("write decimals, e.g. " + decimal(v / 100) + " for " + t + " %").build();
        }
        return v;
    }

    // ---- node helpers -------------------------------------------------------------------------------------------

    /** The entries of a mapping node by key, refusing non-mappings, non-text keys, duplicates and unknown keys. */
    private Map<String, NodeTuple> mapping(Node node, String key, Set<String> allowed) {
        if (!(node instanceof MappingNode map)) {
            throw error(node, key.isEmpty() ? "(top level)" : key, "expected a mapping of keys", scalar(node))
                    .fix(key.isEmpty() ? "write the policy as 'key: value' lines" : "write '" + leaf(key)
                            + ":' followed by indented 'key: value' lines").build();
        }
        Map<String, NodeTuple> out = new LinkedHashMap<>();
        for (NodeTuple t : map.getValue()) {
            Node k = t.getKeyNode();
            if (!(k instanceof ScalarNode sk)) {
                throw error(k, key, "a key must be plain text", null).build();
            }
            String name = sk.getValue();
            String path = key.isEmpty() ? name : key + "." + name;
            if (allowed != null && !allowed.contains(name)) {
                List<String> sorted = new ArrayList<>(allowed);
                sorted.sort(null);
                throw error(k, path, "unknown key '" + name + "'", name)
                        .fix("use one of " + String.join(", ", sorted)).build();
            }
            if (out.put(name, t) != null) {
                throw error(k, path, "key '" + name + "' is given twice", name).fix("keep one of the two").build();
            }
        }
        return out;
    }

    private int asset(Node at, String name, String key) {
        Integer i = index.get(name);
        if (i == null) {
            throw error(at, key, "unknown asset '" + name + "'", name).fix(suggest(name)).build();
        }
        return i;
    }

    private String suggest(String name) {
        String best = null;
        int bestD = Integer.MAX_VALUE;
        for (String a : assets) {
            int d = distance(name.toLowerCase(Locale.ROOT), a.toLowerCase(Locale.ROOT));
            if (d < bestD) {
                bestD = d;
                best = a;
            }
        }
        if (best != null && bestD <= Math.max(2, name.length() / 3)) {
            return "did you mean '" + best + "'? Asset names must match the expected-returns file exactly";
        }
        return "use an asset name from the expected-returns file (names match exactly, case included)";
    }

    /** Levenshtein edit distance, for "did you mean". */
    private static int distance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            prev[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            cur[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int c = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                cur[j] = Math.min(Math.min(cur[j - 1] + 1, prev[j] + 1), prev[j - 1] + c);
            }
            int[] t = prev;
            prev = cur;
            cur = t;
        }
        return prev[b.length()];
    }

    /** A weight or weight limit: a number, refused when it looks like a percent. */
    private double weight(Node v, String key) {
        double x = number(v, key);
        if (Math.abs(x) > Math.max(1, Math.abs(budget))) {
            throw error(v, key, "the value looks like a percent", scalar(v))
                    .fix(String.format(Locale.ROOT, "weights are decimals: write %s for %s %%", decimal(x / 100),
                            scalar(v))).build();
        }
        return x;
    }

    private double number(Node v, String key) {
        if (!(v instanceof ScalarNode s) || isNull(v)) {
            throw error(v, key, "expected a number", scalar(v)).fix("write a decimal number, e.g. 0.35").build();
        }
        String t = s.getValue().trim();
        if (t.endsWith("%")) {
            throw error(v, key, "the value is written as a percent", t)
                    .fix("write decimals, e.g. " + percentToDecimal(t)).build();
        }
        if (s.getTag().equals(Tag.BOOL)) {
            throw error(v, key, "expected a number, found yes/no", t).fix("write a decimal number, e.g. 0.35").build();
        }
        if (t.equals(".inf") || t.equals("+.inf") || t.equals("-.inf")) {
            return t.startsWith("-") ? Double.NEGATIVE_INFINITY : Double.POSITIVE_INFINITY;
        }
        if (!t.matches("[-+]?(\\d+\\.?\\d*|\\.\\d+)([eE][-+]?\\d+)?")) {
            throw error(v, key, "not a number", t)
                    .fix(t.contains(",") ? "use a decimal point, not a comma, e.g. 0.35"
                            : "write a decimal number, e.g. 0.35").build();
        }
        return Double.parseDouble(t);
    }

    private String text(Node v, String key) {
        if (!(v instanceof ScalarNode s) || isNull(v)) {
            throw error(v, key, "expected a text value", scalar(v)).build();
        }
        return s.getValue();
    }

    private static boolean isNull(Node v) {
        return v instanceof ScalarNode s && s.getTag().equals(Tag.NULL);
    }

    private static boolean containsPercentSign(Node v) {
        return v instanceof ScalarNode s && s.getValue().contains("%");
    }

    private static String scalar(Node v) {
        return v instanceof ScalarNode s ? s.getValue() : null;
    }

    private InputException.Builder error(Node at, String key, String problem, String value) {
        InputException.Builder b = InputException.of(problem).file(file).key(key);
        if (at != null && at.getStartMark() != null) {
            b.line(at.getStartMark().getLine() + 1);
        }
        if (value != null) {
            b.value(value);
        }
        return b;
    }

    private static String leaf(String key) {
        int dot = key.lastIndexOf('.');
        return dot < 0 ? key : key.substring(dot + 1);
    }

    private static String percentToDecimal(String t) {
        String num = t.substring(0, t.length() - 1).trim();
        try {
            return decimal(Double.parseDouble(num) / 100) + " for " + num + " %";
        } catch (NumberFormatException e) {
            return "0.35 for 35 %";
        }
    }

    /** A decimal without trailing zeros, locale-independent: 0.35, 0.05, 1.0. */
    static String decimal(double v) {
        String s = new java.math.BigDecimal(Double.toString(v)).stripTrailingZeros().toPlainString();
        return s.contains(".") ? s : s + ".0";
    }
}
