package org.isorisk.cli.files;

import java.lang.reflect.Field;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import picocli.CommandLine.Model.ArgSpec;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Model.OptionSpec;

/**
 * Reads a parsed command's {@code Path} options into its {@link RunFiles}: options marked {@link OutputPath} are
 * declared as outputs, every other {@code Path} option (and positional parameter) is registered as an input, named
 * by its option. Called once by {@code BaseCommand} before the command's work, so no command has to remember it.
 */
public final class OptionPaths {
    private OptionPaths() {
    }

    /**
     * Registers the inputs, then declares (and so checks) the outputs of the command {@code spec} describes.
     *
     * @throws org.isorisk.engine.error.InputException when an output cannot be used (named, with a fix)
     */
    public static void declare(CommandSpec spec, RunFiles files) {
        List<Runnable> outputs = new ArrayList<>();
        List<ArgSpec> args = new ArrayList<>(spec.options());
        args.addAll(spec.positionalParameters());
        for (ArgSpec a : args) {
            List<Path> paths = paths(a.getValue());
            if (paths.isEmpty()) {
                continue;
            }
            String name = a instanceof OptionSpec o ? o.longestName() : a.paramLabel();
            OutputPath out = a.userObject() instanceof Field f ? f.getAnnotation(OutputPath.class) : null;
            if (out == null) {
                for (Path p : paths) {
                    files.input(name + " file", p);
                }
            } else {
                boolean replace = out.force().isEmpty() || Boolean.TRUE.equals(forceValue(spec, out.force()));
                for (Path p : paths) {
                    outputs.add(() -> files.output(name, p, out.value(), replace,
                            out.force().isEmpty() ? "--force" : out.force()));
                }
            }
        }
        outputs.forEach(Runnable::run);
    }

    private static Object forceValue(CommandSpec spec, String option) {
        OptionSpec o = spec.findOption(option);
        if (o == null) {
            throw new IllegalStateException("@OutputPath names the option " + option + ", which "
                    + spec.qualifiedName() + " does not have");
        }
        return o.getValue();
    }

    private static List<Path> paths(Object value) {
        if (value instanceof Path p) {
            return List.of(p);
        }
        List<Path> out = new ArrayList<>();
        if (value instanceof Collection<?> c) {
            for (Object o : c) {
                if (o instanceof Path p) {
                    out.add(p);
                }
            }
        }
        return out;
    }
}
