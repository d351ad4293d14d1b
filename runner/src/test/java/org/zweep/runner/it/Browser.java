package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.File;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.logging.Level;
import org.junit.jupiter.api.Assumptions;
import org.openqa.selenium.chrome.ChromeDriver;
import org.openqa.selenium.chrome.ChromeDriverService;
import org.openqa.selenium.chrome.ChromeOptions;
import org.openqa.selenium.logging.LogEntry;
import org.openqa.selenium.logging.LogType;
import org.openqa.selenium.logging.LoggingPreferences;

/** Headless Chromium driven through Debian's chromedriver (Selenium's WebDriver client), with its network log. */
final class Browser {
    private Browser() {
    }

    static String onPath(String... names) {
        for (String dir : System.getenv().getOrDefault("PATH", "").split(File.pathSeparator)) {
            for (String name : names) {
                if (Files.isExecutable(Path.of(dir, name))) {
                    return Path.of(dir, name).toString();
                }
            }
        }
        return null;
    }

    /** A new headless browser with a fresh profile under {@code tmp}, {@code width} × {@code height}. */
    static ChromeDriver open(Path tmp, int width, int height) throws Exception {
        String chromium = onPath("chromium", "chromium-browser");
        String driver = onPath("chromedriver");
        if (chromium == null || driver == null) {
            if ("true".equals(System.getenv("CI"))) {
                fail("chromium and chromium-driver must be installed (apt-get install -y chromium chromium-driver)");
            }
            Assumptions.abort("chromium or chromedriver not installed");
        }
        ChromeOptions o = new ChromeOptions();
        o.setBinary(chromium);
        o.addArguments("--headless=new", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--no-first-run",
                "--disable-background-networking", "--disable-component-update", "--disable-sync",
                "--disable-default-apps", "--window-size=" + width + "," + height,
                "--user-data-dir=" + Files.createTempDirectory(tmp, "profile"));
        LoggingPreferences logs = new LoggingPreferences();
        logs.enable(LogType.PERFORMANCE, Level.ALL);
        o.setCapability("goog:loggingPrefs", logs);
        ChromeDriverService service = new ChromeDriverService.Builder().usingDriverExecutable(new File(driver))
                .usingAnyFreePort().withLogOutput(java.io.OutputStream.nullOutputStream()).build();
        ChromeDriver d = new ChromeDriver(service, o);
        d.manage().timeouts().scriptTimeout(Duration.ofSeconds(10));
        return d;
    }

    /** Every URL the page asked for since the last call (Network.requestWillBeSent in the performance log). */
    static List<String> requests(ChromeDriver d) {
        List<String> urls = new ArrayList<>();
        for (LogEntry e : d.manage().logs().get(LogType.PERFORMANCE)) {
            String m = e.getMessage();
            if (m.contains("\"Network.requestWillBeSent\"")) {
                int i = m.indexOf("\"url\":\"");
                if (i >= 0) {
                    urls.add(m.substring(i + 7, m.indexOf('"', i + 7)));
                }
            }
        }
        return urls;
    }

    /**
     * Whether {@code url} never leaves the machine by its scheme: inline data, or the browser's own
     * pages ({@code chrome:}, {@code about:}, e.g. the new-tab page it opens with); any network URL is not.
     */
    static boolean internal(String url) {
        return url.startsWith("data:") || url.startsWith("chrome:") || url.startsWith("about:") || url.startsWith("blob:")
                || url.startsWith("chrome-untrusted:");
    }

    @SuppressWarnings("unchecked")
    static Map<String, Object> map(Object o) {
        return (Map<String, Object>) o;
    }
}
