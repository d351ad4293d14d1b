package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.By;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.chrome.ChromeDriver;
import org.zweep.runner.results.Csv;
import org.zweep.runner.results.RunManifest;

/**
 * {@code zweep lot} on the simulator's tray bench ({@code lot/kp-c0805-104-tray.bench.yaml}: each
 * serial its own capacitor, three out of limits): ten parts unattended give the lot table and the
 * lot report the parts call for; a lot stopped by Ctrl-C at part 3's prompt, resumed, killed hard in
 * the middle of part 6 and resumed again gives the same lot table as an uninterrupted one; {@code compare} takes two lots.
 */
class LotIT {
    static final Path SEQ = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");
    static final Path RES = Path.of("src", "test", "resources", "lot").toAbsolutePath();
    static final Path TRAY = Sims.sequences().resolve("benches/kp-c0805-104-tray.bench.yaml");
    static final Path PROMPTING = RES.resolve("lot-kp-c0805-104.yaml");
    static final String METER = "sim:" + TRAY + "?timing=none";

    /**
     * The parts of the tray that must fail. The sequence checks Cs at 1 kHz within K, ±10 %
     * (IEC 60062:2016, Table 1: letter K, ±10 %), and D at 1 kHz at most 0.025: L7-003 (86 nF) and
     * L7-008 (113 nF) lie outside 90…110 nF, L7-005 has tan δ = 0.031 > 0.025; every other part is
     * within 4.1 % of 100 nF with tan δ = 0.012.
     */
    static final List<String> FAILING = List.of("L7-003", "L7-005", "L7-008");

    @TempDir
    Path dir;

    record Table(List<String> header, List<List<String>> rows) {
        List<String> column(String name) {
            int i = header.indexOf(name);
            assertTrue(i >= 0, "lot.csv has a column " + name + ": " + header);
            return rows.stream().map(r -> r.get(i)).toList();
        }

        /** The table without the columns that differ between two lots of the same parts (run ids). */
        List<List<String>> withoutRunIds() {
            int id = header.indexOf("run_id");
            List<List<String>> out = new ArrayList<>();
            for (List<String> r : rows) {
                List<String> c = new ArrayList<>(r);
                c.remove(id);
                out.add(c);
            }
            return out;
        }
    }

    static Table table(Path lotDir) throws Exception {
        List<String> lines = Files.readAllLines(lotDir.resolve("lot.csv"), StandardCharsets.UTF_8);
        List<List<String>> rows = new ArrayList<>();
        for (String l : lines.subList(1, lines.size())) {
            rows.add(Csv.cells(l));
        }
        return new Table(Csv.cells(lines.get(0)), rows);
    }

    static List<String> serials() {
        List<String> s = new ArrayList<>();
        for (int k = 1; k <= 10; k++) {
            s.add(String.format("L7-%03d", k));
        }
        return s;
    }

