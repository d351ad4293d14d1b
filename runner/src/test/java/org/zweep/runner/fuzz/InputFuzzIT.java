package org.zweep.runner.fuzz;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.function.Consumer;
import java.util.stream.Stream;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.Test;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.dialect.Dialect;
import org.zweep.runner.sequence.SequenceLoader;
import org.zweep.simulator.SimulatorInputException;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.netlist.Netlist;
import org.zweep.simulator.scpi.BenchLoader;
import org.zweep.simulator.scpi.Instrument;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.Session;
import org.zweep.simulator.scpi.TimingModel;

/**
 * Issue 17, item 2: a seeded mutation fuzzer over the sequence, bench, dialect and netlist readers
 * and the simulator's SCPI parser. Each target starts from the shipped files (and the regression
 * cases under {@code src/test/resources/fuzz/TARGET/}, replayed first), mutates them with a fixed
 * seed for a bounded time, and fails on anything but a clean refusal (the readers' one-line
 * exceptions), on an input that takes longer than a second, or on any throwable at all from the
 * SCPI parser. A failing input is written to {@code target/fuzz-findings/TARGET/} to be kept as a
 * regression case. Time per target: {@code -Dzweep.fuzz.seconds=S} (default 3); seed:
 * {@code -Dzweep.fuzz.seed=N} (default 17).
 */
class InputFuzzIT {
    private static final long SECONDS = Long.getLong("zweep.fuzz.seconds", 3);
    private static final long SEED = Long.getLong("zweep.fuzz.seed", 17);
    private static final Path ROOT = Path.of("..");
    private static final Path REGRESSIONS = Path.of("src/test/resources/fuzz");
    private static final Path FINDINGS = Path.of("target/fuzz-findings");
    private static final long SLOW_NANOS = 1_000_000_000L;
    private static final ExecutorService RUNNER = Executors.newSingleThreadExecutor(r -> {
        Thread t = new Thread(r, "fuzz-target");
        t.setDaemon(true);
        return t;
    });
    private static final String[] TOKENS = {
        "\n", " ", "  ", ":", ": ", "- ", "[", "]", "{", "}", ",", "&a ", "*a", "!!str ", "? ", "|", ">", "#", "'", "\"",
        "---\n", "...\n", "\t", "0", "1", "-1", "1e308", "1e-320", "NaN", "inf", ".5", "9999999999999999999", "k", "meg",
        "M", "m", "u", "n", "p", " V", " Hz", " kHz", "%", "±", "\\n", ";", "*", "?", "#9", "#0", "(", ")", "hi", "lo",
        "R1", "L1", "C1", "K1", "+", ".end", "MIN", "MAX", "DEF", "ON", "OFF", "=", "[meter]", "{frequency:kHz}", "\u0000",
        "\u00e9", "\ud83d\ude00"};

    @AfterAll
    static void stop() {
        RUNNER.shutdownNow();
    }

    @Test
    void sequenceReaderRefusesMutatedSequencesCleanly() throws Exception {
        Path source = ROOT.resolve("sequences/fuzzed.yaml");
        fuzz("sequence", files(ROOT.resolve("sequences"), ".yaml"),
                text -> expectClean(() -> SequenceLoader.parse(text, source), InvalidInputException.class));
    }

    @Test
    void benchReaderRefusesMutatedBenchesCleanly() throws Exception {
        Path dir = ROOT.resolve("sequences/benches");
        fuzz("bench", files(dir, ".bench.yaml"),
                text -> expectClean(() -> BenchSpec.parse(text, "fuzzed.bench.yaml", dir), SimulatorInputException.class));
    }

    @Test
    void dialectReaderRefusesMutatedDialectsCleanly() throws Exception {
        List<String> seeds = new ArrayList<>();
        for (String name : List.of("standard", "mz300")) {
            try (InputStream in = Dialect.class.getResourceAsStream("/org/zweep/driver/dialect/" + name + ".yaml")) {
                seeds.add(new String(in.readAllBytes(), StandardCharsets.UTF_8));
            }
        }
        fuzz("dialect", seeds, text -> expectClean(() -> Dialect.parse("fuzzed.yaml", text), InvalidInputException.class));
    }

