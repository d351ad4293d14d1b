package org.zweep.simulator.scpi;

import java.nio.charset.StandardCharsets;
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

    private static void source(CommandTree.Builder b, Instrument in) {
        b.on("SOURce:FREQuency[:CW]", c -> {
            c.count(1, 1);
            MeterLimits l = in.limits();
            double f = c.number(0, Unit.HERTZ, l.minFrequencyHz(), l.maxFrequencyHz(), Settings.DEFAULT_FREQUENCY_HZ);
            in.update(s -> s.frequencyHz = f);
            return null;
        });
        b.on("SOURce:FREQuency[:CW]?", c -> {
            MeterLimits l = in.limits();
            return nr3(c.queryLimit(in.read(s -> s.frequencyHz), l.minFrequencyHz(), l.maxFrequencyHz(),
                    Settings.DEFAULT_FREQUENCY_HZ));
        });
        b.on("SOURce:FREQuency:MODE", c -> {
            c.count(1, 1);
            boolean list = c.choice(0, "CW", "LIST") == 1;
            in.update(s -> s.listMode = list);
            return null;
        });
        b.on("SOURce:FREQuency:MODE?", c -> {
            c.count(0, 0);
            return Response.text(in.read(s -> s.listMode) ? "LIST" : "CW");
        });
        b.on("SOURce:VOLTage[:LEVel][:IMMediate][:AMPLitude]", c -> {
            c.count(1, 1);
            MeterLimits l = in.limits();
            double v = c.number(0, Unit.VOLT, l.minVoltageVrms(), l.maxVoltageVrms(), Settings.DEFAULT_VOLTAGE_VRMS);
            in.update(s -> {
                s.voltageVrms = v;
                s.drive = SourceKind.VOLTAGE;
            });
            return null;
        });
        b.on("SOURce:VOLTage[:LEVel][:IMMediate][:AMPLitude]?", c -> {
            MeterLimits l = in.limits();
            return nr3(c.queryLimit(in.read(s -> s.voltageVrms), l.minVoltageVrms(), l.maxVoltageVrms(),
                    Settings.DEFAULT_VOLTAGE_VRMS));
        });
        b.on("SOURce:CURRent[:LEVel][:IMMediate][:AMPLitude]", c -> {
            c.count(1, 1);
            MeterLimits l = in.limits();
            double v = c.number(0, Unit.AMPERE, l.minCurrentArms(), l.maxCurrentArms(), Settings.DEFAULT_CURRENT_ARMS);
            in.update(s -> {
                s.currentArms = v;
                s.drive = SourceKind.CURRENT;
            });
            return null;
        });
        b.on("SOURce:CURRent[:LEVel][:IMMediate][:AMPLitude]?", c -> {
            MeterLimits l = in.limits();
            return nr3(c.queryLimit(in.read(s -> s.currentArms), l.minCurrentArms(), l.maxCurrentArms(),
                    Settings.DEFAULT_CURRENT_ARMS));
        });
        b.on("SOURce:VOLTage[:LEVel][:IMMediate]:OFFSet", c -> {
            c.count(1, 1);
            double max = in.limits().maxBiasVoltageV();
            double v = c.number(0, Unit.VOLT, -max, max, 0);
            in.update(s -> s.biasVoltageV = v);
            return null;
        });
        b.on("SOURce:VOLTage[:LEVel][:IMMediate]:OFFSet?", c -> {
            double max = in.limits().maxBiasVoltageV();
            return nr3(c.queryLimit(in.read(s -> s.biasVoltageV), -max, max, 0));
        });
        b.on("SOURce:CURRent[:LEVel][:IMMediate]:OFFSet", c -> {
            c.count(1, 1);
            double max = in.limits().maxBiasCurrentA();
            double v = c.number(0, Unit.AMPERE, -max, max, 0);
            in.update(s -> s.biasCurrentA = v);
            return null;
        });
        b.on("SOURce:CURRent[:LEVel][:IMMediate]:OFFSet?", c -> {
            double max = in.limits().maxBiasCurrentA();
            return nr3(c.queryLimit(in.read(s -> s.biasCurrentA), -max, max, 0));
        });
        // one bias source: switching one kind on switches the other off
        b.on("SOURce:VOLTage[:LEVel][:IMMediate]:OFFSet:STATe", c -> {
            c.count(1, 1);
            boolean on = c.bool(0);
            in.update(s -> {
                s.voltageBiasOn = on;
                if (on) {
                    s.currentBiasOn = false;
                }
            });
            return null;
        });
        b.on("SOURce:VOLTage[:LEVel][:IMMediate]:OFFSet:STATe?", c -> {
            c.count(0, 0);
            return bool(in.read(s -> s.voltageBiasOn));
        });
        b.on("SOURce:CURRent[:LEVel][:IMMediate]:OFFSet:STATe", c -> {
            c.count(1, 1);
            boolean on = c.bool(0);
            in.update(s -> {
                s.currentBiasOn = on;
                if (on) {
                    s.voltageBiasOn = false;
                }
            });
            return null;
        });
        b.on("SOURce:CURRent[:LEVel][:IMMediate]:OFFSet:STATe?", c -> {
            c.count(0, 0);
            return bool(in.read(s -> s.currentBiasOn));
        });
        b.on("SOURce:LIST:FREQuency", c -> {
            MeterLimits l = in.limits();
            double[] v = list(c, Unit.HERTZ, l.minFrequencyHz(), l.maxFrequencyHz(), Settings.DEFAULT_FREQUENCY_HZ, l);
            in.update(s -> s.listFrequencyHz = v);
            return null;
        });
        b.on("SOURce:LIST:FREQuency?", c -> {
            c.count(0, 0);
            return Instrument.format(in.read(s -> s.listFrequencyHz.clone()), false, false);
        });
        b.on("SOURce:LIST:VOLTage", c -> {
            MeterLimits l = in.limits();
            double[] v = list(c, Unit.VOLT, l.minVoltageVrms(), l.maxVoltageVrms(), Settings.DEFAULT_VOLTAGE_VRMS, l);
            in.update(s -> s.listVoltageVrms = v);
            return null;
        });
        b.on("SOURce:LIST:VOLTage?", c -> {
            c.count(0, 0);
            return Instrument.format(in.read(s -> s.listVoltageVrms.clone()), false, false);
        });
        b.on("SOURce:LIST:VOLTage:OFFSet", c -> {
            MeterLimits l = in.limits();
            double[] v = list(c, Unit.VOLT, -l.maxBiasVoltageV(), l.maxBiasVoltageV(), 0, l);
            in.update(s -> s.listBiasVoltageV = v);
            return null;
        });
        b.on("SOURce:LIST:VOLTage:OFFSet?", c -> {
            c.count(0, 0);
            return Instrument.format(in.read(s -> s.listBiasVoltageV.clone()), false, false);
        });
        b.on("SOURce:LIST:POINts?", c -> {
            c.count(0, 0);
            return nr1(in.read(s -> s.listFrequencyHz.length));
        });
    }

    /** A list parameter: every element in range, or -222 and nothing changes; -223 past the limit. */
    private static double[] list(Call c, Unit unit, double min, double max, double def, MeterLimits l) {
        c.count(1, Integer.MAX_VALUE);
        if (c.params().size() > l.maxListPoints()) {
            throw new ScpiException(StandardError.TOO_MUCH_DATA, c.params().size() + " points, at most " + l.maxListPoints());
        }
        double[] v = new double[c.params().size()];
        for (int i = 0; i < v.length; i++) {
            v[i] = c.number(i, unit, min, max, def);
        }
        return v;
    }

    private static void sense(CommandTree.Builder b, Instrument in) {
        b.on("[SENSe:]AVERage:COUNt", c -> {
            c.count(1, 1);
            int n = (int) c.integer(0, 1, Settings.MAX_AVERAGES, 1);
            in.update(s -> s.averages = n);
            return null;
        });
        b.on("[SENSe:]AVERage:COUNt?", c -> nr1(Math.round(c.queryLimit(in.read(s -> s.averages), 1, Settings.MAX_AVERAGES, 1))));
        b.on("[SENSe:]IMPedance:APERture", c -> {
            c.count(1, 1);
            double t = c.number(0, Unit.SECOND, Settings.MIN_APERTURE_S, Settings.MAX_APERTURE_S, Settings.DEFAULT_APERTURE_S);
            in.update(s -> s.apertureS = t);
            return null;
        });
        b.on("[SENSe:]IMPedance:APERture?", c -> nr3(c.queryLimit(in.read(s -> s.apertureS),
                Settings.MIN_APERTURE_S, Settings.MAX_APERTURE_S, Settings.DEFAULT_APERTURE_S)));
        b.on("[SENSe:]IMPedance:RANGe[:UPPer]", c -> {
            c.count(1, 1);
            double[] ranges = in.limits().rangesOhm();
            double v = c.number(0, Unit.OHM, 0, ranges[ranges.length - 1], ranges[ranges.length - 1]);
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
        b.on("[SENSe:]CORRection:LOAD:RESistance", c -> {
            c.count(1, 1);
            double v = c.number(0, Unit.OHM, 0, Settings.MAX_LOAD_OHM, Settings.DEFAULT_LOAD_OHM);
            in.update(s -> s.loadResistanceOhm = v);
            return null;
        });
        b.on("[SENSe:]CORRection:LOAD:RESistance?", c -> nr3(c.queryLimit(in.read(s -> s.loadResistanceOhm),
                0, Settings.MAX_LOAD_OHM, Settings.DEFAULT_LOAD_OHM)));
        b.on("[SENSe:]CORRection:LOAD:REACtance", c -> {
            c.count(1, 1);
            double v = c.number(0, Unit.OHM, -MAX_REACTANCE_OHM, MAX_REACTANCE_OHM, 0);
            in.update(s -> s.loadReactanceOhm = v);
            return null;
        });
        b.on("[SENSe:]CORRection:LOAD:REACtance?", c -> nr3(c.queryLimit(in.read(s -> s.loadReactanceOhm),
                -MAX_REACTANCE_OHM, MAX_REACTANCE_OHM, 0)));
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
        b.on("TRIGger[:SEQuence]:SOURce", c -> {
            c.count(1, 1);
            boolean bus = c.choice(0, "IMMediate", "BUS") == 1;
            in.update(s -> s.triggerBus = bus);
            return null;
        });
        b.on("TRIGger[:SEQuence]:SOURce?", c -> {
            c.count(0, 0);
            return Response.text(in.read(s -> s.triggerBus) ? "BUS" : "IMM");
        });
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
        b.on("FORMat:BORDer", c -> {
            c.count(1, 1);
            boolean swapped = c.choice(0, "NORMal", "SWAPped") == 1;
            in.update(s -> s.swapped = swapped);
            return null;
        });
        b.on("FORMat:BORDer?", c -> {
            c.count(0, 0);
            return Response.text(in.read(s -> s.swapped) ? "SWAP" : "NORM");
        });
        b.on("SYSTem:HELP:HEADers?", c -> {
            c.count(0, 0);
            return Response.block(String.join("\n", c.session().headers()).concat("\n").getBytes(StandardCharsets.US_ASCII));
        });
    }
}
