package org.zweep.bench.runner;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.DoubleAdder;
import org.zweep.simulator.bench.Bench;
import org.zweep.simulator.bench.BenchSpec;
import org.zweep.simulator.bench.SimulatedBench;
import org.zweep.simulator.bench.Timing;
import org.zweep.simulator.scpi.InstrumentOptions;
import org.zweep.simulator.scpi.TimingModel;
import org.zweep.simulator.server.ServerOptions;
import org.zweep.simulator.server.SimulatorServer;

/**
 * zweep against the script a user would otherwise write, side by side on the same simulated
 * meter over loopback TCP:
 * {@code java -cp bench/target/benchmarks.jar org.zweep.bench.runner.SideBySide [REPO [ROUNDS]]}
 * (after {@code mvn -B -DskipTests -pl bench -am package}).
 *
 * <p>Side A is the {@code zweep} launcher's {@code run} as a process, as a user runs it (the jar
 * with the launcher's class-data archive), with {@code --no-index}: the script keeps no index either. Side B is {@code bench/scripts/pyvisa_sweep.py} on
 * Debian's {@code python3-pyvisa-py}. Both sweep the same linear frequencies, write every row
 * to a CSV file and fsync it before the next trigger (per point, or per list of 201). The two
 * alternate A B A B; the medians of ROUNDS (default 5) runs are printed with their ratio. With
 * the simulator's {@code real} timing, the wall time is also set against the meter's own time
 * (the sum of the simulated points' durations, counted in this JVM). The host cost per point is
 * the slope between a 200-point and a 2,000-point run at timing {@code none}, so start-up and
 * warm-up drop out.
 */
public final class SideBySide {
    private static final String PYTHON = "/usr/bin/python3";
    /** Each point: 2 ms overhead (the bench's) + a 3 ms aperture = 5 ms of meter time above 1 kHz. */
    private static final String APERTURE = "3 ms";
    private static final double START_HZ = 1e3;
    private static final double STOP_HZ = 1e6;

    private SideBySide() {
    }

    record Case(String name, Timing timing, int points, int list) {
    }

    public static void main(String[] args) throws Exception {
        Path repo = Path.of(args.length > 0 ? args[0] : ".").toAbsolutePath().normalize();
        int rounds = args.length > 1 ? Integer.parseInt(args[1]) : 5;
        Path jar = repo.resolve("runner/target/zweep.jar");
        Path launcher = repo.resolve("zweep");
        Path script = repo.resolve("bench/scripts/pyvisa_sweep.py");
        if (!Files.isRegularFile(jar)) {
            throw new IllegalStateException("build the jar first: mvn -B -DskipTests -pl bench -am package");
        }
        Path dir = Files.createTempDirectory("zweep-side-by-side");
        // the launcher's first start after a build makes its class-data archive: not measured
        time(List.of(launcher.toString(), "--version"));
        System.out.printf(Locale.ROOT, "load average at start: %s%n", load());
        List<Case> cases = List.of(
                new Case("point by point, timing none", Timing.NONE, 200, 0),
                new Case("point by point, timing none", Timing.NONE, 2000, 0),
                new Case("lists of 201, timing none", Timing.NONE, 200, 201),
                new Case("lists of 201, timing none", Timing.NONE, 2000, 201),
                new Case("point by point, timing real (5 ms/point)", Timing.REAL, 2000, 0),
                new Case("lists of 201, timing real (5 ms/point)", Timing.REAL, 2000, 201));
        System.out.printf(Locale.ROOT, "%-42s %6s %12s %12s %7s %14s %14s%n", "case", "points", "zweep run",
                "pyvisa-py", "ratio", "zweep/meter", "script/meter");
        double[][] medians = new double[cases.size()][];
        for (int c = 0; c < cases.size(); c++) {
            Case k = cases.get(c);
            DoubleAdder meterS = new DoubleAdder();
            Bench bench = RealTimingCheck.counting(new SimulatedBench(
                    BenchSpec.load(BenchFiles.capacitorBench(repo)).withTiming(k.timing())), meterS);
            TimingModel model = k.timing() == Timing.REAL ? TimingModel.REAL : TimingModel.NONE;
            try (SimulatorServer server = SimulatorServer.start(bench, ServerOptions.defaults().withPort(0)
                    .withInstrument(InstrumentOptions.defaults().withTiming(model)))) {
                Path seq = sequence(dir, k, server.port());
                double[] a = new double[rounds];
                double[] b = new double[rounds];
                double[] ma = new double[rounds];
                double[] mb = new double[rounds];
                for (int r = 0; r < rounds; r++) {
                    meterS.reset();
                    a[r] = time(List.of(launcher.toString(), "run", seq.toString(), "--yes", "--quiet",
                            "--out", dir.resolve("zweep-" + c + "-" + r).toString(), "--no-index"));
                    ma[r] = meterS.sum();
                    meterS.reset();
                    b[r] = time(List.of(PYTHON, script.toString(), "127.0.0.1", Integer.toString(server.port()),
                            dir.resolve("script-" + c + "-" + r + ".csv").toString(), Integer.toString(k.points()),
                            Double.toString(START_HZ), Double.toString(STOP_HZ), "0.003",
                            Integer.toString(k.list())));
                    mb[r] = meterS.sum();
                }
                double am = median(a);
                double bm = median(b);
                medians[c] = new double[] {am, bm};
                String vsMeter = k.timing() == Timing.REAL
                        ? String.format(Locale.ROOT, "%14.3f %14.3f", am / median(ma), bm / median(mb))
                        : String.format(Locale.ROOT, "%14s %14s", "-", "-");
                System.out.printf(Locale.ROOT, "%-42s %6d %10.3f s %10.3f s %7.2f %s  load %s%n", k.name(), k.points(),
                        am, bm, am / bm, vsMeter, load());
            }
        }
        for (int c = 0; c + 1 < 4; c += 2) {
            double dn = cases.get(c + 1).points() - cases.get(c).points();
            double za = (medians[c + 1][0] - medians[c][0]) / dn * 1e6;
            double zb = (medians[c + 1][1] - medians[c][1]) / dn * 1e6;
            System.out.printf(Locale.ROOT, "host cost per point (slope 200 -> 2000), %s: zweep %.0f us, script %.0f us,"
                    + " ratio %.2f%n", cases.get(c).list() == 0 ? "point by point" : "lists of 201", za, zb, za / zb);
        }
        System.out.printf(Locale.ROOT, "start-up: %s, load %s%n", startup(launcher, dir), load());
    }

