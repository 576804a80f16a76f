package org.isorisk.cli.commands;

import java.nio.file.Path;
import java.util.Locale;
import org.isorisk.cli.render.Text;
import org.isorisk.notebooks.chart.ChartFormat;
import org.isorisk.notebooks.chart.ChartSettings;
import org.isorisk.notebooks.chart.Charts;
import org.isorisk.notebooks.chart.Figure;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;
import picocli.CommandLine;

/**
 * {@code isorisk chart KIND}: one committee chart into a file whose extension gives the format (png, svg, pdf).
 * Each kind is a subcommand; they take the chart file through {@code ChartFileOptions} and share {@link #write},
 * which renders completely before the file is moved into place. {@link #checkFormat} and {@link #writeBeside} serve
 * the {@code --chart FILE} option of frontier and stress.
 */
@Command(name = "chart", mixinStandardHelpOptions = true,
        header = "Draw a committee chart into a PNG, SVG or PDF file.",
        description = {"Draw one committee chart into a file; the format comes from the file's extension (.png at "
                + "twice the chart's size for print, .svg, .pdf). Every chart carries the caution, the as-of date of "
                + "the assumptions and a short hash of the inputs in its footnote."},
        subcommands = {FrontierChartCommand.class, WeightsChartCommand.class, MarginalRiskChartCommand.class,
            RiskContributionsChartCommand.class})
public final class ChartCommand implements Runnable {

    @Spec
    CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(),
                "name a chart: " + String.join(", ", spec.subcommands().keySet()));
    }

    /** Refuses a {@code --chart} file whose extension is not a chart format, before any work; null passes. */
    static void checkFormat(Path file) {
        if (file != null) {
            ChartFormat.fromFileName(file.toString());
        }
    }

    /**
     * Writes {@code figure} to the {@code --chart} file beside the command's own output, with the default settings,
     * and says so on stderr (stdout stays the result alone).
     */
    static void writeBeside(BaseCommand cmd, Figure figure, Path file) {
        writeFile(cmd, figure, file, ChartSettings.defaults());
        cmd.wrote(file);
        cmd.err().flush();
    }

    /**
     * Writes {@code figure} to {@code file} (an output the command declared) atomically in the format of its
     * extension; returns the format.
     */
    static ChartFormat writeFile(BaseCommand cmd, Figure figure, Path file, ChartSettings settings) {
        ChartFormat format = ChartFormat.fromFileName(file.toString());
        cmd.files().bytes(file, out -> Charts.write(figure, format, settings, out));
        return format;
    }

    /**
     * Writes {@code figure} to {@code file} atomically in the format of its extension and prints what was written,
     * the chart's notices and the caution.
     */
    static void write(BaseCommand cmd, Figure figure, Path file, ChartSettings settings) {
        ChartFormat format = writeFile(cmd, figure, file, settings);
        StringBuilder sb = new StringBuilder();
        String size = format == ChartFormat.PNG
                ? String.format(Locale.ROOT, "%d x %d pixels", Math.round(figure.getWidth() * settings.pngScale()),
                Math.round(figure.getHeight() * settings.pngScale()))
                : String.format(Locale.ROOT, "%d x %d points", figure.getWidth(), figure.getHeight());
        sb.append(String.format(Locale.ROOT, "Wrote the %s chart to %s (%s, %s).\n", figure.kind().label(), file,
                format.extension().toUpperCase(Locale.ROOT), size));
        for (String n : figure.notices()) {
            sb.append(Text.wrap(n, "  ", "  "));
        }
        sb.append(Text.caution());
        cmd.out().print(sb);
        cmd.out().flush();
    }
}
