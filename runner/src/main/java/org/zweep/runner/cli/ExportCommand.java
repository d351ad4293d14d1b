package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.export.Exports;
import org.zweep.runner.export.Touchstone;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep export DIR --format csv|json|touchstone}. */
@Command(name = "export", mixinStandardHelpOptions = true,
        description = {"Exports a run folder as CSV, JSON or Touchstone one-port Z-parameter files.",
            "Touchstone: one .s1p per frequency sweep at fixed level and bias. Prints the files written."},
        footer = ExitCode.HELP_LIST)
public final class ExportCommand implements Callable<Integer> {
    /** Export formats. */
    enum Format { csv, json, touchstone }

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "DIR", description = "the run folder")
    Path dir;

    @Option(names = "--format", required = true, paramLabel = "FORMAT", description = "csv, json or touchstone")
    Format format;

    @Option(names = "--out", paramLabel = "FILE",
            description = "output file (csv, json; default DIR/export.csv|json) or folder (touchstone; default DIR)")
    Path out;

    @Option(names = "--touchstone-version", paramLabel = "V", defaultValue = "2.0",
            description = "2.0 (Z in ohms, default) or 1.1 (Z normalised to R)")
    String touchstoneVersion;

    @Option(names = "--reference-ohm", paramLabel = "R", defaultValue = "50",
            description = "the option line's reference resistance R in ohms (default 50)")
    double referenceOhm;

    @Override
    public Integer call() {
        PrintWriter pw = spec.commandLine().getOut();
        RunData run = RunData.read(dir).requirePoints();
        switch (format) {
            case csv -> {
                Path f = out != null ? out : dir.resolve("export.csv");
                Exports.csv(run, f);
                pw.println(f);
            }
            case json -> {
                Path f = out != null ? out : dir.resolve("export.json");
                Exports.json(run, Analysis.analyze(run, null), f);
                pw.println(f);
            }
            case touchstone -> {
                Touchstone.Version v = Touchstone.Version.of(touchstoneVersion);
                if (v == null) {
                    throw new InvalidInputException("--touchstone-version must be 2.0 or 1.1, not '" + touchstoneVersion
                            + "'");
                }
                if (!(referenceOhm > 0) || !Double.isFinite(referenceOhm)) {
                    throw new InvalidInputException("--reference-ohm must be a positive number of ohms");
                }
                List<Path> files = Exports.touchstone(run, out != null ? out : dir, v, referenceOhm);
                if (files.isEmpty()) {
                    throw new InvalidInputException(dir + ": no frequency sweep to export (every sweep has one frequency)");
                }
                files.forEach(pw::println);
            }
            default -> throw new IllegalStateException();
        }
        return ExitCode.OK;
    }
}