    /**
     * {@code zweep --version} through the launcher against a hello-world JVM (a class of its own
     * in a folder), alternating, 20 runs each.
     */
    private static String startup(Path launcher, Path dir) throws IOException, InterruptedException {
        Path classes = dir.resolve("hello");
        Path cls = classes.resolve(HelloWorld.class.getName().replace('.', '/') + ".class");
        Files.createDirectories(cls.getParent());
        try (var in = SideBySide.class.getResourceAsStream("/" + HelloWorld.class.getName().replace('.', '/')
                + ".class")) {
            Files.write(cls, in.readAllBytes());
        }
        double[] z = new double[20];
        double[] h = new double[20];
        for (int i = 0; i < z.length; i++) {
            h[i] = time(List.of("java", "-cp", classes.toString(), HelloWorld.class.getName()));
            z[i] = time(List.of(launcher.toString(), "--version"));
        }
        return String.format(Locale.ROOT, "zweep --version (the launcher) median %.3f s, hello-world JVM median %.3f s,"
                + " ratio %.2f (%d runs each, alternating)", median(z), median(h), median(z) / median(h), z.length);
    }

    /** The 1, 5 and 15 minute load averages. */
    private static String load() {
        try {
            String[] f = Files.readString(Path.of("/proc/loadavg")).trim().split("\\s+");
            return f[0] + " " + f[1] + " " + f[2];
        } catch (IOException e) {
            return "unknown";
        }
    }

    private static Path sequence(Path dir, Case k, int port) {
        String yaml = BenchFiles.sweepYaml("tcp://127.0.0.1:" + port, BenchFiles.dialect(dir, k.list()), "1 kHz",
                "1 MHz", k.points(), APERTURE);
        return BenchFiles.write(dir.resolve("side-" + k.points() + "-" + k.list() + "-" + k.timing() + ".yaml"), yaml);
    }

    private static double time(List<String> command) throws IOException, InterruptedException {
        List<String> cmd = new ArrayList<>(command);
        long t0 = System.nanoTime();
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).start();
        byte[] out = p.getInputStream().readAllBytes();
        if (!p.waitFor(10, TimeUnit.MINUTES) || p.exitValue() != 0) {
            throw new IllegalStateException(String.join(" ", cmd) + " failed (" + p.exitValue() + "):\n"
                    + new String(out, java.nio.charset.StandardCharsets.UTF_8));
        }
        return (System.nanoTime() - t0) / 1e9;
    }

    private static double median(double[] v) {
        double[] s = v.clone();
        Arrays.sort(s);
        return s.length % 2 == 1 ? s[s.length / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
    }
}