    @Test
    void tenPartsUnattendedGiveTheLotTableAndReportTheTrayCallsFor() throws Exception {
        Path lot = dir.resolve("l7");
        Path db = dir.resolve("index.sqlite");
        Sims.Result r = Sims.zweep("lot", SEQ.toString(), "--lot", "L7", "--count", "10", "--meter", METER, "--dialect",
                Sims.dialect(), "--seed", "11", "--out", lot.toString(), "--quiet", "--db", db.toString());
        assertEquals(1, r.code(), "a part failed: exit 1\n" + r.out() + r.err());
        assertTrue(r.out().contains("############  FAIL  ############   part 3: L7-003"), r.out());
        assertTrue(r.out().contains("lot L7: 2 passed, 1 failed, yield 66.7 %"), "the running yield after part 3");
        assertTrue(r.out().contains("lot L7 complete: 10 parts, 7 passed, 3 failed, yield 70.0 %"), r.out());

        Table t = table(lot);
        assertEquals(serials(), t.column("serial"));
        for (int k = 0; k < 10; k++) {
            String serial = serials().get(k);
            assertEquals(FAILING.contains(serial) ? "fail" : "pass", t.column("verdict").get(k), serial);
            assertEquals("completed", t.column("outcome").get(k));
            assertEquals("L7", t.column("lot").get(k));
        }
        // each value is the one 'zweep analyze' gives for the part's own folder
        ObjectMapper json = new ObjectMapper();
        String firstCompensation = null;
        for (int k = 0; k < 10; k++) {
            Path part = lot.resolve(t.column("folder").get(k));
            JsonNode a = json.readTree(Sims.zweep("analyze", part.toString(), "--json").out());
            for (JsonNode c : a.get("checks")) {
                String name = c.get("name").asText();
                JsonNode v = c.get("values");
                assertEquals(v.get(v.size() - 1).asDouble(), Double.parseDouble(t.column("check." + name).get(k)), 0.0,
                        name + " of " + part);
                assertEquals(c.get("result").asText(), t.column("check." + name + ".result").get(k));
            }
            assertTrue(Double.parseDouble(t.column("fit.frequency-sweep/c_f").get(k)) > 80e-9);
            RunManifest m = RunManifest.read(part.resolve("run.json"));
            assertEquals(serials().get(k), m.identity().serial());
            assertEquals("L7", m.identity().lot());
            // compensation once per lot: the sequence reuses data younger than 2 h, so parts 2…10 take part 1's
            // (from part 1's folder or a copy of it in a later part's)
            assertEquals(k == 0 ? "measured" : "reused", m.compensation().source(), part.toString());
            if (k == 0) {
                firstCompensation = m.compensation().measuredAt();
            } else {
                assertEquals(firstCompensation, m.compensation().measuredAt(), part.toString());
                assertTrue(Path.of(m.compensation().reusedFrom()).startsWith(lot.toAbsolutePath().normalize()));
            }
        }
        // the measured Cs follows each part's capacitance on the bench (1 kHz, well below resonance)
        double c3 = Double.parseDouble(t.column("check.capacitance-1khz").get(2));
        double c8 = Double.parseDouble(t.column("check.capacitance-1khz").get(7));
        assertTrue(c3 < 90e-9 && c8 > 110e-9, c3 + " " + c8);

        // every part is in the results index
        Sims.Result runs = Sims.zweep("runs", "--lot", "L7", "--json", "--db", db.toString());
        assertEquals(10, json.readTree(runs.out()).size(), runs.out());

        // the report, in a real browser: yield, a histogram per check with its limits, failing parts first
        ChromeDriver d = Browser.open(dir, 1200, 900);
        try {
            d.get(lot.resolve("lot.html").toUri().toString());
            assertEquals("Lot L7", d.findElement(By.tagName("h1")).getText());
            assertEquals("70.0 %", d.findElement(By.id("yield")).getText());
            List<WebElement> hist = d.findElements(By.cssSelector("figure.histogram"));
            assertEquals(List.of("capacitance-1khz", "dissipation-1khz", "self-resonance"),
                    hist.stream().map(h -> h.getAttribute("data-check")).toList());
            for (WebElement h : hist) {
                assertTrue(h.findElements(By.tagName("svg")).size() == 1, "one chart per check");
            }
            assertTrue(hist.get(0).getText().contains("7 of 10 passed")
                    || hist.get(0).getText().contains("8 of 10 passed"), hist.get(0).getText());
            assertTrue(hist.get(0).getText().contains("limits 90 nF … 110 nF"), hist.get(0).getText());
            List<WebElement> rows = d.findElements(By.cssSelector("#parts tr"));
            assertEquals(11, rows.size());
            List<String> order = new ArrayList<>();
            for (WebElement row : rows.subList(1, rows.size())) {
                order.add(row.findElements(By.tagName("td")).get(1).getText());
            }
            assertEquals(FAILING, order.subList(0, 3), "failing parts first");
            assertEquals("FAIL", rows.get(1).findElements(By.tagName("td")).get(2).getText());
            assertEquals("PASS", rows.get(4).findElements(By.tagName("td")).get(2).getText());
        } finally {
            d.quit();
        }
    }

