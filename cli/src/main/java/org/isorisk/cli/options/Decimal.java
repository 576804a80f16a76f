package org.isorisk.cli.options;

import org.isorisk.engine.io.NumberText;
import picocli.CommandLine;

/** Reads numeric options with the same strict rules as the input files (decimal point, finite). */
public final class Decimal implements CommandLine.ITypeConverter<Double> {
    @Override
    public Double convert(String value) {
        NumberText.Problem p = NumberText.problem(value);
        if (p != null) {
            throw new CommandLine.TypeConversionException("'" + value + "': " + p.problem() + "; fix: " + p.fix());
        }
        return NumberText.parse(value);
    }
}
