package org.zweep.simulator.scpi;

import java.nio.charset.StandardCharsets;
import java.util.function.BiConsumer;
import java.util.function.Function;
import java.util.function.ObjDoubleConsumer;
import java.util.function.ObjIntConsumer;
import java.util.function.Predicate;
import java.util.function.ToDoubleFunction;
import java.util.function.ToIntFunction;
import org.zweep.simulator.bench.MeterCorrection;
import org.zweep.simulator.bench.MeterLimits;
import org.zweep.simulator.bench.SourceKind;

/**
 * The impedance meter's command set: IEEE 488.2 common commands, the SCPI-1999 required SYSTem
 * and STATus commands, and the measurement tree (SOURce, SENSe, TRIGger, INITiate, FETCh, READ,
 * FORMat) that the host-side {@code standard} dialect uses.
 */
final class MeterCommands {
    private static final double MAX_REACTANCE_OHM = 1e9;

    private MeterCommands() {
    }

    static void register(CommandTree.Builder b, Instrument in) {
        common(b, in);
        system(b, in);
        source(b, in);
        sense(b, in);
        measure(b, in);
    }

    private static Response nr1(long v) {
        return Response.text(Long.toString(v));
    }

    private static Response nr3(double v) {
        return Response.text(Numbers.nr3(v));
    }

    private static Response bool(boolean v) {
        return Response.text(v ? "1" : "0");
    }

    private static void common(CommandTree.Builder b, Instrument in) {
        StatusModel st = in.status();
        b.on("*IDN?", c -> {
            c.count(0, 0);
            return Response.text(Instrument.IDENTIFICATION);
        });
        b.on("*RST", c -> {
            c.count(0, 0);
            in.reset();
            return null;
        });
        b.on("*CLS", c -> {
            c.count(0, 0);
            c.session().clearStatus();
            return null;
        });
        b.on("*ESE", c -> {
            c.count(1, 1);
            st.setEse((int) c.integer(0, 0, 255, 0));
            return null;
        });
        b.on("*ESE?", c -> {
            c.count(0, 0);
            return nr1(st.ese());
        });
        b.on("*ESR?", c -> {
            c.count(0, 0);
            return nr1(st.readEsr());
        });
        b.on("*SRE", c -> {
            c.count(1, 1);
            st.setSre((int) c.integer(0, 0, 255, 0));
            return null;
        });
        b.on("*SRE?", c -> {
            c.count(0, 0);
            return nr1(st.sre());
        });
        b.on("*STB?", c -> {
            c.count(0, 0);
            return nr1(st.statusByte(c.session().messageAvailable()));
        });
        b.on("*OPC", c -> {
            c.count(0, 0);
            in.armOpc();
            return null;
        });
        b.on("*OPC?", c -> {
            c.count(0, 0);
            return in.awaitIdle() ? Response.text("1") : null;
        });
        b.on("*WAI", c -> {
            c.count(0, 0);
            in.awaitIdle();
            return null;
        });
        b.on("*TST?", c -> {
            c.count(0, 0);
            return nr1(0);
        });
        b.on("*TRG", c -> {
            c.count(0, 0);
            in.trigger();
            return null;
        });
    }

