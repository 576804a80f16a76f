package org.isorisk.cli.options;

import java.nio.file.Path;
import org.isorisk.cli.files.OutputPath;
import org.isorisk.cli.files.RunFiles;
import org.isorisk.engine.io.Provenance;
import org.isorisk.notebooks.chart.ChartContext;
import org.isorisk.notebooks.chart.ChartFormat;
import org.isorisk.notebooks.chart.ChartSettings;
import picocli.CommandLine.Option;

/**
 * The chart file of every {@code isorisk chart} subcommand: {@code --out FILE} (required; the extension gives the
 * format), {@code --png-scale X} and {@code --fund NAME}, in that order, with the settings and footnote context
 * they make.
 */
public final class ChartFileOptions {

    @OutputPath(RunFiles.Kind.CHART)
    @Option(names = "--out", paramLabel = "FILE", required = true,
            description = "The chart file; its extension gives the format: .png, .svg or .pdf.")
    Path out;

    @Option(names = "--png-scale", paramLabel = "X", defaultValue = "2",
            description = "Resolution of a PNG as a multiple of the chart's 800 x 600 size (default: ${DEFAULT-VALUE}, "
                    + "for print; 1 for screens).")
    double pngScale;

    @Option(names = "--fund", paramLabel = "NAME",
            description = "The fund's name for the footnote (default: the inputs' '# scenario:' line).")
    String fund;

    /** The chart file. */
    public Path file() {
        return out;
    }

    /** The format of the file's extension; refuses an unknown one (call it before any work). */
    public ChartFormat format() {
        return ChartFormat.fromFileName(out.toString());
    }

    /** The default chart settings at the chosen PNG scale. */
    public ChartSettings settings() {
        return ChartSettings.defaults().withPngScale(pngScale);
    }

    /** The footnote's context: the inputs' provenance and the fund's name of {@code --fund}, if given. */
    public ChartContext context(Provenance provenance) {
        return ChartContext.of(provenance, fund);
    }
}