    @Test
    void netlistParserRefusesMutatedNetlistsCleanly() throws Exception {
        List<String> seeds = List.of("R1 hi lo 100\n", "R1 hi mid 47\nL1 mid lo 1m\nC1 hi lo 100n\n",
                "* transformer\nL1 hi lo 10m\nL2 a b 2.5m\nK1 L1 L2 0.99\nR2 a b 50\n.end\n",
                "C1 hi n1 100n; R1 n1 lo 0.05\n+ \nL2 hi lo 1u\n", "R1 hi lo 1k\nR2 hi lo 1k\nR3 hi n 1\nR4 n lo 0\n");
        fuzz("netlist", seeds, text -> expectClean(() -> Netlist.parse(text, "fuzzed.cir"), SimulatorInputException.class));
    }

    @Test
    void scpiParserAnswersEveryMutatedMessageWithoutThrowing() throws Exception {
        List<String> seeds = List.of("*IDN?", "*RST;*CLS;*ESE 255;*SRE 16;*ESR?;*STB?", "SOUR:FREQ 1.5KHZ;FREQ?",
                "SOUR:VOLT 500MV;:SOUR:VOLT:OFFS 1;OFFS:STAT ON", "SOUR:LIST:FREQ 100,1E3,1E4;:SOUR:FREQ:MODE LIST;:READ?",
                "FORM REAL,64;:FETC?", "SENS:CORR:COLL OPEN;*OPC?", "SIM:DEV \"R1 hi lo 47\\nC1 hi lo 1n\"",
                "SIM:DEV #210R1 hi lo 5", "SYST:ERR?;:SYST:ERR:COUN?", "STAT:OPER:COND?;:STAT:QUES?;:STAT:PRES",
                "SENS:IMP:RANG:AUTO OFF;RANG 1E3;APER 1E-3;:SENS:AVER:COUN 3", "TRIG:SOUR IMM;:INIT;*WAI;:FETC?",
                "SIM:FIXT SHOR;:SIM:SEED 12;NOIS:KEY 3;:SIM:STR ON", "SYST:HELP:HEAD?", "SOUR:CURR 5MA;CURR:OFFS 0.01");
        SimulatedBench bench = new SimulatedBench(BenchSpec.ofNetlist("R1 hi lo 100", "fuzz").withTiming(Timing.NONE));
        try (Instrument in = new Instrument(bench, InstrumentOptions.defaults().withTiming(TimingModel.NONE)
                .withBenchLoader(BenchLoader.simulated(false, TimingModel.NONE)))) {
            Session s = in.openSession(Session.Hooks.NONE);
            fuzz("scpi", seeds, text -> {
                s.execute(text.getBytes(StandardCharsets.ISO_8859_1));
                return null;
            });
        }
    }

    /** Runs {@code f}: a clean refusal of the expected kind is fine, anything else is a finding. */
    private static Object expectClean(java.util.concurrent.Callable<?> f, Class<? extends RuntimeException> clean) throws Exception {
        try {
            return f.call();
        } catch (RuntimeException e) {
            if (clean.isInstance(e) && e.getMessage() != null && !e.getMessage().contains("\n")) {
                return null;
            }
            throw e;
        }
    }

    private interface Target {
        Object run(String text) throws Exception;
    }

