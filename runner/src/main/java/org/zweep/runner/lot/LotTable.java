package org.zweep.runner.lot;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.zweep.runner.analysis.Analysis;
import org.zweep.runner.analysis.AnalysisResult;
import org.zweep.runner.analysis.RunData;
import org.zweep.runner.analysis.StepResult;
import org.zweep.runner.results.Csv;
import org.zweep.runner.results.RunManifest;
import org.zweep.runner.store.Capability;
import org.zweep.runner.verdict.CheckOutcome;

/**
 * The parts of a lot as one table: per part its serial, outcome, verdict, each check's value and
 * result and each fitted element of each step's first fitted sweep (the same figures as
 * {@code zweep analyze} and {@code zweep compare}), read from the part folders.
 *
 * @param lot the lot's name
 * @param parts the parts in the order they were measured
 */
public record LotTable(String lot, List<Part> parts) {
    /** The lot table's file name in a lot folder. */
    public static final String FILE = "lot.csv";

    private static final Pattern PART_DIR = Pattern.compile("(\\d{3,})-.*");

    /**
     * One check of one part.
     *
     * @param parameter the parameter checked (its suffix names the unit)
     * @param value the value judged (the last, for a check over several points); NaN for none
     * @param result {@code pass}, {@code fail}, {@code conditional pass}, … or {@code not evaluated}
     * @param min the lowest passing value, NaN for none
     * @param max the highest passing value, NaN for none
     */
    public record Check(String parameter, double value, String result, double min, double max) {
    }

    /**
     * One part.
     *
     * @param index its place in the lot (1, 2, …)
     * @param serial its serial
     * @param folder its run folder
     * @param runId the run's id
     * @param outcome {@code completed}, {@code aborted}, {@code failed} or {@code running}
     * @param verdict the run's verdict ({@code pass}, {@code fail}, …; {@code none} before it ended)
     * @param checks check name → its value and result, in the sequence's order
     * @param fits {@code STEP/ELEMENT} → the fitted value
     */
    public record Part(int index, String serial, Path folder, String runId, String outcome, String verdict,
            Map<String, Check> checks, Map<String, Double> fits) {
        /** Whether the part was measured to the end and its verdict is not a pass. */
        public boolean failed() {
            return "completed".equals(outcome) && CheckOutcome.failed(verdict);
        }

        /** Whether the part was measured to the end. */
        public boolean completed() {
            return "completed".equals(outcome);
        }
    }

    /** The part folders of a lot folder ({@code NNN-SERIAL}), in order. */
    public static List<Path> partFolders(Path lotDir) {
        try (Stream<Path> s = Files.list(lotDir)) {
            return s.filter(p -> Files.isDirectory(p) && PART_DIR.matcher(p.getFileName().toString()).matches()
                    && Files.isRegularFile(p.resolve(RunManifest.FILE)))
                    .sorted((a, b) -> Integer.compare(index(a), index(b))).toList();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot list " + lotDir + ": " + e.getMessage(), e);
        }
    }

    /** The part's index from its folder's name ({@code 006-SN-06} → 6). */
    public static int index(Path partFolder) {
        Matcher m = PART_DIR.matcher(partFolder.getFileName().toString());
        return m.matches() ? Integer.parseInt(m.group(1)) : 0;
    }

    /** The folder name of part {@code index} with {@code serial}: {@code 006-SN-06} (other characters as {@code _}). */
    public static String folderName(int index, String serial) {
        return String.format(java.util.Locale.ROOT, "%03d-%s", index, serial.replaceAll("[^A-Za-z0-9._-]", "_"));
    }

    /** Reads the lot in {@code lotDir}: {@code lot.json} and every part folder (analysed as {@code zweep analyze} does). */
    public static LotTable read(Path lotDir) {
        LotManifest m = LotManifest.read(lotDir);
        List<Part> parts = new ArrayList<>();
        for (Path f : partFolders(lotDir)) {
            parts.add(part(f));
        }
        return new LotTable(m.lot(), List.copyOf(parts));
    }

    private static Part part(Path f) {
        RunManifest m = RunManifest.read(f.resolve(RunManifest.FILE));
        String serial = m.identityOrNone().serial();
        Map<String, Check> checks = new LinkedHashMap<>();
        Map<String, Double> fits = new LinkedHashMap<>();
        String verdict = m.verdict() == null ? "none" : m.verdict();
        if (hasPoints(f)) {
            AnalysisResult a = Analysis.analyze(RunData.read(f), null);
            for (CheckOutcome c : a.checks()) {
                checks.put(c.name(), new Check(c.parameter(), c.lastValue(), c.result(), c.min(), c.max()));
            }
            for (StepResult s : a.steps()) {
                StepResult.SweepFit fit = s.primaryFit();
                if (fit == null) {
                    continue;
                }
                for (Map.Entry<String, Double> e : fit.fit().parameters().entrySet()) {
                    fits.put(s.name() + "/" + e.getKey(), e.getValue() == null ? Double.NaN : e.getValue());
                }
            }
        }
        return new Part(index(f), serial == null ? f.getFileName().toString() : serial, f, m.id(), m.outcome(), verdict,
                checks, fits);
    }

