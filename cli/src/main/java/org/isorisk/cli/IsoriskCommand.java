package org.isorisk.cli;

import java.io.IOException;
import java.io.InputStream;
import java.util.List;
import java.util.Properties;
import org.isorisk.cli.commands.ChartCommand;
import org.isorisk.cli.commands.BatchCommand;
import org.isorisk.cli.commands.CheckCommand;
import org.isorisk.cli.commands.DemoCommand;
import org.isorisk.cli.commands.EstimateCommand;
import org.isorisk.cli.commands.FrontierCommand;
import org.isorisk.cli.commands.PackCommand;
import org.isorisk.cli.commands.RebalanceCommand;
import org.isorisk.cli.commands.RiskCommand;
import org.isorisk.cli.commands.SolveCommand;
import org.isorisk.cli.commands.StressCommand;
import org.isorisk.engine.explain.Caution;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/**
 * The root {@code isorisk} command. Every command is registered here, one class per command in
 * {@code org.isorisk.cli.commands}: adding a command is one class and one entry in {@link #COMMANDS}.
 */
@Command(name = "isorisk", mixinStandardHelpOptions = true, versionProvider = IsoriskCommand.Version.class,
        description = {"Minimum-risk portfolios for a return target, with the shadow price of every constraint, "
                + "a KKT certificate and the risk decomposition of any portfolio.", "",
                "Caution: " + Caution.TEXT},
        footer = {"", "Exit codes: 0 ok, 1 internal error, 2 bad input or usage, 3 no solution.",
                "Run 'isorisk COMMAND --help' for a command's options."})
public final class IsoriskCommand implements Runnable {

    /** Every command, in the order help lists them. Register a new command here (one line). */
    public static final List<Class<?>> COMMANDS = List.of(
            CheckCommand.class,
            SolveCommand.class,
            FrontierCommand.class,
            EstimateCommand.class,
            RiskCommand.class,
            RebalanceCommand.class,
            StressCommand.class,
            BatchCommand.class,
            ChartCommand.class,
            PackCommand.class,
            DemoCommand.class);

    @Spec
    CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(),
                "name a command: " + String.join(", ", spec.subcommands().keySet()));
    }

    /** Reads the version Maven wrote into {@code version.properties}. */
    public static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() throws IOException {
            Properties p = new Properties();
            try (InputStream in = IsoriskCommand.class.getResourceAsStream("version.properties")) {
                if (in != null) {
                    p.load(in);
                }
            }
            return new String[] {"isorisk " + p.getProperty("version", "(unknown version)")};
        }
    }
}
