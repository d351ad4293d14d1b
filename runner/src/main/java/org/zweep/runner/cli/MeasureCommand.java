package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.Drive;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.driver.meter.SourceMode;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.safety.Interruption;
import org.zweep.runner.engine.FixturePort;
import org.zweep.runner.engine.ReconnectPolicy;
import org.zweep.runner.engine.Station;
import org.zweep.runner.engine.Waiter;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.SafetyLimits;
import org.zweep.runner.results.Json;
import org.zweep.runner.safety.BiasOffHook;
import org.zweep.runner.safety.BiasRamp;
import org.zweep.runner.safety.SafetyGuard;
import org.zweep.runner.sequence.SequenceLoader;
import org.zweep.runner.sequence.SourceValues;
import org.zweep.runner.engine.ScpiMeterLink;
import org.zweep.runner.sim.MeterLinks;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Spec;

/** {@code zweep measure ADDRESS --frequency F}: one point, every derived parameter. */
@Command(
        name = "measure",
        mixinStandardHelpOptions = true,
        description = {
            "Measures one point and prints every derived parameter.",
            "With --json the names are those of 'zweep convert --json'. The drive level and DC bias are "
                + "checked against the safety limits (options, or a sequence's safety section) before anything is "
                + "sent; DC bias is ramped up and down at --ramp as in 'zweep run', also on Ctrl-C."
        },
        defaultValueProvider = OptionDefaults.class,
        footer = ExitCode.HELP_LIST)
