package org.zweep.runner.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.time.Duration;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSettings;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep ping}: measures the query round trip of a link. */
@Command(
        name = "ping",
        mixinStandardHelpOptions = true,
        description = {
            "Measures the query round trip to the meter at ADDRESS.",
            "Sends the query COUNT times, one after the other, after one unmeasured warm-up, and prints count,"
                    + " min, median, 99th percentile and max in microseconds and queries per second.",
            "ADDRESS: tcp://HOST[:PORT], serial:DEVICE[?baud=N&...], sim:[BENCH], TCPIP::HOST::PORT::SOCKET,"
                    + " ASRL<device>::INSTR."
        },
        footer = ExitCode.HELP_LIST)
final class PingCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "ADDRESS", description = "Where the meter is.")
    String address;

    @Option(names = "--count", paramLabel = "N", defaultValue = "100",
            description = "Number of measured queries (default: ${DEFAULT-VALUE}).")
    int count;

    @Option(names = "--query", paramLabel = "Q", defaultValue = "*IDN?",
            description = "The query to time (default: ${DEFAULT-VALUE}).")
    String query;

    @Option(names = "--json", description = "Print one JSON object: count, min_us, median_us, p99_us, max_us, per_s.")
    boolean json;

    @Option(names = "--timeout", paramLabel = "DURATION", defaultValue = "5s", converter = DurationConverter.class,
            description = "Read timeout per reply, e.g. 500ms or 2s (default: ${DEFAULT-VALUE}).")
    Duration timeout;

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
        try (ScpiClient client = ScpiClient.open(address, ScpiSettings.builder().readTimeout(timeout).build())) {
            client.query(query);
            for (int i = 0; i < count; i++) {
                long t0 = System.nanoTime();
                client.query(query);
                nanos[i] = System.nanoTime() - t0;
            }
        }
        RoundTripStats s = RoundTripStats.ofNanos(nanos);
        PrintWriter out = spec.commandLine().getOut();
        if (json) {
            ObjectMapper mapper = new ObjectMapper();
            ObjectNode o = mapper.createObjectNode();
            o.put("count", s.count());
            o.put("min_us", round(s.minUs()));
            o.put("median_us", round(s.medianUs()));
            o.put("p99_us", round(s.p99Us()));
            o.put("max_us", round(s.maxUs()));
            o.put("per_s", round(s.perS()));
            out.println(mapper.writeValueAsString(o));
        } else {
            out.printf(Locale.ROOT, "%s  %s  %d queries%n", address, query, s.count());
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