    @Test
    void aLotStoppedByCtrlCAndKilledHardInPartSixAndResumedGivesTheSameLotAsAnUninterruptedOne() throws Exception {
        Path ref = dir.resolve("reference");
        Path db = dir.resolve("index.sqlite");
        String meter = "sim:" + TRAY + "?timing=none";
        Sims.Result whole = Sims.zweep("lot", PROMPTING.toString(), "--lot", "L7", "--count", "10", "--meter", meter,
                "--dialect", Sims.dialect(), "--seed", "5", "--out", ref.toString(), "--quiet",
                "--fixture-command", "true", "--db", db.toString());
        assertEquals(1, whole.code(), whole.out() + whole.err());

        Path lot = dir.resolve("killed");
        Path log = dir.resolve("killed.log");
        // Ctrl-C while the lot asks for part 3: the lot stops (exit 130) with parts 1 and 2 complete
        Process first = Children.zweepPiped(log, "lot", PROMPTING.toString(), "--lot", "L7", "--count", "10",
                "--meter", meter, "--dialect", Sims.dialect(), "--seed", "5", "--out", lot.toString(), "--quiet",
                "--fixture", "stdin", "--db", db.toString());
        assertEquals(3, answerUntil(first, 3, "part 3 of 10: L7-003: put it in the fixture", "INT"));
        assertTrue(first.waitFor(30, TimeUnit.SECONDS));
        assertEquals(130, first.exitValue(), "stopped by SIGINT: " + Files.readString(log));
        assertEquals(List.of("001-L7-001", "002-L7-002"), Files.list(lot).filter(Files::isDirectory)
                .map(f -> f.getFileName().toString()).sorted().toList());

        // resumed, then killed hard in the middle of part 6
        Process p = Children.zweepPiped(log, "lot", "--resume", lot.toString(), "--quiet", "--fixture", "stdin",
                "--db", db.toString());
        // part 6 has measured its first step and waits before its second: kill -9
        boolean killed = answerUntil(p, 6, "Check that the part is still seated.", "KILL") == 6;
        assertTrue(p.waitFor(30, TimeUnit.SECONDS));
        assertTrue(killed, "the lot reached the middle of part 6: " + Files.readString(log));
        assertEquals(137, p.exitValue(), "killed by SIGKILL");
        Path six = lot.resolve("006-L7-006");
        assertEquals("running", RunManifest.read(six.resolve("run.json")).outcome());
        int rows6 = Files.readAllLines(six.resolve("points.csv")).size() - 1;
        assertTrue(rows6 > 0 && rows6 < 66, "part 6 stopped between its steps: " + rows6 + " rows");
        assertTrue(!Files.exists(lot.resolve("007-L7-007")), "part 7 not started");

        Sims.Result resumed = Sims.zweep("lot", "--resume", lot.toString(), "--fixture-command", "true", "--quiet",
                "--db", db.toString());
        assertEquals(1, resumed.code(), resumed.out() + resumed.err());
        assertTrue(resumed.out().contains("part 6 (L7-006): finishing the run in"), resumed.out());
        assertEquals(table(ref).header(), table(lot).header());
        assertEquals(table(ref).withoutRunIds(), table(lot).withoutRunIds(), "same serials, verdicts and values");
        assertEquals(serials(), table(lot).column("serial"));
        assertEquals(serials().stream().map(x -> FAILING.contains(x) ? "fail" : "pass").toList(),
                table(lot).column("verdict"));

        // compare on the two lots: the same parts, so every per-check difference of the means is zero
        Sims.Result cmp = Sims.zweep("compare", ref.toString(), lot.toString(), "--json");
        assertEquals(0, cmp.code(), cmp.err());
        JsonNode c = new ObjectMapper().readTree(cmp.out());
        assertEquals(2, c.get("lots").size());
        assertEquals(2, c.get("checks").size());
        for (JsonNode row : c.get("checks")) {
            // the mean and the sample standard deviation (n − 1) of the lot table's column, computed here
            // (common practice, no source)
            List<Double> v = table(ref).column("check." + row.get("name").asText()).stream().map(Double::parseDouble)
                    .toList();
            double mean = v.stream().mapToDouble(Double::doubleValue).sum() / v.size();
            double ss = v.stream().mapToDouble(x -> (x - mean) * (x - mean)).sum();
            assertEquals(mean, row.at("/mean/0").asDouble(), Math.abs(mean) * 1e-12, row.toString());
            assertEquals(Math.sqrt(ss / (v.size() - 1)), row.at("/sigma/0").asDouble(), Math.abs(mean) * 1e-12);
            assertEquals(v.size(), row.at("/n/0").asInt());
            assertEquals(0.0, row.at("/mean_difference/1").asDouble(), 0.0, row.toString());
            assertEquals(row.at("/mean/0").asDouble(), row.at("/mean/1").asDouble(), 0.0);
        }
    }