    private static List<String> files(Path dir, String suffix) throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            List<String> out = new ArrayList<>();
            for (Path p : s.filter(p -> p.getFileName().toString().endsWith(suffix)).sorted().toList()) {
                out.add(Files.readString(p));
            }
            return out;
        }
    }

    private static void fuzz(String name, List<String> seeds, Target target) throws Exception {
        List<String> findings = new ArrayList<>();
        Consumer<String> check = text -> {
            String problem = problem(target, text);
            if (problem != null) {
                findings.add(problem);
                save(name, text);
            }
        };
        Path kept = REGRESSIONS.resolve(name);
        int regressions = 0;
        if (Files.isDirectory(kept)) {
            try (Stream<Path> s = Files.list(kept)) {
                for (Path p : s.sorted().toList()) {
                    check.accept(Files.readString(p, StandardCharsets.UTF_8));
                    regressions++;
                }
            }
        }
        SplittableRandom random = new SplittableRandom(SEED ^ name.hashCode());
        List<String> corpus = new ArrayList<>(seeds);
        long end = System.nanoTime() + SECONDS * 1_000_000_000L;
        long inputs = 0;
        while (System.nanoTime() < end && findings.size() < 5) {
            String text = mutate(corpus.get(random.nextInt(corpus.size())), corpus, random);
            check.accept(text);
            inputs++;
            if (random.nextInt(16) == 0 && corpus.size() < 256) {
                corpus.add(text); // mutants breed: deeper structure errors come from several steps
            }
        }
        System.out.printf("fuzz %s: %d regression cases, %d mutated inputs in %d s, %d findings%n", name, regressions,
                inputs, SECONDS, findings.size());
        assertEquals(List.of(), findings, "inputs saved under " + FINDINGS.resolve(name).toAbsolutePath());
    }

    /** Null when the target handled {@code text} cleanly and within a second, else what happened. */
    private static String problem(Target target, String text) {
        Future<Object> f = RUNNER.submit(() -> target.run(text));
        long t0 = System.nanoTime();
        try {
            f.get(SLOW_NANOS * 10, TimeUnit.NANOSECONDS);
            long took = System.nanoTime() - t0;
            return took > SLOW_NANOS ? "slow: " + took / 1_000_000 + " ms for " + text.length() + " characters" : null;
        } catch (TimeoutException e) {
            f.cancel(true);
            return "hang: over 10 s for " + text.length() + " characters";
        } catch (java.util.concurrent.ExecutionException e) {
            return e.getCause().toString();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return "interrupted";
        }
    }

    private static void save(String name, String text) {
        try {
            Path dir = Files.createDirectories(FINDINGS.resolve(name));
            Files.writeString(dir.resolve(Integer.toHexString(text.hashCode()) + ".txt"), text, StandardCharsets.UTF_8);
        } catch (IOException e) {
            // the assertion still reports the finding
        }
    }

    /** One to four edits: replace, insert a token, delete or repeat a span, or splice another input in. */
    static String mutate(String in, List<String> corpus, SplittableRandom r) {
        StringBuilder b = new StringBuilder(in);
        int edits = 1 + r.nextInt(4);
        for (int e = 0; e < edits; e++) {
            int at = b.length() == 0 ? 0 : r.nextInt(b.length() + 1);
            switch (r.nextInt(6)) {
                case 0 -> {
                    if (at < b.length()) {
                        b.setCharAt(at, (char) (r.nextBoolean() ? 32 + r.nextInt(95) : r.nextInt(256)));
                    }
                }
                case 1, 2 -> b.insert(at, TOKENS[r.nextInt(TOKENS.length)]);
                case 3 -> b.delete(at, Math.min(b.length(), at + 1 + r.nextInt(16)));
                case 4 -> {
                    int len = Math.min(b.length() - at, 1 + r.nextInt(32));
                    String span = b.substring(at, at + len);
                    b.insert(at, span.repeat(1 + r.nextInt(r.nextInt(8) == 0 ? 400 : 4)));
                }
                default -> {
                    String other = corpus.get(r.nextInt(corpus.size()));
                    int from = other.isEmpty() ? 0 : r.nextInt(other.length());
                    b.insert(at, other, from, Math.min(other.length(), from + 1 + r.nextInt(64)));
                }
            }
            if (b.length() > 1 << 16) {
                b.setLength(1 << 16);
            }
        }
        return b.toString();
    }
}
