package org.zweep.runner.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.jfree.chart.plot.XYPlot;
import org.jfree.data.xy.XYDataset;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.TestRunFolders;

/** Every frequency sweep of a step is drawn: overlaid with a legend, six to a chart. */
class PlotsTest {
    @TempDir
    Path tmp;

    /** A 100 nF, 20 mΩ, 1 nH capacitor swept at {@code levels.length} drive levels. */
    private AnalysisResult run(double... levels) throws Exception {
        TestRunFolders run = new TestRunFolders(tmp.resolve("run" + levels.length));
        for (double level : levels) {
            List<Impedance> z = new ArrayList<>();
            for (int i = 0; i <= 30; i++) {
                double f = 100e3 * Math.pow(10, i / 10.0);
                double w = 2 * Math.PI * f;
                z.add(new Impedance(f, 0.02, w * 1e-9 - 1 / (w * 100e-9 * (1 + 0.01 * level))));
            }
            run.impedance("sweep", z, "V", level, "V", 0.0, "none", 0);
        }
        return Analysis.analyze(run.write());
    }

    private static List<String> seriesNames(XYDataset d) {
        List<String> names = new ArrayList<>();
        for (int i = 0; i < d.getSeriesCount(); i++) {
            names.add(d.getSeriesKey(i).toString());
        }
        return names;
    }

    @Test
    void threeSweepsOfAStepAreOverlaidWithOneLegendEntryEach() throws Exception {
        List<Plots.Named> charts = Plots.charts(run(0.1, 0.5, 1.0));
        assertEquals(List.of("sweep-impedance", "sweep-rx", "sweep-value", "sweep-d"),
                charts.stream().map(Plots.Named::name).toList());
        XYPlot impedance = charts.get(0).chart().getXYPlot();
        assertEquals(List.of("|Z|, 100 mV, bias 0 V", "|Z|, 500 mV, bias 0 V", "|Z|, 1 V, bias 0 V"),
                seriesNames(impedance.getDataset(0)));
        assertEquals(3, impedance.getDataset(1).getSeriesCount()); // θ of each
        // measured points and the fitted line of each sweep
        XYDataset value = charts.get(2).chart().getXYPlot().getDataset();
        assertEquals(6, seriesNames(value).stream().filter(n -> n.contains(" measured") || n.contains(" fitted")).count(),
                seriesNames(value).toString());
        // the sweep runs past the 16 MHz self-resonance: those points are drawn apart
        assertTrue(seriesNames(value).stream().anyMatch(n -> n.contains("near or above SRF") || n.contains("above the axis")),
                seriesNames(value).toString());
        assertTrue(seriesNames(value).contains("Cs fitted capacitor, 1 V, bias 0 V"), seriesNames(value).toString());
        assertTrue(charts.get(2).chart().getXYPlot().getDataset().getItemCount(5) > 100, "fitted line drawn");
        assertTrue(charts.get(0).chart().getTitle().getText().contains("3 sweeps"));
    }

    @Test
    void aSingleSweepKeepsPlainLegendsAndItsConditionsInTheTitle() throws Exception {
        List<Plots.Named> charts = Plots.charts(run(1.0));
        assertEquals(List.of("|Z|"), seriesNames(charts.get(0).chart().getXYPlot().getDataset(0)));
        assertTrue(charts.get(0).chart().getTitle().getText().endsWith("(1 V, bias 0 V)"),
                charts.get(0).chart().getTitle().getText());
    }

    @Test
    void moreSweepsThanFitOnOneChartGoToFurtherCharts() throws Exception {
        double[] levels = {0.01, 0.02, 0.05, 0.1, 0.2, 0.5, 1.0, 2.0};
        List<Plots.Named> charts = Plots.charts(run(levels));
        List<String> names = charts.stream().map(Plots.Named::name).toList();
        assertEquals(List.of("sweep-impedance", "sweep-rx", "sweep-value", "sweep-d", "sweep-impedance-2", "sweep-rx-2",
                "sweep-value-2", "sweep-d-2"), names);
        assertEquals(Charts.MAX_TRACES, charts.get(0).chart().getXYPlot().getDataset(0).getSeriesCount());
        assertEquals(levels.length - Charts.MAX_TRACES, charts.get(4).chart().getXYPlot().getDataset(0).getSeriesCount());
    }
}