    /**
     * Answers {@code ok} to every fixture request of the lot {@code p} until the request containing
     * {@code text} during part {@code part}, then sends {@code signal}; returns the part it was sent in (0: never).
     */
    static int answerUntil(Process p, int part, String text, String signal) throws Exception {
        int now = 0;
        BufferedReader out = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8));
        PrintWriter in = new PrintWriter(p.getOutputStream(), true, StandardCharsets.UTF_8);
        String line;
        while ((line = out.readLine()) != null) {
            if (line.matches("part \\d+ of 10: L7-\\d+")) {
                now = Integer.parseInt(line.substring(5, line.indexOf(' ', 5)));
            }
            if (!line.startsWith("fixture ")) {
                continue;
            }
            if (now == part && line.contains(text)) {
                Children.signal(p, signal);
                return now;
            }
            in.println("ok");
        }
        return 0;
    }

    @Test
    void scannedSerialsComeFromTheLineChannelAndARepeatIsAskedAgain() throws Exception {
        Path lot = dir.resolve("scanned");
        Process p = Children.zweepPiped(dir.resolve("scanned.log"), "lot", PROMPTING.toString(), "--lot", "S1", "--scan",
                "--meter", METER, "--dialect", Sims.dialect(), "--out", lot.toString(), "--quiet", "--fixture", "stdin",
                "--no-index");
        List<String> answers = new ArrayList<>(List.of("L7-003", "L7-003", "L7-001", "end"));
        List<String> said = new ArrayList<>();
        try (BufferedReader out = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8));
                PrintWriter in = new PrintWriter(p.getOutputStream(), true, StandardCharsets.UTF_8)) {
            String line;
            while ((line = out.readLine()) != null) {
                said.add(line);
                if (line.startsWith("serial ")) {
                    in.println(answers.remove(0));
                } else if (line.startsWith("fixture ")) {
                    in.println("ok");
                }
            }
        }
        assertTrue(p.waitFor(60, TimeUnit.SECONDS));
        assertEquals(1, p.exitValue(), String.join("\n", said) + Files.readString(dir.resolve("scanned.log")));
        assertTrue(answers.isEmpty(), "every serial request answered");
        assertTrue(said.contains("zweep: L7-003 is already measured in this lot; scan the next part"), said.toString());
        Table t = table(lot);
        assertEquals(List.of("L7-003", "L7-001"), t.column("serial"));
        assertEquals(List.of("fail", "pass"), t.column("verdict"));
        assertEquals(List.of("S1", "S1"), t.column("lot"));
    }
}