    private static boolean hasPoints(Path f) {
        Path csv = f.resolve(org.zweep.runner.results.RunFolder.POINTS);
        try (Stream<String> lines = Files.lines(csv, StandardCharsets.UTF_8)) {
            return lines.skip(1).anyMatch(l -> !l.isBlank());
        } catch (IOException | UncheckedIOException e) {
            return false;
        }
    }

    /** The check names over all parts, in the order first met. */
    public List<String> checkNames() {
        LinkedHashMap<String, Boolean> names = new LinkedHashMap<>();
        parts.forEach(p -> p.checks().keySet().forEach(n -> names.put(n, true)));
        return List.copyOf(names.keySet());
    }

    /** The fitted element names ({@code STEP/ELEMENT}) over all parts, in the order first met. */
    public List<String> fitNames() {
        LinkedHashMap<String, Boolean> names = new LinkedHashMap<>();
        parts.forEach(p -> p.fits().keySet().forEach(n -> names.put(n, true)));
        return List.copyOf(names.keySet());
    }

    /** Parts measured to the end. */
    public long completed() {
        return parts.stream().filter(Part::completed).count();
    }

    /** Parts measured to the end whose verdict is a pass (or none: no checks). */
    public long passed() {
        return parts.stream().filter(p -> p.completed() && !p.failed()).count();
    }

    /** Parts measured to the end that did not pass. */
    public long failed() {
        return parts.stream().filter(Part::failed).count();
    }

    /** The yield: passed over completed parts (NaN without any). */
    public double yield() {
        long n = completed();
        return n == 0 ? Double.NaN : (double) passed() / n;
    }

    /**
     * One check over the completed parts of the lot.
     *
     * @param name the check's name
     * @param parameter its parameter
     * @param judged parts whose check was evaluated
     * @param passed parts whose check passed
     * @param values the values of the completed parts (finite ones)
     * @param lowest the lowest value, NaN for none
     * @param highest the highest value, NaN for none
     * @param capability n, mean, σ (n − 1) and Cpk against the check's limits
     */
    public record CheckStats(String name, String parameter, int judged, int passed, List<Double> values,
            double lowest, double highest, Capability capability) {
    }

    /** Each check's statistics over the completed parts, in {@link #checkNames()} order. */
    public List<CheckStats> checkStats() {
        List<CheckStats> out = new ArrayList<>();
        for (String name : checkNames()) {
            List<Double> values = new ArrayList<>();
            int judged = 0;
            int passed = 0;
            Check first = null;
            for (Part p : parts) {
                Check c = p.checks().get(name);
                if (c == null || !p.completed()) {
                    continue;
                }
                first = first == null ? c : first;
                if (Double.isFinite(c.value())) {
                    values.add(c.value());
                }
                if (!"not evaluated".equals(c.result())) {
                    judged++;
                    passed += "pass".equals(c.result()) ? 1 : 0;
                }
            }
            if (first == null) {
                continue;
            }
            double lo = values.stream().mapToDouble(Double::doubleValue).min().orElse(Double.NaN);
            double hi = values.stream().mapToDouble(Double::doubleValue).max().orElse(Double.NaN);
            out.add(new CheckStats(name, first.parameter(), judged, passed, List.copyOf(values), lo, hi,
                    Capability.of(values, first.min(), first.max())));
        }
        return out;
    }

    /** The header of {@code lot.csv}. */
    public List<String> header() {
        List<String> h = new ArrayList<>(List.of("part", "serial", "lot", "outcome", "verdict", "run_id", "folder"));
        for (String c : checkNames()) {
            h.add("check." + c);
            h.add("check." + c + ".result");
        }
        for (String f : fitNames()) {
            h.add("fit." + f);
        }
        return h;
    }

    /** {@code lot.csv}: the header and one row per part (numbers as SI decimals, empty for none). */
    public String csv() {
        List<String> checks = checkNames();
        List<String> fitNames = fitNames();
        StringBuilder b = new StringBuilder();
        Csv.append(b, header()).append('\n');
        for (Part p : parts) {
            List<String> row = new ArrayList<>(List.of(Integer.toString(p.index()), p.serial(), lot, orEmpty(p.outcome()),
                    p.verdict(), orEmpty(p.runId()), p.folder().getFileName().toString()));
            for (String c : checks) {
                Check k = p.checks().get(c);
                row.add(k == null ? "" : Csv.number(k.value()));
                row.add(k == null ? "" : k.result());
            }
            for (String f : fitNames) {
                Double v = p.fits().get(f);
                row.add(v == null ? "" : Csv.number(v));
            }
            Csv.append(b, row).append('\n');
        }
        return b.toString();
    }

    /** Writes {@link #csv()} to {@code lotDir/lot.csv}; returns its path. */
    public Path writeCsv(Path lotDir) {
        Path file = lotDir.resolve(FILE);
        try {
            Files.writeString(file, csv(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
        return file;
    }

    private static String orEmpty(String s) {
        return s == null ? "" : s;
    }
}
