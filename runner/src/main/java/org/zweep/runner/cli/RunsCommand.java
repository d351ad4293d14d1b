package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneOffset;
import java.time.format.DateTimeParseException;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.results.Json;
import org.zweep.runner.store.ResultsStore;
import org.zweep.runner.store.RunsQuery;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code zweep runs}: lists the runs in the results index. */
@Command(name = "runs", mixinStandardHelpOptions = true,
        description = "Lists the runs in the results index, oldest first.", footer = ExitCode.HELP_LIST)
public final class RunsCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Mixin
    StoreOptions store;

    @Option(names = "--part", paramLabel = "P", description = "only runs of this part (its name or serial)")
    String part;

    @Option(names = "--lot", paramLabel = "L", description = "only runs of this lot")
    String lot;

    @Option(names = "--since", paramLabel = "D",
            description = "only runs started at or after D (yyyy-MM-dd, UTC midnight, or an ISO-8601 instant)")
    String since;

    @Option(names = "--verdict", paramLabel = "V", description = "only runs with this verdict: pass, fail or none")
    String verdict;

    @Mixin
    JsonOption json;

    @Override
    public Integer call() throws Exception {
        if (verdict != null && !List.of("pass", "fail", "none").contains(verdict)) {
            throw new InvalidInputException("--verdict must be pass, fail or none, not '" + verdict + "'");
        }
        RunsQuery q = new RunsQuery(part, lot, since == null ? null : instant(since), verdict);
        List<RunsQuery.Row> rows;
        try (ResultsStore s = store.open()) {
            rows = q.run(s);
        }
        PrintWriter out = spec.commandLine().getOut();
        if (json.on()) {
            out.print(Json.text(rows));
            return ExitCode.OK;
        }
        String fmt = "%-30s  %-36s  %-14s  %-10s  %-8s  %-9s  %-7s  %s%n";
        out.printf(Locale.ROOT, fmt, "started", "run id", "part", "serial", "lot", "station", "verdict", "folder");
        for (RunsQuery.Row r : rows) {
            out.printf(Locale.ROOT, fmt, r.started(), r.runId(), dash(r.partName()), dash(r.serial()), dash(r.lot()),
                    dash(r.station()), "completed".equals(r.outcome()) ? r.verdict() : r.outcome(), r.folder());
        }
        out.printf(Locale.ROOT, "%d run%s%n", rows.size(), rows.size() == 1 ? "" : "s");
        return ExitCode.OK;
    }

    private static String dash(String s) {
        return s == null ? "-" : s;
    }

    /** {@code yyyy-MM-dd} (midnight UTC) or an ISO-8601 instant, as an instant's text. */
    static String instant(String text) {
        try {
            return LocalDate.parse(text).atStartOfDay(ZoneOffset.UTC).toInstant().toString();
        } catch (DateTimeParseException e) {
            try {
                return Instant.parse(text).toString();
            } catch (DateTimeParseException e2) {
                throw new InvalidInputException("--since: '" + text
                        + "' is not a date (2026-12-01) or an instant (2026-12-01T08:00:00Z)");
            }
        }
    }
}
