package org.zweep.runner.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.io.PrintWriter;
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
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.driver.scpi.ScpiSettings;
import org.zweep.runner.engine.ScpiMeterLink;
import org.zweep.runner.sim.MeterLinks;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code zweep measure ADDRESS --frequency F}: one point, every derived parameter. */
@Command(
        name = "measure",
        mixinStandardHelpOptions = true,
        description = {
            "Measures one point and prints every derived parameter.",
            "With --json the names are those of 'zweep convert --json'. DC bias is switched off again "
                + "before the command ends."
        },
        footer = ExitCode.HELP_LIST)
public final class MeasureCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "ADDRESS",
            description = "the meter (tcp://HOST[:PORT], serial:DEVICE, sim:BENCH_FILE[?timing=real|none])")
    String address;

    @Option(names = "--frequency", required = true, paramLabel = "F", description = "test frequency, e.g. 1kHz")
    String frequency;

    @Option(names = "--level", paramLabel = "L", defaultValue = "1 V",
            description = "drive level in V rms or A rms, e.g. 0.5V or 10mA (default: ${DEFAULT-VALUE})")
    String level;

    @Option(names = "--bias", paramLabel = "B", description = "DC bias in V or A, e.g. 2V or 100mA (default: off)")
    String bias;

    @Option(names = "--dialect", paramLabel = "DIALECT", defaultValue = "standard",
            description = "the meter's dialect, a name or a file (default: ${DEFAULT-VALUE})")
    String dialect;

    @Option(names = "--json", description = "print one JSON object")
    boolean json;

    @Override
    public Integer call() {
        double f = Quantities.parse(frequency, Unit.HERTZ);
        Drive drive = level(level);
        Bias b = bias == null ? Bias.OFF : bias(bias);
        MeasurementSetting s = MeasurementSetting.at(f).withDrive(drive).withBias(b);
        Reading r;
        String identity;
        try (ScpiMeterLink link = MeterLinks.open(address, dialect, ScpiSettings.DEFAULTS)) {
            Meter m = link.meter();
            try {
                identity = m.identify().toString();
                m.reset();
                m.apply(s);
                r = m.measure();
            } finally {
                m.biasOff();
            }
        }
        print(spec.commandLine().getOut(), identity, r);
        return ExitCode.OK;
    }

    private void print(PrintWriter out, String identity, Reading r) {
        MeasurementSetting s = r.setting();
        boolean ok = r.status() == ReadingStatus.OK;
        Impedance z = r.impedance();
        if (json) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("address", address);
            m.put("identity", identity);
            m.put("drive", s.drive().mode().unit());
            m.put("level", s.drive().levelRms());
            m.put("bias_mode", s.bias().mode().unit());
            m.put("bias", s.bias().appliedValue());
            m.put("status", ok ? "ok" : "no_value");
            m.put("time", r.timestamp().toString());
            for (Map.Entry<String, Double> e : DerivedParameter.contractValues(z).entrySet()) {
                m.put(e.getKey(), ok && Double.isFinite(e.getValue()) ? e.getValue() : null);
            }
            try {
                out.println(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(m));
            } catch (JsonProcessingException e) {
                throw new IllegalStateException(e);
            }
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
        try {
            return Drive.voltage(Quantities.parse(text, Unit.VOLT, Unit.Bound.POSITIVE));
        } catch (InvalidInputException e) {
            try {
                return Drive.current(Quantities.parse(text, Unit.AMPERE, Unit.Bound.POSITIVE));
            } catch (InvalidInputException e2) {
                throw new InvalidInputException("--level '" + text + "': expected a positive level in V or A rms,"
                        + " e.g. 0.5V or 10mA");
            }
        }
    }

    private static Bias bias(String text) {
        try {
            return Bias.voltage(Quantities.parse(text, Unit.VOLT));
        } catch (InvalidInputException e) {
            try {
                return Bias.current(Quantities.parse(text, Unit.AMPERE));
            } catch (InvalidInputException e2) {
                throw new InvalidInputException("--bias '" + text + "': expected a DC bias in V or A, e.g. 2V or 100mA");
            }
        }
    }
}
