package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.openqa.selenium.By;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.chrome.ChromeDriver;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.report.HtmlReport;

/**
 * The report of every shipped sequence in a real headless Chromium: the page loads, every figure
 * holds a drawn SVG plot, nothing is fetched from outside the file, and a screenshot is kept under
 * {@code target/screenshots/} for people to look at.
 */
class ShippedReportsChromiumIT {
    @TempDir
    Path tmp;

    static Stream<Path> sequences() {
        return Sims.shippedSequences().stream();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("sequences")
    void theReportLoadsWithItsPlotsAndFetchesNothing(Path seq) throws Exception {
        Path out = tmp.resolve("run");
        Sims.Result r = Sims.zweep("run", seq.toString(), "--meter", "sim:" + Sims.benchOf(seq) + "?timing=none",
                "--dialect", Sims.dialect(), "--out", out.toString(), "--quiet");
        assertEquals(0, r.code(), r.err());
        Path report = HtmlReport.write(Analysis.analyze(RunData.read(out), null));
        ChromeDriver d = Browser.open(tmp, 1200, 4000);
        try {
            d.get(report.toUri().toString());
            assertTrue(d.getTitle().startsWith("zweep report: KP-"), d.getTitle());
            int figures = d.findElements(By.tagName("figure")).size();
            assertTrue(figures >= 4, "figures: " + figures);
            assertEquals(figures, d.findElements(By.cssSelector("figure svg")).size(), "every figure holds an SVG");
            Number drawn = (Number) d.executeScript("return [...document.querySelectorAll('figure svg')]"
                    + ".filter(s => s.getBoundingClientRect().width > 300 && s.querySelectorAll('path').length > 20).length;");
            assertEquals(figures, drawn.intValue(), "every plot is laid out and has lines");
            for (String u : Browser.requests(d)) {
                assertTrue(u.startsWith("file:") || Browser.internal(u), "the report fetched " + u);
            }
            byte[] png = d.getScreenshotAs(OutputType.BYTES);
            BufferedImage img = ImageIO.read(new ByteArrayInputStream(png));
            assertEquals(1200, img.getWidth());
            Path shots = Files.createDirectories(Path.of("target", "screenshots"));
            String name = seq.getFileName().toString().replace(".yaml", "");
            Files.write(shots.resolve("report-" + name + ".png"), png);
        } finally {
            d.quit();
        }
    }
}
