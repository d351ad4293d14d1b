package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.By;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.chrome.ChromeDriver;
import org.zweep.driver.impedance.Impedance;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.TestRunFolders;
import org.zweep.runner.report.HtmlReport;

/**
 * A run folder whose part, step and check names carry markup, quotes and ampersands (a run.json is
 * a file anyone can edit): the report shows each name as the same text in a real Chromium, in text
 * and in attributes, and the page gets no element or script from it.
 */
class ReportEscapesNamesChromiumIT {
    private static final String PART = "<script>window.pwned=1</script> \"KP\" & 'C'";
    private static final String STEP = "sweep\"><img src=x onerror=window.pwned=2>&amp;";
    private static final String CHECK = "c<b>\"&'</b>";

    @TempDir
    Path tmp;

    @Test
    void namesWithMarkupQuotesAndAmpersandsAreShownAsTextNotRun() throws Exception {
        List<Impedance> sweep = new ArrayList<>();
        for (int i = 0; i < 21; i++) {
            double f = 1e3 * Math.pow(10, i / 5.0);
            double w = 2 * Math.PI * f;
            sweep.add(new Impedance(f, 0.02, w * 1e-9 - 1 / (w * 100e-9)));
        }
        Path dir = new TestRunFolders(tmp.resolve("run")).part("capacitor", PART, 100e-9, "F", 10.0, null)
                .impedance(STEP, sweep, "V", 1.0, "V", 0.0, "none", 0)
                .check(CHECK, "cs_f", STEP, 1e3, 90e-9, 110e-9).write();
        Path report = HtmlReport.write(Analysis.analyze(RunData.read(dir), null));

        ChromeDriver d = Browser.open(tmp, 1100, 900);
        try {
            d.get(report.toUri().toString());
            assertEquals(0L, ((Number) d.executeScript("return document.scripts.length;")).longValue(),
                    "no script element on the page");
            assertEquals(0, d.findElements(By.tagName("img")).size(), "no element from a name");
            assertEquals(null, d.executeScript("return window.pwned === undefined ? null : window.pwned;"),
                    "nothing from a name ran");
            assertEquals(PART + " (capacitor)", d.findElement(By.tagName("h1")).getText());
            assertEquals("zweep report: " + PART + " (capacitor)", d.getTitle());
            WebElement check = d.findElement(By.xpath("//h2[.='Checks']/following-sibling::table[1]//tr[2]"));
            assertEquals(CHECK, check.findElements(By.tagName("td")).get(0).getText());
            assertEquals(STEP, check.findElements(By.tagName("td")).get(2).getText());
            assertTrue(d.findElement(By.tagName("body")).getText().contains(STEP + ": "), "the fit's heading names the step");
            // attributes: every class and id on the page is one the template wrote, whole
            for (WebElement e : d.findElements(By.cssSelector("[class], [id]"))) {
                String cls = e.getAttribute("class");
                String id = e.getAttribute("id");
                assertTrue(cls == null || cls.isEmpty() || cls.matches("[a-z -]+"), "class " + cls);
                assertTrue(id == null || id.isEmpty() || id.matches("[A-Za-z0-9._-]+"), "id " + id);
            }
        } finally {
            d.quit();
        }
    }
}
