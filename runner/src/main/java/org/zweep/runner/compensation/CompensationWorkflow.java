package org.zweep.runner.compensation;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Consumer;
import java.util.stream.Stream;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.CorrectionStyle;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.runner.engine.FixtureCompensation;
import org.zweep.runner.engine.ReadingCorrector;
import org.zweep.runner.engine.RunEstimate;
import org.zweep.runner.engine.Station;
import org.zweep.runner.plan.BiasControl;
import org.zweep.runner.plan.CompensationMode;
import org.zweep.runner.plan.FixturePlan;
import org.zweep.runner.plan.Plan;
import org.zweep.runner.plan.PlannedPoint;
import org.zweep.runner.results.RunFolder;
import org.zweep.runner.results.RunManifest;

/**
 * Gets a run's fixture compensation ready before its first point: meter-side (prompt for each
 * standard, acquire it, switch the meter's correction on) or host-side (reuse stored data young
 * enough, or measure each standard at every sweep frequency, store it, and correct each reading).
 */
public final class CompensationWorkflow {
    /** The host-side data file inside a run folder, relative to it. */
    public static final String RUN_DATA = "compensation/host.csv";

    private static final DateTimeFormatter STAMP = DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss")
            .withZone(ZoneOffset.UTC);

    private CompensationWorkflow() {
    }

    /**
     * Prepares the compensation {@code plan} asks for.
     *
     * @param station the started station
     * @param folder the run folder (host-side data is kept in it)
     * @param resuming whether the run is being resumed (host-side data already in the folder is
     *     then reused whatever its age, so the whole run uses one correction)
     * @param clock the clock data times come from
     * @param log one-line notes
     * @throws InvalidInputException when stored data would have to be extrapolated
     */
    public static FixtureCompensation.Prepared prepare(Plan plan, Station station, RunFolder folder, boolean resuming, Clock clock,
            Consumer<String> log) {
        FixturePlan fx = plan.fixture();
        List<String> names = fx.standards().stream().map(Enum::name).toList();
        if (fx.compensation() == CompensationMode.NONE || fx.standards().isEmpty()) {
            return new FixtureCompensation.Prepared(ReadingCorrector.NONE, new RunManifest.CompensationInfo("none", List.of(), null));
        }
        if (fx.compensation() == CompensationMode.METER) {
            meterSide(plan, fx, station);
            ReadingCorrector loadU = fx.standards().contains(CorrectionStandard.LOAD)
                    ? new MeterLoadUncertainty(fx.loadStandardU()) : ReadingCorrector.NONE;
            return new FixtureCompensation.Prepared(loadU, new RunManifest.CompensationInfo("meter", names, null)
                    .from("measured", null, clock.instant().toString())
                    .withLoad(fx.standards().contains(CorrectionStandard.LOAD) ? fx.loadStandardU() : null));
        }
        Path runData = folder.dir().resolve(RUN_DATA);
        CompensationData data;
        String source = "measured";
        String reusedFrom = null;
        if (resuming && Files.isRegularFile(runData)) {
            data = CompensationData.read(runData);
            RunManifest.CompensationInfo before = previous(folder);
            if (before != null && before.source() != null) {
                source = before.source();
                reusedFrom = before.reusedFrom();
            }
            log.accept("compensation: using the data already in the run folder (measured "
                    + org.zweep.runner.text.Figures.time(data.info().time()) + ")");
        } else {
            Optional<Path> reusable = findReusable(plan, station, folder, clock.instant());
            if (reusable.isPresent()) {
                data = CompensationData.read(reusable.get());
                source = "reused";
                reusedFrom = reusable.get().toAbsolutePath().normalize().toString();
                log.accept("compensation: reusing " + reusable.get() + " measured "
                        + org.zweep.runner.text.Figures.time(data.info().time()));
            } else {
                data = measure(plan, station, clock);
                if (fx.store() != null) {
                    data.write(fx.store().resolve(STAMP.format(data.time()) + ".csv"));
                }
            }
            data.write(runData);
        }
        HostCorrector corrector = HostCorrector.withStatedLoad(data, runData.toString(), fx.loadStandardU());
        corrector.checkCovers(frequencies(plan));
        List<Double> over = data.openOverRangeHz();
        if (!over.isEmpty()) {
            log.accept("compensation: the OPEN read beyond the meter's range at " + over.size() + " of "
                    + data.of(CorrectionStandard.OPEN).size() + " frequencies (" + span(over)
                    + "): its admittance is below what the meter can see, taken as 0 there (listed in "
                    + RUN_DATA + " and run.json)");
        }
        return new FixtureCompensation.Prepared(corrector,
                new RunManifest.CompensationInfo("host", names, RUN_DATA, over.isEmpty() ? null : over)
                        .from(source, reusedFrom, data.time().toString())
                        .withLoad(fx.standards().contains(CorrectionStandard.LOAD) ? fx.loadStandardU() : null));
    }