public final class MeasureCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Mixin
    MeterAddress meter;

    @Option(names = "--frequency", required = true, paramLabel = "F", description = "test frequency, e.g. 1kHz")
    String frequency;

    @Option(names = "--level", paramLabel = "L", defaultValue = "1 V",
            description = "drive level in V rms or A rms, e.g. 0.5V or 10mA (default: ${DEFAULT-VALUE})")
    String level;

    @Option(names = "--bias", paramLabel = "B", description = "DC bias in V or A, e.g. 2V or 100mA (default: off)")
    String bias;

    @Mixin
    DialectOption dialect;

    @Mixin
    TimeoutOption timeout;

    @Mixin
    TraceOption trace;

    @Mixin
    JsonOption json;

    @Mixin
    FixtureOptions fixture;

    @Option(names = "--sequence", paramLabel = "FILE",
            description = "take the safety limits from this sequence's safety section (--max-bias-voltage,"
                    + " --max-bias-current, --max-level-voltage, --max-level-current and --ramp override it)")
    Path sequence;

    @Option(names = "--max-bias-voltage", paramLabel = "V", description = "largest DC bias voltage (default: the"
            + " sequence's, else 0 V: no voltage bias)")
    String maxBiasVoltage;

    @Option(names = "--max-bias-current", paramLabel = "A", description = "largest DC bias current (default: the"
            + " sequence's, else 0 A: no current bias)")
    String maxBiasCurrent;

    @Option(names = "--max-level-voltage", paramLabel = "V", description = "largest drive voltage, V rms (default:"
            + " the sequence's, else only the meter's range)")
    String maxLevelVoltage;

    @Option(names = "--max-level-current", paramLabel = "A", description = "largest drive current, A rms (default:"
            + " the sequence's, else only the meter's range)")
    String maxLevelCurrent;

    @Option(names = "--ramp", paramLabel = "RATE", description = "fastest DC bias change, e.g. 2V/s or 500mA/s"
            + " (default: no limit)")
    String ramp;

    @Option(names = "--settle", paramLabel = "DURATION", defaultValue = "0s", converter = DurationConverter.class,
            description = "wait after a bias change before measuring, e.g. 500ms, 2s or a number of seconds"
                    + " (default: ${DEFAULT-VALUE})")
    Duration settle;

    @Override
    public Integer call() {
        fixture.check();
        double f = Quantities.parse(frequency, Unit.HERTZ);
        Drive drive = level(level);
        Bias b = bias == null ? Bias.OFF : bias(bias);
        MeasurementSetting s = MeasurementSetting.at(f).withDrive(drive).withBias(b);
        SafetyLimits limits = limits();
        SafetyGuard guard = new SafetyGuard(limits);
        if (b.on() && b.value() != 0.0 && (b.mode() == SourceMode.VOLTAGE ? limits.maxBiasVoltageV()
                : limits.maxBiasCurrentA()) == 0.0) {
            throw new InvalidInputException("--bias needs a safety limit: give " + (b.mode() == SourceMode.VOLTAGE
                    ? "--max-bias-voltage" : "--max-bias-current") + ", or --sequence FILE with a safety section;"
                    + " nothing was sent to the meter");
        }
        guard.check(s, "--level/--bias");
        BiasControl control = new BiasControl(ramp == null ? Double.POSITIVE_INFINITY : rate(ramp, b.mode()),
                settle.toMillis() / 1000.0);
        Reading r;
        String identity;
        PrintWriter err = spec.commandLine().getErr();
        Interruption interruption = new Interruption();
        String address = meter.get();
        ScpiSettings settings = ScpiSettings.builder().readTimeout(timeout.get()).tracePath(trace.get()).build();
        try (ScpiMeterLink link = MeterLinks.open(address, dialect.orNull(), settings)) {
            boolean waits = link.timed();
            java.util.function.Consumer<String> note = line -> {
                err.println("zweep: " + line);
                err.flush();
            };
            FixturePort port = fixture.port(link, null, spec.commandLine().getOut(), note);
            Station station = new Station(link, guard, port, waits ? Waiter.sleeping(interruption)
                    : Waiter.none(interruption), ReconnectPolicy.DEFAULT, note);
            long graceMillis = (long) ((BiasRamp.durationS(b.value(), 0.0, control.rampPerS()) + 10.0) * 1000);
            try (BiasOffHook hook = BiasOffHook.install(interruption, station::biasOffNow, err, graceMillis)) {
                try {
                    station.start();
                    identity = station.identity().toString();
                    station.insert(FixtureState.PART, "", control);
                    r = station.measure(s, control, 0.0);
                } finally {
                    if (!station.stopBias()) {
                        err.println("zweep: WARNING: could not confirm that DC bias is off on " + address
                                + "; check the meter before touching the part");
                    }
                    interruption.markStopped();
                }
            }
        }
        print(spec.commandLine().getOut(), identity, r);
        return ExitCode.OK;
    }

    /** The safety limits: the sequence's, with each option given replacing its limit. */
    private SafetyLimits limits() {
        SafetyLimits base = sequence != null ? SequenceLoader.load(sequence).safety()
                : new SafetyLimits(0.0, 0.0, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY);
        return new SafetyLimits(
                maxBiasVoltage == null ? base.maxBiasVoltageV() : limit("--max-bias-voltage", maxBiasVoltage, Unit.VOLT),
                maxBiasCurrent == null ? base.maxBiasCurrentA()
                        : limit("--max-bias-current", maxBiasCurrent, Unit.AMPERE),
                maxLevelVoltage == null ? base.maxLevelVrms() : limit("--max-level-voltage", maxLevelVoltage, Unit.VOLT),
                maxLevelCurrent == null ? base.maxLevelArms()
                        : limit("--max-level-current", maxLevelCurrent, Unit.AMPERE));
    }

    private static double limit(String option, String text, Unit unit) {
        try {
            return Quantities.parse(text, unit, Unit.Bound.NON_NEGATIVE);
        } catch (InvalidInputException e) {
            throw new InvalidInputException(option + " '" + text + "': expected a limit in " + unit.symbol()
                    + ", e.g. 5" + unit.symbol());
        }
    }

    /** A ramp rate such as {@code 2V/s} or {@code 500 mA/s}, in the bias's unit per second. */
    private static double rate(String text, SourceMode mode) {
        try {
            return SourceValues.ratePerS(text.strip(), unit(mode));
        } catch (InvalidInputException e) {
            throw new InvalidInputException("--ramp: " + e.getMessage() + " (the bias's unit per second)");
        }
    }

    private void print(PrintWriter out, String identity, Reading r) {
        MeasurementSetting s = r.setting();
        boolean ok = r.status() == ReadingStatus.OK;
        Impedance z = r.impedance();
        if (json.on()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("address", meter.get());
            m.put("identity", identity);
            m.put("drive", s.drive().mode().unit());
            m.put("level", s.drive().levelRms());
            m.put("bias_mode", s.bias().mode().unit());
            m.put("bias", s.bias().appliedValue());
            m.put("status", ok ? "ok" : "no_value");
            m.put("time", r.timestamp().toString());
            for (Map.Entry<String, Double> e : DerivedParameter.contractValues(z).entrySet()) {
                m.put(e.getKey(), ok ? e.getValue() : null);
            }
            out.print(Json.text(m));
            return;
        }
        out.println("meter: " + identity);
        out.printf(Locale.ROOT, "setting: %s, %s rms, bias %s%n", Quantities.format(s.frequencyHz(), Unit.HERTZ, 6),
                Quantities.format(s.drive().levelRms(), unit(s.drive().mode()), 4), s.bias().on()
                        ? Quantities.format(s.bias().value(), unit(s.bias().mode()), 4) : "off");
        if (!ok) {
            out.println("no value (overload or out of range)");
            return;
        }
        for (DerivedParameter p : DerivedParameter.values()) {
            out.printf(Locale.ROOT, "%-9s %s%n", p.label(), Quantities.format(p.of(z), p.unit(), 6));
        }
    }

    private static Unit unit(org.zweep.driver.meter.SourceMode m) {
        return m == org.zweep.driver.meter.SourceMode.VOLTAGE ? Unit.VOLT : Unit.AMPERE;
    }

    private static Drive level(String text) {
        SourceValues.Value v = source("--level", text.strip(), "a drive level", Unit.Bound.POSITIVE);
        return v.unit() == Unit.VOLT ? Drive.voltage(v.si()) : Drive.current(v.si());
    }

    private static Bias bias(String text) {
        SourceValues.Value v = source("--bias", text.strip(), "a DC bias", Unit.Bound.ANY);
        return v.unit() == Unit.VOLT ? Bias.voltage(v.si()) : Bias.current(v.si());
    }

    private static SourceValues.Value source(String option, String text, String kind, Unit.Bound bound) {
        try {
            return SourceValues.parse(text, kind, null, bound);
        } catch (InvalidInputException e) {
            throw new InvalidInputException(option + ": " + e.getMessage());
        }
    }
}
