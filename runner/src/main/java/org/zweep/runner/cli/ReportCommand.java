package org.zweep.runner.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisJson;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.CircuitModel;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.report.HtmlReport;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep report DIR}: writes the self-contained {@code DIR/report.html} and prints its path. */
@Command(name = "report", mixinStandardHelpOptions = true,
        description = {"Writes DIR/report.html, a self-contained HTML report of a run folder.",
            "The plots are embedded and nothing outside the file is referenced; DIR/analysis.json and"
                + " DIR/plots/*.png|svg are written too. Prints the report's path."},
        footer = ExitCode.HELP_LIST)
public final class ReportCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "DIR", description = "the run folder")
    Path dir;

    @Option(names = "--model", paramLabel = "MODEL", description = "circuit to fit (default: from the part kind)")
    String model;

    @Override
    public Integer call() {
        AnalysisResult a = Analysis.analyze(RunData.read(dir).requirePoints(), model == null ? null : CircuitModel.byId(model));
        AnalysisJson.write(a);
        Path report = HtmlReport.write(a);
        spec.commandLine().getOut().println(report);
        return ExitCode.OK;
    }
}