    /** The compensation record of the run in {@code folder} before it was resumed, or null. */
    private static RunManifest.CompensationInfo previous(RunFolder folder) {
        try {
            return Files.isRegularFile(folder.manifest()) ? RunManifest.read(folder.manifest()).compensation() : null;
        } catch (InvalidInputException e) {
            return null;
        }
    }

    private static String span(List<Double> hz) {
        String lo = Quantities.formatShort(hz.get(0), Unit.HERTZ, 4);
        return hz.size() == 1 ? lo : lo + " … " + Quantities.formatShort(hz.get(hz.size() - 1), Unit.HERTZ, 4);
    }

    private static void meterSide(Plan plan, FixturePlan fx, Station station) {
        station.setMeterCorrection(false);
        // the standards are acquired at the run's own drive, averaging and integration (bias off),
        // which also makes their time known beforehand (RunEstimate)
        RunEstimate estimate = RunEstimate.of(plan);
        boolean perFrequency = station.capabilities().correctionStyle() == CorrectionStyle.AT_ACQUIRED_FREQUENCY;
        // a meter that corrects where it acquired gets each standard at every frequency of the plan;
        // one whose correction covers its range acquires once, at the run's first setting
        List<MeasurementSetting> at = perFrequency ? List.copyOf(settings(plan).values())
                : List.of(plan.points().stream().map(PlannedPoint::setting)
                        .filter(x -> x.quantity() == MeasuredQuantity.IMPEDANCE).findFirst()
                        .orElse(plan.points().get(0).setting()).withBias(Bias.OFF));
        int k = 0;
        for (CorrectionStandard s : fx.standards()) {
            station.insert(state(s), instruction(s), BiasControl.NONE);
            if (s == CorrectionStandard.LOAD && fx.loadStandard() == null) {
                throw new InvalidInputException("meter-side LOAD compensation needs the load standard's value");
            }
            station.announce("compensation: the meter acquires the " + s + " standard"
                    + (perFrequency ? " at " + at.size() + " frequencies" : ""), estimate.compensationStandardS().get(k++));
            if (s == CorrectionStandard.LOAD) {
                station.setLoadStandard(fx.loadStandard());
            }
            // in one list message per standard where the meter's dialect allows, else point by point
            station.acquireCorrection(s, at);
        }
        station.setMeterCorrection(true);
    }

    private static CompensationData measure(Plan plan, Station station, Clock clock) {
        FixturePlan fx = plan.fixture();
        Map<Double, MeasurementSetting> settings = settings(plan);
        List<CompensationData.Entry> entries = new ArrayList<>();
        RunEstimate estimate = RunEstimate.of(plan);
        int k = 0;
        for (CorrectionStandard s : fx.standards()) {
            station.insert(state(s), instruction(s), BiasControl.NONE);
            station.announce("compensation: measuring the " + s + " standard at " + settings.size() + " frequencies",
                    estimate.compensationStandardS().get(k++));
            for (MeasurementSetting m : settings.values()) {
                Reading r = station.measure(m, BiasControl.NONE, 0.0);
                if (r.status() != ReadingStatus.OK && s == CorrectionStandard.OPEN) {
                    // an open's admittance below what the meter can see: taken as 0 there
                    entries.add(CompensationData.Entry.openOverRange(m.frequencyHz(), r.timestamp()));
                    continue;
                }
                if (r.status() != ReadingStatus.OK) {
                    throw new org.zweep.driver.MeterException("the " + s + " standard overloaded the meter at "
                            + Quantities.formatShort(m.frequencyHz(), Unit.HERTZ, 6) + " (no value): a "
                            + s.name().toLowerCase(java.util.Locale.ROOT) + " that overloads is a wiring fault;"
                            + " check the standard and the fixture's connections");
                }
                entries.add(new CompensationData.Entry(s, m.frequencyHz(), r.real(), r.imaginary(), r.timestamp()));
            }
        }
        MeasurementSetting first = settings.values().iterator().next();
        CompensationData.Info info = new CompensationData.Info(CompensationData.FORMAT, clock.instant().toString(),
                station.identity().toString(), fx.terminals().name(), fx.standards().stream().map(Enum::name).toList(),
                fx.loadStandard() == null ? null : fx.loadStandard().resistanceOhm(),
                fx.loadStandard() == null ? null : fx.loadStandard().reactanceOhm(), first.drive().mode().unit(),
                first.drive().levelRms(), first.averagingCount(), first.integrationTimeS());
        return new CompensationData(info, entries);
    }

