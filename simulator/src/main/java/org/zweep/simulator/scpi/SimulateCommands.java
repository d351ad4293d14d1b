package org.zweep.simulator.scpi;

import org.zweep.simulator.SimulatorInputException;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.bench.FixtureSlot;
import org.zweep.simulator.bench.Wiring;

/**
 * The simulator-only {@code SIMulate} subsystem (our own, in SCPI-1999 style): what is in the
 * fixture, the transformer's second winding, the seed, the timing model, the applied DC bias over time, loading a
 * device or bench, and the strict IEEE 488.2 query rules. The server adds {@code SIMulate:FAULt}.
 */
final class SimulateCommands {
    /** Seeds travel as NRf, so they are exact up to 2^53. */
    private static final long MAX_EXACT = 1L << 53;

    private SimulateCommands() {
    }

    static void register(CommandTree.Builder b, Instrument in) {
        b.on("SIMulate:FIXTure[:SLOT]", c -> {
            c.count(1, 1);
            FixtureSlot slot = FixtureSlot.values()[c.choice(0, "OPEN", "SHORt", "LOAD", "DEVice")];
            in.bench().setSlot(slot);
            return null;
        });
        b.on("SIMulate:FIXTure[:SLOT]?", c -> {
            c.count(0, 0);
            return Response.text(switch (in.bench().slot()) {
                case OPEN -> "OPEN";
                case SHORT -> "SHOR";
                case LOAD -> "LOAD";
                case DEVICE -> "DEV";
            });
        });
        b.on("SIMulate:SECondary", c -> {
            c.count(1, 1);
            Wiring w = c.choice(0, "OPEN", "SHORt") == 0 ? Wiring.SECONDARY_OPEN : Wiring.SECONDARY_SHORTED;
            in.bench().setWiring(w);
            return null;
        });
        b.on("SIMulate:SECondary?", c -> {
            c.count(0, 0);
            return Response.text(in.bench().wiring() == Wiring.SECONDARY_OPEN ? "OPEN" : "SHOR");
        });
        b.on("SIMulate:SEED", c -> {
            c.count(1, 1);
            in.bench().setSeed(c.integer(0, -MAX_EXACT, MAX_EXACT, 0));
            in.restartNoise();
            return null;
        });
        b.on("SIMulate:SEED?", c -> {
            c.count(0, 0);
            return Response.text(Long.toString(in.bench().seed()));
        });
        b.on("SIMulate:TIMing", c -> {
            c.count(1, 1);
            in.setTiming(c.choice(0, "REAL", "NONE") == 0 ? TimingModel.REAL : TimingModel.NONE);
            return null;
        });
        b.on("SIMulate:TIMing?", c -> {
            c.count(0, 0);
            return Response.text(in.timing().name());
        });
        b.on("SIMulate:STRict", c -> {
            c.count(1, 1);
            c.session().setStrict(c.bool(0));
            return null;
        });
        b.on("SIMulate:STRict?", c -> {
            c.count(0, 0);
            return Response.text(c.session().strict() ? "1" : "0");
        });
        b.on("SIMulate:BIAS:HISTory?", c -> {
            c.count(0, 0);
            StringBuilder out = new StringBuilder();
            for (BiasHistory.Entry e : in.biasHistory().entries()) {
                if (out.length() > 0) {
                    out.append(',');
                }
                out.append(String.format(java.util.Locale.ROOT, "%.6f,%s,%s", e.timeS(), nr3(e.voltageV()),
                        nr3(e.currentA())));
            }
            return Response.text(out.toString());
        });
        b.on("SIMulate:BIAS:HISTory:CLEar", c -> {
            c.count(0, 0);
            in.biasHistory().clear();
            return null;
        });
        b.on("SIMulate:DEVice", c -> {
            c.count(1, 1);
            String netlist = c.text(0).replace("\\n", "\n");
            BenchLoader loader = loader(in);
            in.setBench(load(() -> loader.withDevice(in.bench(), netlist)));
            return null;
        });
        b.on("SIMulate:BENCh", c -> {
            c.count(1, 1);
            String name = c.string(0);
            BenchLoader loader = loader(in);
            in.setBench(load(() -> loader.load(name)));
            return null;
        });
    }

    private static String nr3(double v) {
        return String.format(java.util.Locale.ROOT, "%.9E", v);
    }

    private static BenchLoader loader(Instrument in) {
        BenchLoader l = in.options().benchLoader();
        if (l == null) {
            throw new ScpiException(StandardError.EXECUTION_ERROR, "this simulator cannot load benches");
        }
        return l;
    }

    private static Bench load(java.util.function.Supplier<Bench> f) {
        try {
            return f.get();
        } catch (SimulatorInputException | IllegalArgumentException e) {
            throw new ScpiException(StandardError.EXECUTION_ERROR, e.getMessage());
        }
    }
}
