package org.zweep.runner.cli;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.PrintWriter;
import java.net.InetSocketAddress;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.live.EventLog;
import org.zweep.runner.live.EventTail;
import org.zweep.runner.results.Json;
import org.zweep.runner.live.LiveServer;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import org.zweep.runner.text.Figures;

/** {@code zweep watch DIR}: follows a run's events in the terminal, or serves its live page. */
@Command(
        name = "watch",
        mixinStandardHelpOptions = true,
        description = {
            "Follows the run in DIR as it goes (its events.jsonl): progress, each point's values and a compact"
                    + " plot of |Z| over the current step, prompts, notes, checks, and the verdict; ends when the"
                    + " run finishes.",
            "With --web: also serves the live page (plots of |Z|, θ and the part's main value as points arrive,"
                    + " progress, ETA, prompts) on the loopback address until Ctrl-C."
        },
        footer = ExitCode.HELP_LIST)
final class WatchCommand implements Callable<Integer> {
    private static final String BARS = "▁▂▃▄▅▆▇█";

    @Parameters(index = "0", paramLabel = "DIR", description = "the run folder")
    Path dir;

    @Option(names = "--web", description = "serve the live page as well")
    boolean web;

    @Option(names = "--port", paramLabel = "PORT", defaultValue = "0",
            description = "the live page's port (default: a free one)")
    int port;

    @Option(names = "--bind", paramLabel = "HOST", defaultValue = "127.0.0.1",
            description = "the address to serve on (default: ${DEFAULT-VALUE}; another address lets other machines see"
                    + " and answer the run)")
    String bind;

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        Path file = dir.resolve(EventLog.FILE);
        if (!Files.isDirectory(dir)) {
            throw new InvalidInputException(dir + ": no such run folder");
        }
        if (!Files.exists(file) && !Files.exists(dir.resolve("run.json"))) {
            throw new InvalidInputException(dir + ": not a run folder (no run.json, no " + EventLog.FILE + ")");
        }
        LiveServer server = null;
        if (web) {
            server = LiveServer.start(dir, new InetSocketAddress(bind, port));
            out.println("live view: " + server.url());
            out.flush();
        }
        try {
            int code = follow(file, out);
            if (server != null) {
                out.println("the run has finished; the live page stays up until Ctrl-C");
                out.flush();
                Thread.currentThread().join();
            }
            return code;
        } finally {
            if (server != null) {
                server.close();
            }
        }
    }

    /** Prints each event as it is appended until {@code finished}; returns the exit code of the run's end. */
    static int follow(Path file, PrintWriter out) throws IOException, InterruptedException {
        EventTail tail = new EventTail(file, 0);
        List<Double> stepZ = new ArrayList<>();
        String mainKey = "cs_f";
        String mainLabel = "Cs";
        Unit mainUnit = Unit.FARAD;
        while (true) {
            List<EventTail.Line> lines = tail.read();
            for (EventTail.Line line : lines) {
                JsonNode e = Json.readTree(line.text());
                switch (e.path("type").asText()) {
                    case "run_started" -> {
                        mainKey = e.path("main_parameter").asText(mainKey);
                        mainLabel = e.path("main_label").asText(mainLabel);
                        mainUnit = Figures.unit(e.path("main_unit").asText());
                        out.printf(Locale.ROOT, "run %s: %d points (%d already measured)%n", e.path("name").asText(),
                                e.path("total").asInt(), e.path("done").asInt());
                    }
                    case "step_started" -> {
                        if (!stepZ.isEmpty()) {
                            out.println("  |Z| " + sparkline(stepZ));
                        }
                        stepZ.clear();
                        out.println("step " + e.path("step").asText());
                    }
                    case "point" -> {
                        StringBuilder b = new StringBuilder(String.format(Locale.ROOT, "[%d/%d] %s",
                                e.path("done").asInt(), e.path("total").asInt(),
                                Figures.format(e.path("frequency_hz").asDouble(), Unit.HERTZ)));
                        if (e.path("bias").asDouble() != 0) {
                            b.append(", bias ").append(Figures.format(e.path("bias").asDouble(),
                                    Figures.unit(e.path("bias_mode").asText("V"))));
                        }
                        if (e.has("z_ohm")) {
                            stepZ.add(e.path("z_ohm").asDouble());
                            b.append("  |Z| ").append(Figures.format(e.path("z_ohm").asDouble(), Unit.OHM))
                                    .append("  θ ").append(Figures.format(e.path("theta_deg").asDouble(), Unit.DEGREE, 4))
                                    .append("  ").append(mainLabel).append(' ')
                                    .append(Figures.format(e.path(mainKey).asDouble(Double.NaN), mainUnit));
                        } else if (e.has("ratio")) {
                            b.append("  V2/V1 ").append(Figures.number(e.path("ratio").asDouble(), 5));
                        } else {
                            b.append("  ").append(e.path("status").asText());
                        }
                        out.println(b);
                        if (stepZ.size() % 10 == 0 && !stepZ.isEmpty()) {
                            out.println("  |Z| " + sparkline(stepZ));
                        }
                    }
                    case "prompt" -> out.println(">> " + e.path("text").asText()
                            + " (answer at the run's terminal or on its live page)");
                    case "prompt_answered" -> out.println("   answered (" + e.path("by").asText() + ")");
                    case "note", "reconnect" -> out.println("note: " + e.path("text").asText());
                    case "check" -> out.println("check " + e.path("name").asText() + ": "
                            + e.path("label").asText(e.path("parameter").asText()) + " = "
                            + e.path("value_text").asText("no value") + ": " + e.path("result").asText());
                    case "finished" -> {
                        if (!stepZ.isEmpty()) {
                            out.println("  |Z| " + sparkline(stepZ));
                        }
                        String verdict = e.path("verdict").asText("none");
                        String outcome = e.path("outcome").asText();
                        out.println("finished: " + outcome + ", " + e.path("measured").asInt() + " of "
                                + e.path("total").asInt() + " points, verdict " + verdict);
                        out.flush();
                        return "failed".equals(outcome) ? ExitCode.METER
                                : org.zweep.runner.verdict.CheckOutcome.failed(verdict) ? ExitCode.CHECK_FAILED
                                : ExitCode.OK;
                    }
                    default -> {
                        // answers and other event types: nothing to show
                    }
                }
            }
            out.flush();
            Thread.sleep(50);
        }
    }

    /** |Z| of the step's points as a one-line bar chart on a log scale, with its range. */
    static String sparkline(List<Double> values) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = 0;
        for (double v : values) {
            if (v > 0) {
                lo = Math.min(lo, v);
                hi = Math.max(hi, v);
            }
        }
        StringBuilder b = new StringBuilder();
        List<Double> shown = values.size() > 60 ? values.subList(values.size() - 60, values.size()) : values;
        for (double v : shown) {
            if (!(v > 0) || hi <= lo) {
                b.append(v > 0 ? BARS.charAt(3) : ' ');
                continue;
            }
            int i = (int) Math.round(Math.log(v / lo) / Math.log(hi / lo) * (BARS.length() - 1));
            b.append(BARS.charAt(Math.max(0, Math.min(BARS.length() - 1, i))));
        }
        return b + "  " + Figures.format(lo, Unit.OHM, 3) + " … " + Figures.format(hi, Unit.OHM, 3);
    }
}