    private static void system(CommandTree.Builder b, Instrument in) {
        StatusModel st = in.status();
        b.on("SYSTem:ERRor[:NEXT]?", c -> {
            c.count(0, 0);
            return Response.text(st.nextError().formatted());
        });
        b.on("SYSTem:ERRor:COUNt?", c -> {
            c.count(0, 0);
            return nr1(st.errorCount());
        });
        b.on("SYSTem:VERSion?", c -> {
            c.count(0, 0);
            return Response.text("1999.0");
        });
        b.on("STATus:OPERation[:EVENt]?", c -> {
            c.count(0, 0);
            return nr1(st.readOperationEvent());
        });
        b.on("STATus:OPERation:CONDition?", c -> {
            c.count(0, 0);
            return nr1(st.operationCondition());
        });
        b.on("STATus:OPERation:ENABle", c -> {
            c.count(1, 1);
            st.setOperationEnable((int) c.integer(0, 0, 65535, 0));
            return null;
        });
        b.on("STATus:OPERation:ENABle?", c -> {
            c.count(0, 0);
            return nr1(st.operationEnable());
        });
        b.on("STATus:QUEStionable[:EVENt]?", c -> {
            c.count(0, 0);
            return nr1(st.readQuestionableEvent());
        });
        b.on("STATus:QUEStionable:CONDition?", c -> {
            c.count(0, 0);
            return nr1(st.questionableCondition());
        });
        b.on("STATus:QUEStionable:ENABle", c -> {
            c.count(1, 1);
            st.setQuestionableEnable((int) c.integer(0, 0, 65535, 0));
            return null;
        });
        b.on("STATus:QUEStionable:ENABle?", c -> {
            c.count(0, 0);
            return nr1(st.questionableEnable());
        });
        b.on("STATus:PRESet", c -> {
            c.count(0, 0);
            st.preset();
            return null;
        });
    }

    /**
     * Declares a numeric setting: {@code header} sets it (NRf with a suffix in {@code unit}, or
     * MIN/MAX/DEF; -222 outside the limits) and {@code header?} reads it (or, with MIN/MAX/DEF, a limit).
     */
    private static void numeric(CommandTree.Builder b, Instrument in, String header, SuffixUnit unit,
            ToDoubleFunction<MeterLimits> min, ToDoubleFunction<MeterLimits> max, double def,
            ToDoubleFunction<Settings> get, ObjDoubleConsumer<Settings> set) {
        b.on(header, c -> {
            c.count(1, 1);
            MeterLimits l = in.limits();
            double v = c.number(0, unit, min.applyAsDouble(l), max.applyAsDouble(l),
                    Settings.clamp(def, min.applyAsDouble(l), max.applyAsDouble(l)));
            in.update(s -> set.accept(s, v));
            return null;
        });
        b.on(header + "?", c -> {
            MeterLimits l = in.limits();
            return nr3(c.queryLimit(in.read(get::applyAsDouble), min.applyAsDouble(l), max.applyAsDouble(l),
                    Settings.clamp(def, min.applyAsDouble(l), max.applyAsDouble(l))));
        });
    }

    /** Declares a setting of character data: {@code choices} in documentation case, answered in short form. */
    private static void choice(CommandTree.Builder b, Instrument in, String header, String[] choices,
            ToIntFunction<Settings> get, ObjIntConsumer<Settings> set) {
        b.on(header, c -> {
            c.count(1, 1);
            int k = c.choice(0, choices);
            in.update(s -> set.accept(s, k));
            return null;
        });
        b.on(header + "?", c -> {
            c.count(0, 0);
            return Response.text(Mnemonics.shortForm(choices[in.read(get::applyAsInt)]));
        });
    }

