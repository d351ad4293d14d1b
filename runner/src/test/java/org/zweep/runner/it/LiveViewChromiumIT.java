package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.net.HttpURLConnection;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.openqa.selenium.By;
import org.openqa.selenium.OutputType;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.support.ui.WebDriverWait;

/**
 * The live page in a real headless Chromium during a simulated run of the shipped incoming
 * inspection at the simulator's real timing: the page shows the operator prompt and answers it,
 * points arrive and the plot grows, a second viewer and a reloaded page catch up, the final verdict
 * shows, and nothing is fetched from outside the loopback address. Prints the latency from a point
 * measured to the point drawn.
 */
class LiveViewChromiumIT {
    @TempDir
    Path tmp;

    /** How many points the page has drawn so far (grows as the plot grows). */
    private static long plotted(ChromeDriver d) {
        Object v = d.executeScript("return window.zweepLive ? (window.zweepLive.drawn || 0) : 0;");
        return ((Number) v).longValue();
    }

    private static long received(ChromeDriver d) {
        return ((Number) d.executeScript("return window.zweepLive ? window.zweepLive.points.length : 0;")).longValue();
    }

    @Test
    void aBrowserFollowsTheRunAnswersItsPromptSeesThePlotGrowAndTheVerdict() throws Exception {
        Path seq = Sims.sequences().resolve("incoming-kp-c0805-104.yaml");
        Path out = tmp.resolve("run");
        int port;
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            port = s.getLocalPort();
        }
        String url = "http://127.0.0.1:" + port + "/";
        CompletableFuture<Sims.Result> run = CompletableFuture.supplyAsync(() -> Sims.zweep("run", seq.toString(),
                "--meter", "sim:" + Sims.benchOf(seq) + "?timing=real", "--dialect", Sims.dialect(), "--out",
                out.toString(), "--quiet", "--live=" + port));
        awaitServing(url, run);
        ChromeDriver first = Browser.open(tmp, 1200, 900);
        ChromeDriver second = null;
        try {
            first.get(url);
            WebDriverWait wait = new WebDriverWait(first, Duration.ofSeconds(60));
            wait.until(d -> d.findElement(By.id("prompt")).isDisplayed());
            assertEquals(0, received(first), "no point is measured before the operator answers");
            // the compensation standards (open, short) and the part itself are prompted for: answer each on the page
            List<String> prompts = new ArrayList<>();
            while (prompts.size() < 10) {
                wait.until(d -> d.findElement(By.id("prompt")).isDisplayed() || received(first) > 0);
                if (!first.findElement(By.id("prompt")).isDisplayed()) {
                    break;
                }
                String text = first.findElement(By.id("prompt-text")).getText();
                prompts.add(text);
                first.findElement(By.id("prompt-answer")).click();
                wait.until(d -> !d.findElement(By.id("prompt")).isDisplayed()
                        || !d.findElement(By.id("prompt-text")).getText().equals(text));
            }
            assertTrue(prompts.stream().anyMatch(t -> t.contains("Insert the KP-C0805-104")), prompts.toString());
            // a second viewer joins mid-run and gets the whole run so far, then the rest as it comes
            second = Browser.open(tmp, 1000, 800);
            second.get(url);
            long sofar = received(first);
            ChromeDriver two = second;
            new WebDriverWait(second, Duration.ofSeconds(30)).until(d -> received(two) >= sofar);

            wait.until(d -> plotted(first) >= 5);
            long a = plotted(first);
            wait.until(d -> plotted(first) >= a + 5);
            assertTrue(first.findElements(By.cssSelector("#plot-z canvas")).size() == 1, "|Z| plot drawn");
            assertTrue(first.findElements(By.cssSelector("#plot-main canvas")).size() == 1, "Cs plot drawn");
            assertTrue(first.findElement(By.id("eta")).getText().startsWith("ETA "), first.findElement(By.id("eta")).getText());
            assertTrue(first.findElement(By.id("setting")).getText().matches("step [a-z-]+: .*Hz, .* rms, bias .*\\|Z\\| .*"),
                    first.findElement(By.id("setting")).getText());

            // the first viewer reloads (a browser reconnecting) and catches up again
            long before = received(first);
            List<Map<String, Object>> beforeReload = liveLatencies(first);
            first.navigate().refresh();
            wait.until(d -> received(first) >= before);

            new WebDriverWait(first, Duration.ofSeconds(180)).until(d -> d.findElement(By.id("verdict")).getText()
                    .contains("PASS"));
            new WebDriverWait(second, Duration.ofSeconds(30)).until(d -> d.findElement(By.id("verdict")).getText()
                    .contains("PASS"));
            Sims.Result r = run.get(60, TimeUnit.SECONDS);
            assertEquals(0, r.code(), r.err());
            assertTrue(Files.readString(out.resolve("events.jsonl")).contains("\"by\":\"page\""), "answered from the page");

            Path shots = Path.of("target", "screenshots");
            Files.createDirectories(shots);
            Files.write(shots.resolve("live-final.png"), first.getScreenshotAs(OutputType.BYTES));

            for (ChromeDriver d : List.of(first, second)) {
                for (String u : Browser.requests(d)) {
                    assertTrue(u.startsWith(url) || Browser.internal(u), "the page fetched " + u);
                }
            }

            // latency: point measured (the reading's time) to point drawn on the page, over both viewers, for
            // the points measured after the page had connected (live points, not the catch-up of a page opened or
            // reloaded mid-run); the parts: measured to written to events.jsonl, written to
            // received by the page, received to drawn
            List<Double> ms = new ArrayList<>();
            List<Double> written = new ArrayList<>();
            List<Double> received = new ArrayList<>();
            List<Double> drawn = new ArrayList<>();
            List<Map<String, Object>> all = new ArrayList<>(beforeReload);
            all.addAll(liveLatencies(first));
            all.addAll(liveLatencies(second));
            for (Map<String, Object> m : all) {
                double measured = ((Number) m.get("measured_ms")).doubleValue();
                double w = ((Number) m.get("written_ms")).doubleValue();
                double got = ((Number) m.get("received_ms")).doubleValue();
                double t = ((Number) m.get("drawn_ms")).doubleValue();
                ms.add(t - measured);
                written.add(w - measured);
                received.add(got - w);
                drawn.add(t - got);
            }
            // points measured one at a time (the bias step) apart from those of a list sweep, which arrive in one
            // reply and are written one row after another
            Map<Double, Long> perReading = new java.util.HashMap<>();
            all.forEach(m -> perReading.merge(((Number) m.get("measured_ms")).doubleValue(), 1L, Long::sum));
            List<Double> single = new ArrayList<>();
            List<Double> listed = new ArrayList<>();
            for (Map<String, Object> m : all) {
                double measured = ((Number) m.get("measured_ms")).doubleValue();
                (perReading.get(measured) > 2 ? listed : single).add(((Number) m.get("drawn_ms")).doubleValue() - measured);
            }
            String line = String.format(Locale.ROOT, "live page latency, point measured to point drawn: n=%d p50 %.0f ms,"
                    + " p95 %.0f ms, max %.0f ms; points measured one at a time n=%d p50 %.0f ms p95 %.0f ms; points of a"
                    + " list sweep n=%d p50 %.0f ms p95 %.0f ms (p50 of the parts: measured to written %.0f ms, written to"
                    + " received %.0f ms, received to drawn %.0f ms)", ms.size(), quantile(ms, 0.5), quantile(ms, 0.95),
                    quantile(ms, 1), single.size(), single.isEmpty() ? Double.NaN : quantile(single, 0.5),
                    single.isEmpty() ? Double.NaN : quantile(single, 0.95), listed.size(),
                    listed.isEmpty() ? Double.NaN : quantile(listed, 0.5), listed.isEmpty() ? Double.NaN : quantile(listed, 0.95),
                    quantile(written, 0.5), quantile(received, 0.5), quantile(drawn, 0.5));
            System.out.println(line);
            Files.writeString(shots.resolve("live-latency.txt"), line + "\n");
            assertTrue(ms.size() >= 15, "live points seen by the two viewers: " + ms.size());
            // issue 14 asks for a live view: a point should be on the page well within a second
            assertTrue(quantile(ms, 0.95) < 500, line); // common practice, no source
        } finally {
            first.quit();
            if (second != null) {
                second.quit();
            }
            run.cancel(true);
        }
    }

    /**
     * The latency records of the points measured after {@code d}'s page had connected to the event stream
     * (live points; those before are the catch-up of a page opened or reloaded mid-run).
     */
    private static List<Map<String, Object>> liveLatencies(ChromeDriver d) {
        Object since = d.executeScript("return window.zweepLive.live_since_ms;");
        List<Map<String, Object>> out = new ArrayList<>();
        if (since == null) {
            return out;
        }
        for (Object o : (List<?>) d.executeScript("return window.zweepLive.latencies;")) {
            Map<String, Object> m = Browser.map(o);
            if (((Number) m.get("measured_ms")).longValue() >= ((Number) since).longValue()) {
                out.add(m);
            }
        }
        return out;
    }

    /** The {@code q} quantile (nearest rank) of {@code values}. */
    private static double quantile(List<Double> values, double q) {
        List<Double> v = new ArrayList<>(values);
        v.sort(null);
        return v.get(Math.min(v.size() - 1, (int) Math.ceil(q * v.size()) - (q > 0 ? 1 : 0)));
    }

    private static void awaitServing(String url, CompletableFuture<Sims.Result> run) throws Exception {
        long until = System.currentTimeMillis() + 60_000;
        while (System.currentTimeMillis() < until) {
            if (run.isDone()) {
                throw new AssertionError("the run ended before serving: " + run.get().err() + run.get().out());
            }
            try {
                HttpURLConnection c = (HttpURLConnection) URI.create(url).toURL().openConnection();
                c.setConnectTimeout(500);
                if (c.getResponseCode() == 200) {
                    return;
                }
            } catch (java.io.IOException e) {
                // not yet
            }
            Thread.sleep(100);
        }
        throw new AssertionError("the live view did not come up at " + url);
    }
}
