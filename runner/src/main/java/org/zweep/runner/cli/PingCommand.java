package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.results.Json;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Spec;

/** {@code zweep ping}: measures the query round trip of a link. */
@Command(
        name = "ping",
        mixinStandardHelpOptions = true,
        description = {
            "Measures the query round trip to the meter at ADDRESS.",
            "Sends the query --count times, one after the other, after one unmeasured warm-up, and prints count,"
                    + " min, median, 99th percentile and max in microseconds and queries per second.",
            "With --json: one JSON object with count, min_us, median_us, p99_us, max_us and per_s."
        },
        defaultValueProvider = OptionDefaults.class,
        footer = ExitCode.HELP_LIST)
final class PingCommand implements Callable<Integer> {

    @Mixin
    MeterAddress address;

    @Option(names = "--count", paramLabel = "N", defaultValue = "100",
            description = "the number of measured queries (default: ${DEFAULT-VALUE})")
    int count;

    @Option(names = "--query", paramLabel = "Q", defaultValue = "*IDN?",
            description = "the query to time (default: ${DEFAULT-VALUE})")
    String query;

    @Mixin
    JsonOption json;

    @Mixin
    TimeoutOption timeout;

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        if (count < 1) {
            throw new ParameterException(spec.commandLine(), "--count must be at least 1, not " + count);
        }
        if (!ScpiCommand.isQuery(query)) {
            throw new ParameterException(spec.commandLine(), "--query '" + query + "' is not a query (no '?')");
        }
        long[] nanos = new long[count];
        try (ScpiClient client = ScpiClient.open(address.get(), ScpiSettings.builder().readTimeout(timeout.get()).build())) {
            client.query(query);
            for (int i = 0; i < count; i++) {
                long t0 = System.nanoTime();
                client.query(query);
                nanos[i] = System.nanoTime() - t0;
            }
        }
        RoundTripStats s = RoundTripStats.ofNanos(nanos);
        PrintWriter out = spec.commandLine().getOut();
        if (json.on()) {
            out.println(Json.line(new RoundTripStats(s.count(), round(s.minUs()), round(s.medianUs()),
                    round(s.p99Us()), round(s.maxUs()), round(s.perS()))));
        } else {
            out.printf(Locale.ROOT, "%s  %s  %d queries%n", address.get(), query, s.count());
            out.printf(Locale.ROOT, "min %.1f µs  median %.1f µs  p99 %.1f µs  max %.1f µs  %.0f queries/s%n",
                    s.minUs(), s.medianUs(), s.p99Us(), s.maxUs(), s.perS());
        }
        out.flush();
        return ExitCode.OK;
    }

    private static double round(double v) {
        return Math.round(v * 10) / 10.0;
    }
}
