package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.zweep.driver.address.Address;
import org.zweep.driver.address.SimAddress;
import org.zweep.driver.dialect.Dialect;
import org.zweep.driver.dialect.DialectProbe;
import org.zweep.driver.scpi.Resync;
import org.zweep.driver.scpi.ScpiClient;
import org.zweep.driver.scpi.ScpiSession;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.sim.InProcessSimulator;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Spec;

/** {@code zweep probe}: tries every operation a dialect declares on a meter, for onboarding a new meter. */
@Command(
        name = "probe",
        mixinStandardHelpOptions = true,
        description = {
            "Tries a dialect on the meter at ADDRESS: identifies the meter, then sends every operation the"
                    + " dialect declares, one at a time, each followed by the meter's error query, at safe settings"
                    + " (lowest drive level, DC bias 0 and never more, 1 kHz or the nearest declared frequency), reads"
                    + " back what can be read back, switches the fixture where the dialect can (acquiring each"
                    + " correction standard while it is in the fixture) and measures once.",
            "Prints a table: operation, ok / FAILED (with the meter's own error) / skipped / not declared.",
            "Exit 0 only when every declared operation worked (skipped ones do not count: the table says why);"
                    + " 1 when one failed; 2 for a bad address or dialect; 3 when the meter cannot be reached."
        },
        defaultValueProvider = OptionDefaults.class,
        footer = ExitCode.HELP_LIST)
final class ProbeCommand implements Callable<Integer> {

    @Mixin
    MeterAddress meter;

    @Mixin
    DialectOption dialect;

    @Mixin
    TimeoutOption timeout;

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() {
        Dialect d = Dialect.load(dialect.required());
        String address = meter.get();
        Address a = Address.parse(address);
        // only what the dialect declares is sent: no *CLS on connecting, and no *OPC? to get back in
        // step after a timeout (the late reply is drained instead)
        ScpiSettings settings = ScpiSettings.builder().readTimeout(timeout.get()).clearOnConnect(false)
                .resync(Resync.DRAIN).build();
        List<DialectProbe.Outcome> outcomes;
        try (InProcessSimulator sim = a instanceof SimAddress ? InProcessSimulator.start(address) : null) {
            ScpiSession session = sim != null ? sim.connect(settings) : ScpiClient.open(a, settings);
            outcomes = DialectProbe.run(session, d);
        }
        PrintWriter out = spec.commandLine().getOut();
        out.println(table(address, d, outcomes));
        out.flush();
        return DialectProbe.allOk(outcomes) ? ExitCode.OK : ExitCode.CHECK_FAILED;
    }

    /** The probe's report: a heading, one row per operation, and a summary line. */
    static String table(String address, Dialect d, List<DialectProbe.Outcome> outcomes) {
        int width = Math.max("operation".length(),
                outcomes.stream().mapToInt(o -> o.operation().length()).max().orElse(0));
        StringBuilder b = new StringBuilder();
        b.append("probe of ").append(address).append(" with dialect ").append(d.name()).append(" (")
                .append(d.source()).append(")\n\n");
        b.append(String.format(Locale.ROOT, "%-" + width + "s  %-13s  %s%n", "operation", "result", "detail"));
        int ok = 0;
        int failed = 0;
        int skipped = 0;
        int undeclared = 0;
        for (DialectProbe.Outcome o : outcomes) {
            String result = switch (o.status()) {
                case OK -> "ok";
                case FAILED -> "FAILED";
                case SKIPPED -> "skipped";
                case NOT_DECLARED -> "not declared";
            };
            switch (o.status()) {
                case OK -> ok++;
                case FAILED -> failed++;
                case SKIPPED -> skipped++;
                case NOT_DECLARED -> undeclared++;
            }
            b.append(String.format(Locale.ROOT, "%-" + width + "s  %-13s  %s", o.operation(), result, o.detail())
                    .stripTrailing()).append('\n');
        }
        b.append('\n').append(ok).append(" ok, ").append(failed).append(" failed, ").append(skipped)
                .append(" skipped, ").append(undeclared).append(" not declared");
        return b.toString();
    }
}