    private static void source(CommandTree.Builder b, Instrument in) {
        numeric(b, in, "SOURce:FREQuency[:CW]", SuffixUnit.HERTZ, MeterLimits::minFrequencyHz, MeterLimits::maxFrequencyHz,
                Settings.DEFAULT_FREQUENCY_HZ, s -> s.frequencyHz, (s, v) -> s.frequencyHz = v);
        choice(b, in, "SOURce:FREQuency:MODE", new String[] {"CW", "LIST"}, s -> s.listMode ? 1 : 0,
                (s, k) -> s.listMode = k == 1);
        numeric(b, in, "SOURce:VOLTage[:LEVel][:IMMediate][:AMPLitude]", SuffixUnit.VOLT, MeterLimits::minVoltageVrms,
                MeterLimits::maxVoltageVrms, Settings.DEFAULT_VOLTAGE_VRMS, s -> s.voltageVrms, (s, v) -> {
                    s.voltageVrms = v;
                    s.drive = SourceKind.VOLTAGE;
                });
        numeric(b, in, "SOURce:CURRent[:LEVel][:IMMediate][:AMPLitude]", SuffixUnit.AMPERE, MeterLimits::minCurrentArms,
                MeterLimits::maxCurrentArms, Settings.DEFAULT_CURRENT_ARMS, s -> s.currentArms, (s, v) -> {
                    s.currentArms = v;
                    s.drive = SourceKind.CURRENT;
                });
        numeric(b, in, "SOURce:VOLTage[:LEVel][:IMMediate]:OFFSet", SuffixUnit.VOLT, l -> -l.maxBiasVoltageV(),
                MeterLimits::maxBiasVoltageV, 0, s -> s.biasVoltageV, (s, v) -> s.biasVoltageV = v);
        numeric(b, in, "SOURce:CURRent[:LEVel][:IMMediate]:OFFSet", SuffixUnit.AMPERE, l -> -l.maxBiasCurrentA(),
                MeterLimits::maxBiasCurrentA, 0, s -> s.biasCurrentA, (s, v) -> s.biasCurrentA = v);
        // one bias source: switching one kind on switches the other off
        flag(b, in, "SOURce:VOLTage[:LEVel][:IMMediate]:OFFSet:STATe", s -> s.voltageBiasOn, (s, on) -> {
            s.voltageBiasOn = on;
            s.currentBiasOn &= !on;
        });
        flag(b, in, "SOURce:CURRent[:LEVel][:IMMediate]:OFFSet:STATe", s -> s.currentBiasOn, (s, on) -> {
            s.currentBiasOn = on;
            s.voltageBiasOn &= !on;
        });
        list(b, in, "SOURce:LIST:FREQuency", SuffixUnit.HERTZ, MeterLimits::minFrequencyHz, MeterLimits::maxFrequencyHz,
                s -> s.listFrequencyHz, (s, v) -> s.listFrequencyHz = v);
        list(b, in, "SOURce:LIST:VOLTage", SuffixUnit.VOLT, MeterLimits::minVoltageVrms, MeterLimits::maxVoltageVrms,
                s -> s.listVoltageVrms, (s, v) -> s.listVoltageVrms = v);
        list(b, in, "SOURce:LIST:VOLTage:OFFSet", SuffixUnit.VOLT, l -> -l.maxBiasVoltageV(), MeterLimits::maxBiasVoltageV,
                s -> s.listBiasVoltageV, (s, v) -> s.listBiasVoltageV = v);
        b.on("SOURce:LIST:POINts?", c -> {
            c.count(0, 0);
            return nr1(in.read(s -> s.listFrequencyHz.length));
        });
    }

    /** Declares a boolean setting: ON|OFF|NRf (SCPI-1999 Vol 1 §7.3), answered 1|0. */
    private static void flag(CommandTree.Builder b, Instrument in, String header, Predicate<Settings> get,
            BiConsumer<Settings, Boolean> set) {
        b.on(header, c -> {
            c.count(1, 1);
            boolean on = c.bool(0);
            in.update(s -> set.accept(s, on));
            return null;
        });
        b.on(header + "?", c -> {
            c.count(0, 0);
            return bool(in.read(get::test));
        });
    }

    /**
     * Declares a list setting: every element in range, or -222 and nothing changes; -223 past the
     * meter's list length. The query answers the list in NR3.
     */
    private static void list(CommandTree.Builder b, Instrument in, String header, SuffixUnit unit,
            ToDoubleFunction<MeterLimits> min, ToDoubleFunction<MeterLimits> max,
            Function<Settings, double[]> get, BiConsumer<Settings, double[]> set) {
        b.on(header, c -> {
            MeterLimits l = in.limits();
            c.count(1, Integer.MAX_VALUE);
            if (c.params().size() > l.maxListPoints()) {
                throw new ScpiException(StandardError.TOO_MUCH_DATA, c.params().size() + " points, at most " + l.maxListPoints());
            }
            double[] v = new double[c.params().size()];
            for (int i = 0; i < v.length; i++) {
                v[i] = c.number(i, unit, min.applyAsDouble(l), max.applyAsDouble(l), min.applyAsDouble(l));
            }
            in.update(s -> set.accept(s, v));
            return null;
        });
        b.on(header + "?", c -> {
            c.count(0, 0);
            return Instrument.format(in.read(s -> get.apply(s).clone()), false, false);
        });
    }