    /** One setting per distinct impedance frequency of the plan (the first point's drive), bias off, ascending. */
    static Map<Double, MeasurementSetting> settings(Plan plan) {
        return RunEstimate.hostSettings(plan);
    }

    private static List<Double> frequencies(Plan plan) {
        return List.copyOf(settings(plan).keySet());
    }

    private static Optional<Path> findReusable(Plan plan, Station station, RunFolder folder, Instant now) {
        FixturePlan fx = plan.fixture();
        Duration maxAge = fx.reuseYoungerThan();
        if (maxAge == null || maxAge.isZero() || maxAge.isNegative()) {
            return Optional.empty();
        }
        List<Path> candidates = new ArrayList<>();
        try {
            if (fx.store() != null) {
                if (Files.isDirectory(fx.store())) {
                    try (Stream<Path> s = Files.list(fx.store())) {
                        s.filter(p -> p.getFileName().toString().endsWith(".csv")).forEach(candidates::add);
                    }
                }
            } else {
                Path results = folder.dir().toAbsolutePath().getParent();
                if (results != null && Files.isDirectory(results)) {
                    try (Stream<Path> s = Files.list(results)) {
                        s.map(d -> d.resolve(RUN_DATA)).filter(Files::isRegularFile).forEach(candidates::add);
                    }
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot look for stored compensation data: " + e.getMessage(), e);
        }
        List<Double> freqs = frequencies(plan);
        double lo = freqs.get(0);
        double hi = freqs.get(freqs.size() - 1);
        return candidates.stream()
                .filter(p -> !p.toAbsolutePath().startsWith(folder.dir().toAbsolutePath()))
                .map(p -> {
                    try {
                        return Map.entry(p, CompensationData.read(p));
                    } catch (InvalidInputException e) {
                        return null;
                    }
                })
                .filter(java.util.Objects::nonNull)
                .filter(e -> matches(e.getValue(), plan, station, now, maxAge, lo, hi))
                .max(Comparator.comparing(e -> e.getValue().time()))
                .map(Map.Entry::getKey);
    }

    private static boolean matches(CompensationData d, Plan plan, Station station, Instant now, Duration maxAge,
            double lo, double hi) {
        FixturePlan fx = plan.fixture();
        CompensationData.Info i = d.info();
        Duration age = Duration.between(d.time(), now);
        if (age.isNegative() || age.compareTo(maxAge) >= 0) {
            return false;
        }
        boolean sameLoad = fx.loadStandard() == null ? i.loadROhm() == null
                : i.loadROhm() != null && i.loadROhm() == fx.loadStandard().resistanceOhm()
                        && i.loadXOhm() == fx.loadStandard().reactanceOhm();
        boolean covers = fx.standards().stream().allMatch(s -> {
            List<CompensationData.Entry> e = d.of(s);
            return !e.isEmpty() && e.get(0).frequencyHz() <= lo * (1 + 1e-9)
                    && e.get(e.size() - 1).frequencyHz() >= hi * (1 - 1e-9);
        });
        return i.meter().equals(station.identity().toString()) && i.terminals().equals(fx.terminals().name())
                && i.standards().equals(fx.standards().stream().map(Enum::name).toList()) && sameLoad && covers;
    }

    private static FixtureState state(CorrectionStandard s) {
        return switch (s) {
            case OPEN -> FixtureState.OPEN;
            case SHORT -> FixtureState.SHORT;
            case LOAD -> FixtureState.LOAD;
        };
    }

    private static String instruction(CorrectionStandard s) {
        return Station.standardInstruction(state(s));
    }
}
