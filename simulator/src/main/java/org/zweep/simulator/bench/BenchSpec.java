package org.zweep.simulator.bench;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.zweep.simulator.InputFiles;
import org.zweep.simulator.SimulatorInputException;
import org.zweep.simulator.netlist.Netlist;

/**
 * A complete bench description: meter, fixture, load standard, device and seed, read from a bench
 * file (format in README, section "formats-simulator") or made from a netlist. Immutable and
 * thread-safe; {@link SimulatedBench} measures with it.
 */
public final class BenchSpec {

    private final String description;
    private final MeterSpec meter;
    private final FixtureSpec fixture;
    private final Device device;
    private final long seed;
    private final Map<String, Device> parts;

    BenchSpec(String description, MeterSpec meter, FixtureSpec fixture, Device device, long seed) {
        this(description, meter, fixture, device, seed, Map.of());
    }

    BenchSpec(String description, MeterSpec meter, FixtureSpec fixture, Device device, long seed,
            Map<String, Device> parts) {
        this.description = description;
        this.meter = meter;
        this.fixture = fixture;
        this.device = device;
        this.seed = seed;
        this.parts = Map.copyOf(parts);
    }

    /**
     * The same bench with the part {@code serial} in the fixture: the device its {@code parts}
     * entry describes, or the bench's own device when the file names no such serial.
     */
    public BenchSpec forPart(String serial) {
        Device d = parts.get(serial);
        return d == null ? this : new BenchSpec(description, meter, fixture, d, seed, parts);
    }

    /** The serials the bench file's {@code parts} section describes (empty: none). */
    public java.util.Set<String> partSerials() {
        return parts.keySet();
    }

    /**
     * Reads a bench file. A {@code netlist_file} in it is resolved against the file's folder.
     *
     * @throws SimulatorInputException with {@code file:line:column} when the file cannot be read
     *     or is not a valid bench description
     */
    public static BenchSpec load(Path file) {
        String text = InputFiles.read(file, "bench file", InputFiles.MAX_BENCH_BYTES);
        Path parent = file.toAbsolutePath().getParent();
        return new BenchFileReader(file.toString(), parent, null).read(text);
    }

    /**
     * Reads a bench file whose {@code netlist_file}, if any, must lie inside {@code folders} too
     * (what {@code SIMulate:BENCh} loads: a client must not reach other files through it).
     *
     * @throws SimulatorInputException as {@link #load(Path)}, and for a netlist file outside the folders
     */
    public static BenchSpec load(Path file, List<Path> folders) {
        String text = InputFiles.read(file, "bench file", InputFiles.MAX_BENCH_BYTES);
        Path parent = file.toAbsolutePath().getParent();
        return new BenchFileReader(file.toString(), parent, List.copyOf(folders)).read(text);
    }

    /**
     * Reads a bench description from text.
     *
     * @param yaml the bench file's content
     * @param sourceName the name used in messages
     * @param baseDir the folder a {@code netlist_file} is resolved against
     * @throws SimulatorInputException with {@code source:line:column} for invalid content
     */
    public static BenchSpec parse(String yaml, String sourceName, Path baseDir) {
        return new BenchFileReader(sourceName, baseDir, null).read(yaml);
    }

    /**
     * The default meter and fixture with a netlist device: what {@code zweep sim --device} serves.
     *
     * @param netlist element lines between {@code hi} and {@code lo}
     * @param sourceName the name used in messages, e.g. {@code "--device"}
     * @throws SimulatorInputException with {@code source:line:column} for an invalid netlist
     */
    public static BenchSpec ofNetlist(String netlist, String sourceName) {
        return new BenchSpec("netlist from " + sourceName, MeterSpec.defaults(),
                FixtureSpec.defaults(), new NetlistDevice(Netlist.parse(netlist, sourceName)), 0);
    }

    /**
     * The default meter and fixture with the device in a netlist file (read in bounded memory).
     *
     * @throws SimulatorInputException with {@code file:line:column} for an invalid netlist, or
     *     naming the file when it cannot be read or is too large
     */
    public static BenchSpec ofNetlistFile(Path file) {
        return ofNetlist(InputFiles.read(file, "netlist file", InputFiles.MAX_NETLIST_BYTES), file.toString());
    }

    /**
     * The same meter and fixture with a netlist device instead: what {@code SIMulate:DEVice} loads.
     *
     * @param netlist element lines between {@code hi} and {@code lo}
     * @param sourceName the name used in messages
     * @throws SimulatorInputException with {@code source:line:column} for an invalid netlist
     */
    public BenchSpec withNetlistDevice(String netlist, String sourceName) {
        return new BenchSpec("netlist from " + sourceName, meter, fixture,
                new NetlistDevice(Netlist.parse(netlist, sourceName)), seed, parts);
    }

    /** The same bench with no noise, no fixture residuals or strays and no lead resistance. */
    public BenchSpec ideal() {
        return new BenchSpec(description, meter.withNoiseRel(0), fixture.ideal(), device, seed, parts);
    }

    /** The same bench with another seed. */
    public BenchSpec withSeed(long newSeed) {
        return new BenchSpec(description, meter, fixture, device, newSeed, parts);
    }

    /** The same bench with another timing model. */
    public BenchSpec withTiming(Timing timing) {
        return new BenchSpec(description, meter.withTiming(timing), fixture, device, seed, parts);
    }

    /** A one-line description (the bench file's {@code description}, or where it came from). */
    public String description() {
        return description;
    }

    /** The meter's limits. */
    public MeterLimits limits() {
        return meter.limits();
    }

    /** The timing model. */
    public Timing timing() {
        return meter.timing();
    }

    /** The initial seed all noise is drawn from. */
    public long seed() {
        return seed;
    }

    /** The impedance of the load standard at {@code frequencyHz}, in ohms: {@code {real, imag}}. */
    public double[] loadStandardOhm(double frequencyHz) {
        var z = fixture.loadImpedance(frequencyHz);
        return new double[] {z.getReal(), z.getImaginary()};
    }

    MeterSpec meter() {
        return meter;
    }

    FixtureSpec fixture() {
        return fixture;
    }

    Device device() {
        return device;
    }

    BenchSpec withDevice(Device d) {
        return new BenchSpec(description, meter, fixture, d, seed, parts);
    }

    BenchSpec withFixture(FixtureSpec f) {
        return new BenchSpec(description, meter, f, device, seed, parts);
    }

    BenchSpec withMeter(MeterSpec m) {
        return new BenchSpec(description, m, fixture, device, seed, parts);
    }
}