    private static void sense(CommandTree.Builder b, Instrument in) {
        b.on("[SENSe:]AVERage:COUNt", c -> {
            c.count(1, 1);
            int n = (int) c.integer(0, 1, Settings.MAX_AVERAGES, 1);
            in.update(s -> s.averages = n);
            return null;
        });
        b.on("[SENSe:]AVERage:COUNt?", c -> nr1(Math.round(c.queryLimit(in.read(s -> s.averages), 1, Settings.MAX_AVERAGES, 1))));
        numeric(b, in, "[SENSe:]IMPedance:APERture", SuffixUnit.SECOND, l -> Settings.MIN_APERTURE_S, l -> Settings.MAX_APERTURE_S,
                Settings.DEFAULT_APERTURE_S, s -> s.apertureS, (s, v) -> s.apertureS = v);
        b.on("[SENSe:]IMPedance:RANGe[:UPPer]", c -> {
            c.count(1, 1);
            double[] ranges = in.limits().rangesOhm();
            double v = c.number(0, SuffixUnit.OHM, 0, ranges[ranges.length - 1], ranges[ranges.length - 1]);
            // the smallest range that holds the value: rounding, not an error (SCPI-1999 §21.8 class intro)
            double chosen = ranges[ranges.length - 1];
            for (double r : ranges) {
                if (r >= v) {
                    chosen = r;
                    break;
                }
            }
            double range = chosen;
            in.update(s -> {
                s.rangeOhm = range;
                s.rangeAuto = false;
            });
            return null;
        });
        b.on("[SENSe:]IMPedance:RANGe[:UPPer]?", c -> {
            double[] ranges = in.limits().rangesOhm();
            double last = in.lastRangeOhm();
            double current = in.read(s -> s.rangeAuto && !Double.isNaN(last) ? last : s.rangeOhm);
            return nr3(c.queryLimit(current, ranges[0], ranges[ranges.length - 1], ranges[ranges.length - 1]));
        });
        b.on("[SENSe:]IMPedance:RANGe:AUTO", c -> {
            c.count(1, 1);
            boolean on = c.bool(0);
            double last = in.lastRangeOhm();
            in.update(s -> {
                if (!on && s.rangeAuto && !Double.isNaN(last)) {
                    s.rangeOhm = last;
                }
                s.rangeAuto = on;
            });
            return null;
        });
        b.on("[SENSe:]IMPedance:RANGe:AUTO?", c -> {
            c.count(0, 0);
            return bool(in.read(s -> s.rangeAuto));
        });
        b.on("[SENSe:]CORRection:COLLect[:ACQuire]", c -> {
            c.count(1, 1);
            MeterCorrection.Standard std = MeterCorrection.Standard.values()[c.choice(0, "OPEN", "SHORt", "LOAD")];
            in.collect(c.session(), std);
            return null;
        });
        b.on("[SENSe:]CORRection[:STATe]", c -> {
            c.count(1, 1);
            boolean on = c.bool(0);
            if (on && !in.correctionAvailable()) {
                throw new ScpiException(StandardError.SETTINGS_CONFLICT, "no correction data collected");
            }
            in.update(s -> s.correctionOn = on);
            return null;
        });
        b.on("[SENSe:]CORRection[:STATe]?", c -> {
            c.count(0, 0);
            return bool(in.read(s -> s.correctionOn));
        });
        numeric(b, in, "[SENSe:]CORRection:LOAD:RESistance", SuffixUnit.OHM, l -> 0, l -> Settings.MAX_LOAD_OHM,
                Settings.DEFAULT_LOAD_OHM, s -> s.loadResistanceOhm, (s, v) -> s.loadResistanceOhm = v);
        numeric(b, in, "[SENSe:]CORRection:LOAD:REACtance", SuffixUnit.OHM, l -> -MAX_REACTANCE_OHM, l -> MAX_REACTANCE_OHM,
                0, s -> s.loadReactanceOhm, (s, v) -> s.loadReactanceOhm = v);
        b.on("[SENSe:]FUNCtion[:ON]", c -> {
            c.count(1, 1);
            boolean ratio = function(c.string(0));
            in.update(s -> s.voltageRatio = ratio);
            return null;
        });
        b.on("[SENSe:]FUNCtion[:ON]?", c -> {
            c.count(0, 0);
            return Response.string(in.read(s -> s.voltageRatio) ? "VOLT:RAT" : "IMP");
        });
    }

