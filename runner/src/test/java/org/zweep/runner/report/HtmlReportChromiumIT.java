package org.zweep.runner.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.File;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.cli.CliTestRuns;

/** Renders report.html in headless Chromium: it loads, shows its plots and fetches nothing. */
class HtmlReportChromiumIT {
    @TempDir
    Path tmp;

    static String chromium() {
        for (String dir : System.getenv().getOrDefault("PATH", "").split(File.pathSeparator)) {
            for (String name : List.of("chromium", "chromium-browser")) {
                if (Files.isExecutable(Path.of(dir, name))) {
                    return Path.of(dir, name).toString();
                }
            }
        }
        if ("true".equals(System.getenv("CI"))) {
            fail("chromium is not installed (apt-get install -y chromium); CI must render the report");
        }
        Assumptions.abort("chromium not installed");
        return null;
    }

    private Process chromium(List<String> extra, Path out) throws Exception {
        Path profile = Files.createDirectories(tmp.resolve("profile-" + System.nanoTime()));
        List<String> cmd = new ArrayList<>(List.of(chromium(), "--headless", "--no-sandbox", "--disable-gpu",
                "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--user-data-dir=" + profile));
        cmd.addAll(extra);
        Process p = new ProcessBuilder(cmd).redirectError(tmp.resolve("chromium-" + System.nanoTime() + ".log").toFile())
                .redirectOutput(out.toFile()).start();
        if (!p.waitFor(120, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            fail("chromium did not finish within 120 s");
        }
        return p;
    }

    @Test
    void reportLoadsWithItsPlotsAndFetchesNothing() throws Exception {
        Path dir = CliTestRuns.capacitorRun(tmp.resolve("run"), 10e6);
        AnalysisResult a = Analysis.analyze(RunData.read(dir), null);
        Path report = HtmlReport.write(a);
        String html = Files.readString(report, StandardCharsets.UTF_8);

        // no reference to anything outside the page: no URL at all, no src/href other than data: or #fragment
        assertFalse(html.contains("http://"), "http:// in the page");
        assertFalse(html.contains("https://"), "https:// in the page");
        Matcher ref = Pattern.compile("(?i)\\b(src|href)\\s*=\\s*[\"']?([^\"' >]*)").matcher(html);
        while (ref.find()) {
            assertTrue(ref.group(2).startsWith("data:") || ref.group(2).startsWith("#"), "external reference " + ref.group());
        }
        Matcher cssUrl = Pattern.compile("(?i)url\\(\\s*['\"]?([^)'\"]*)").matcher(html);
        while (cssUrl.find()) {
            assertTrue(cssUrl.group(1).startsWith("#"), "url() to outside the page: " + cssUrl.group());
        }

        Path dom = tmp.resolve("dom.html");
        Path netLog = tmp.resolve("net.json");
        Process p = chromium(List.of("--log-net-log=" + netLog, "--dump-dom", report.toUri().toString()), dom);
        assertEquals(0, p.exitValue());
        String rendered = Files.readString(dom, StandardCharsets.UTF_8);
        assertTrue(rendered.contains("KP-C0805-104"), "part name rendered");
        int figures = count(rendered, "<figure");
        int svgs = count(rendered, "<svg");
        assertEquals(5, figures, "impedance, R/X, Cs, D and bias plots");
        assertEquals(figures, svgs, "every figure holds an inline SVG");

        // every request the page made: browser-internal traffic (update checks and the like, which the flags
        // do not fully silence) carries the initiator "not an origin"; anything the page fetched carries its origin
        JsonNode log = new ObjectMapper().readTree(netLog.toFile());
        Map<Integer, String> types = new HashMap<>();
        log.get("constants").get("logEventTypes").properties().forEach(e -> types.put(e.getValue().asInt(), e.getKey()));
        for (JsonNode e : log.get("events")) {
            if ("URL_REQUEST_START_JOB".equals(types.get(e.get("type").asInt()))) {
                JsonNode params = e.path("params");
                String url = params.path("url").asText();
                String initiator = params.path("initiator").asText("");
                if (url.isEmpty()) {
                    continue; // the END phase of a job carries no parameters
                }
                assertTrue(initiator.equals("not an origin") || url.startsWith("file:") || url.startsWith("data:"),
                        "the page fetched " + url + " (initiator " + initiator + ")");
            }
        }

        Path shot = tmp.resolve("shot.png");
        Path shotOut = tmp.resolve("shot.txt");
        Process s = chromium(List.of("--window-size=1100,2200", "--screenshot=" + shot, report.toUri().toString()),
                shotOut);
        assertEquals(0, s.exitValue());
        var image = ImageIO.read(shot.toFile());
        assertEquals(1100, image.getWidth());
        if (System.getenv("ZWEEP_KEEP_SCREENSHOT") != null) {
            Files.copy(shot, Path.of(System.getenv("ZWEEP_KEEP_SCREENSHOT")), java.nio.file.StandardCopyOption.REPLACE_EXISTING);
        }
    }

    private static int count(String s, String needle) {
        int n = 0;
        for (int i = s.indexOf(needle); i >= 0; i = s.indexOf(needle, i + 1)) {
            n++;
        }
        return n;
    }
}