    /** {@code "IMPedance"} or {@code "VOLTage:RATio"} (short or long forms); else -224. */
    private static boolean function(String name) {
        String[] parts = name.strip().split(":", -1);
        if (parts.length == 1 && Mnemonics.matches("IMPedance", Param.upper(parts[0]))) {
            return false;
        }
        if (parts.length == 2 && Mnemonics.matches("VOLTage", Param.upper(parts[0]))
                && Mnemonics.matches("RATio", Param.upper(parts[1]))) {
            return true;
        }
        throw new ScpiException(StandardError.ILLEGAL_PARAMETER_VALUE, "\"" + name + "\" is not \"IMPedance\" or \"VOLTage:RATio\"");
    }

    private static void measure(CommandTree.Builder b, Instrument in) {
        choice(b, in, "TRIGger[:SEQuence]:SOURce", new String[] {"IMMediate", "BUS"}, s -> s.triggerBus ? 1 : 0,
                (s, k) -> s.triggerBus = k == 1);
        b.on("INITiate[:IMMediate]", c -> {
            c.count(0, 0);
            in.initiate(c.session());
            return null;
        });
        b.on("ABORt", c -> {
            c.count(0, 0);
            in.abort();
            return null;
        });
        b.on("FETCh[:IMPedance]?", c -> {
            c.count(0, 0);
            return in.fetch();
        });
        b.on("READ[:IMPedance]?", c -> {
            c.count(0, 0);
            return in.readNew(c.session());
        });
        b.on("FORMat[:DATA]", c -> {
            c.count(1, 2);
            boolean real = c.choice(0, "ASCii", "REAL") == 1;
            if (real) {
                long bits = c.params().size() == 2 ? c.integer(1, 0, 1000, 64) : 64;
                if (bits != 64) {
                    throw new ScpiException(StandardError.ILLEGAL_PARAMETER_VALUE, "REAL," + bits + ": only REAL,64");
                }
            } else if (c.params().size() == 2) {
                throw new ScpiException(StandardError.PARAMETER_NOT_ALLOWED, "ASCii takes no length");
            }
            in.update(s -> s.real64 = real);
            return null;
        });
        b.on("FORMat[:DATA]?", c -> {
            c.count(0, 0);
            return Response.text(in.read(s -> s.real64) ? "REAL,64" : "ASC");
        });
        choice(b, in, "FORMat:BORDer", new String[] {"NORMal", "SWAPped"}, s -> s.swapped ? 1 : 0,
                (s, k) -> s.swapped = k == 1);
        b.on("SYSTem:HELP:HEADers?", c -> {
            c.count(0, 0);
            return Response.block(String.join("\n", c.session().headers()).concat("\n").getBytes(StandardCharsets.US_ASCII));
        });
    }
}
