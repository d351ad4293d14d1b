package org.zweep.runner.cli;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import java.util.stream.Collectors;
import org.zweep.driver.InvalidInputException;
import org.zweep.runner.results.Json;
import org.zweep.driver.impedance.DerivedParameter;
import org.zweep.driver.impedance.EquivalentCircuit;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.impedance.PartKind;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;
import org.zweep.driver.impedance.Unit.Bound;
import org.zweep.driver.uncertainty.MonteCarlo;
import org.zweep.driver.uncertainty.UncertainImpedance;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParseResult;
import picocli.CommandLine.Spec;

/**
 * {@code zweep convert}: an impedance given by any one pair of values at a frequency, printed as
 * every derived parameter (a table, or a JSON object with the {@link DerivedParameter} contract
 * names).
 */
@Command(
        name = "convert",
        mixinStandardHelpOptions = true,
        sortOptions = false,
        description = {
            "Prints every parameter of an impedance given by one pair of values at a frequency.",
            "Values take SI prefixes and units (100nF, 4.7 kΩ, 1.5kHz, 2.2Meg) or the IEC 60062 code (4k7, R47, 4u7).",
            "C and L are magnitudes (positive); D, ESR and Rs may be zero; θ is in degrees.",
            "With --u-r/--u-x/--correlation (or --u-z/--u-theta/--correlation) it also prints the standard"
                + " uncertainty u and the expanded uncertainty U (k = 2) of every parameter, by the law of"
                + " propagation of uncertainty (JCGM 100:2008), and the Monte Carlo 95 %% interval (JCGM 101:2008)"
                + " where the linear law does not hold; a missing u is zero.",
            "With --json: one JSON object, SI numbers, null where a value is infinite."
        },
        footer = ExitCode.HELP_LIST)
final class ConvertCommand implements Callable<Integer> {

    private static final int TABLE_DIGITS = 6;
    private static final int UNCERTAINTY_DIGITS = 3;
    /** Immutable and thread-safe once built. */

    /** One accepted input pair: its two options, their units and bounds, the factory, and the part kind it implies (null: none). */
    private record Pair(String first, Unit firstUnit, Bound firstBound, String second, Unit secondUnit,
            Bound secondBound, Factory factory, PartKind kind) {
        String name() {
            return first + "/" + second;
        }
    }

    private interface Factory {
        Impedance make(double frequencyHz, double a, double b);
    }

    private static final List<Pair> PAIRS = List.of(
            new Pair("--r", Unit.OHM, Bound.ANY, "--x", Unit.OHM, Bound.ANY, Impedance::fromRX, null),
            new Pair("--z", Unit.OHM, Bound.NON_NEGATIVE, "--theta", Unit.DEGREE, Bound.ANY, Impedance::fromPolar,
                    null),
            new Pair("--cs", Unit.FARAD, Bound.POSITIVE, "--d", Unit.NONE, Bound.NON_NEGATIVE, Impedance::fromCsD,
                    PartKind.CAPACITOR),
            new Pair("--cp", Unit.FARAD, Bound.POSITIVE, "--d", Unit.NONE, Bound.NON_NEGATIVE, Impedance::fromCpD,
                    PartKind.CAPACITOR),
            new Pair("--ls", Unit.HENRY, Bound.POSITIVE, "--q", Unit.NONE, Bound.POSITIVE, Impedance::fromLsQ,
                    PartKind.INDUCTOR),
            new Pair("--lp", Unit.HENRY, Bound.POSITIVE, "--q", Unit.NONE, Bound.POSITIVE, Impedance::fromLpQ,
                    PartKind.INDUCTOR),
            new Pair("--cs", Unit.FARAD, Bound.POSITIVE, "--esr", Unit.OHM, Bound.NON_NEGATIVE,
                    Impedance::fromCsEsr, PartKind.CAPACITOR),
            new Pair("--cp", Unit.FARAD, Bound.POSITIVE, "--rp", Unit.OHM, Bound.POSITIVE, Impedance::fromCpRp,
                    PartKind.CAPACITOR),
            new Pair("--ls", Unit.HENRY, Bound.POSITIVE, "--rs", Unit.OHM, Bound.NON_NEGATIVE, Impedance::fromLsRs,
                    PartKind.INDUCTOR),
            new Pair("--lp", Unit.HENRY, Bound.POSITIVE, "--rp", Unit.OHM, Bound.POSITIVE, Impedance::fromLpRp,
                    PartKind.INDUCTOR));

    private static final String PAIR_LIST = "--r/--x, --z/--theta, --cs/--d, --cp/--d, --ls/--q, --lp/--q, "
            + "--cs/--esr, --cp/--rp, --ls/--rs or --lp/--rp";

    @Spec
    CommandSpec spec;

    @Option(names = {"-f", "--frequency"}, paramLabel = "FREQ", description = "test frequency, e.g. 1kHz (required)")
    String frequency;

    @Option(names = "--r", paramLabel = "OHMS", description = "resistance R (with --x)")
    String r;

    @Option(names = "--x", paramLabel = "OHMS", description = "reactance X, negative when capacitive (with --r)")
    String x;

    @Option(names = "--z", paramLabel = "OHMS", description = "magnitude |Z| (with --theta)")
    String z;

    @Option(names = "--theta", paramLabel = "DEG", description = "phase θ in degrees, -180 to 180 (with --z)")
    String theta;

    @Option(names = "--cs", paramLabel = "FARADS", description = "series capacitance (with --d or --esr)")
    String cs;

    @Option(names = "--cp", paramLabel = "FARADS", description = "parallel capacitance (with --d or --rp)")
    String cp;

    @Option(names = "--ls", paramLabel = "HENRIES", description = "series inductance (with --q or --rs)")
    String ls;

    @Option(names = "--lp", paramLabel = "HENRIES", description = "parallel inductance (with --q or --rp)")
    String lp;

    @Option(names = "--d", paramLabel = "D", description = "dissipation factor D = tan δ (with --cs or --cp)")
    String d;

    @Option(names = "--q", paramLabel = "Q", description = "quality factor Q (with --ls or --lp)")
    String q;

    @Option(names = "--esr", paramLabel = "OHMS", description = "equivalent series resistance (with --cs)")
    String esr;

    @Option(names = "--rs", paramLabel = "OHMS", description = "series resistance (with --ls)")
    String rs;

    @Option(names = "--rp", paramLabel = "OHMS", description = "parallel resistance (with --cp or --lp)")
    String rp;

    @Option(names = "--u-r", paramLabel = "OHMS", description = "standard uncertainty of R")
    String uR;

    @Option(names = "--u-x", paramLabel = "OHMS", description = "standard uncertainty of X")
    String uX;

    @Option(names = "--u-z", paramLabel = "OHMS", description = "standard uncertainty of |Z| (instead of --u-r/--u-x)")
    String uZ;

    @Option(names = "--u-theta", paramLabel = "DEG", description = "standard uncertainty of θ in degrees (with --u-z)")
    String uTheta;

    @Option(names = "--correlation", paramLabel = "R",
            description = "correlation coefficient of R and X (or of |Z| and θ), -1 to 1; default 0")
    String correlation;

    @Mixin
    JsonOption json;

    @Override
    public Integer call() {
        ParseResult parsed = spec.commandLine().getParseResult();
        if (frequency == null) {
            throw new InvalidInputException("convert needs --frequency, e.g. --frequency 1kHz");
        }
        double frequencyHz = parse("--frequency", frequency, Unit.HERTZ, Bound.POSITIVE);
        Pair pair = selectPair(parsed);
        double a = parse(pair.first(), parsed.matchedOptionValue(pair.first(), ""), pair.firstUnit(),
                pair.firstBound());
        double b = parse(pair.second(), parsed.matchedOptionValue(pair.second(), ""), pair.secondUnit(),
                pair.secondBound());
        if (pair.secondUnit() == Unit.DEGREE && Math.abs(b) > 180.0) {
            throw new InvalidInputException("--theta \"" + theta + "\" is out of range: θ must be from -180 to 180°");
        }
        Impedance impedance = pair.factory().make(frequencyHz, a, b);
        UncertainImpedance uncertain = uncertainty(impedance);
        PrintWriter out = spec.commandLine().getOut();
        if (json.on()) {
            out.println(uncertain == null ? toJson(impedance) : toJson(uncertain));
        } else if (uncertain == null) {
            printTable(out, impedance, pair.kind());
        } else {
            printTable(out, uncertain, pair.kind());
        }
        return ExitCode.OK;
    }

    /** The uncertainty options as an uncertain impedance, or null when none is given. */
    private UncertainImpedance uncertainty(Impedance impedance) {
        boolean rectangular = uR != null || uX != null;
        boolean polar = uZ != null || uTheta != null;
        if (rectangular && polar) {
            throw new InvalidInputException("give --u-r/--u-x or --u-z/--u-theta, not both");
        }
        if (!rectangular && !polar) {
            if (correlation != null) {
                throw new InvalidInputException("--correlation needs --u-r/--u-x or --u-z/--u-theta");
            }
            return null;
        }
        double r = correlation == null ? 0.0 : parse("--correlation", correlation, Unit.NONE, Bound.ANY);
        if (Math.abs(r) > 1.0) {
            throw new InvalidInputException("--correlation \"" + correlation + "\" is out of range: -1 to 1");
        }
        if (rectangular) {
            return new UncertainImpedance(impedance, orZero("--u-r", uR, Unit.OHM), orZero("--u-x", uX, Unit.OHM), r);
        }
        return UncertainImpedance.fromPolar(impedance, orZero("--u-z", uZ, Unit.OHM),
                orZero("--u-theta", uTheta, Unit.DEGREE), r);
    }

    private static double orZero(String option, String text, Unit unit) {
        return text == null ? 0.0 : parse(option, text, unit, Bound.NON_NEGATIVE);
    }

    private static Pair selectPair(ParseResult parsed) {
        List<String> given = new ArrayList<>();
        for (String name : List.of("--r", "--x", "--z", "--theta", "--cs", "--cp", "--ls", "--lp", "--d", "--q",
                "--esr", "--rs", "--rp")) {
            if (parsed.hasMatchedOption(name)) {
                given.add(name);
            }
        }
        if (given.isEmpty()) {
            throw new InvalidInputException("convert needs one pair of values: " + PAIR_LIST);
        }
        if (given.size() > 2) {
            throw new InvalidInputException("give exactly one pair of values, got " + String.join(", ", given));
        }
        for (Pair p : PAIRS) {
            if (given.size() == 2 && given.contains(p.first()) && given.contains(p.second())) {
                return p;
            }
        }
        if (given.size() == 1) {
            String alone = given.get(0);
            String partners = PAIRS.stream()
                    .filter(p -> p.first().equals(alone) || p.second().equals(alone))
                    .map(p -> p.first().equals(alone) ? p.second() : p.first())
                    .collect(Collectors.joining(" or "));
            throw new InvalidInputException(alone + " needs " + partners + " to make a pair");
        }
        throw new InvalidInputException(String.join(" with ", given) + " is not a pair; give one of " + PAIR_LIST);
    }

    private static double parse(String option, String text, Unit unit, Bound bound) {
        try {
            return Quantities.parse(text, unit, bound);
        } catch (InvalidInputException e) {
            throw new InvalidInputException(option + ": " + e.getMessage(), e);
        }
    }

    /** The contract map as a JSON object ({@link Json}: infinite values become {@code null}). */
    static String toJson(Impedance impedance) {
        return Json.text(DerivedParameter.contractValues(impedance)).stripTrailing();
    }

    /** Draws of the Monte Carlo check; the seed is fixed so the same input prints the same figures. */
    static final int MONTE_CARLO_TRIALS = 200_000;

    /**
     * The parameters whose linear 95 % interval a Monte Carlo propagation (JCGM 101:2008, 8.2)
     * does not validate, with the Monte Carlo figures.
     */
    static Map<DerivedParameter, MonteCarlo.Result> monteCarloCheck(UncertainImpedance z) {
        List<DerivedParameter> ps = DerivedParameter.contract().stream().filter(p -> p != DerivedParameter.FREQUENCY)
                .toList();
        return MonteCarlo.linearFailures(z, ps, MONTE_CARLO_TRIALS, 1L);
    }

    /** The correlations {@code zweep convert} prints: between R, X, |Z| and θ. */
    private static final List<List<DerivedParameter>> CORRELATIONS = List.of(
            List.of(DerivedParameter.R, DerivedParameter.X), List.of(DerivedParameter.R, DerivedParameter.Z),
            List.of(DerivedParameter.X, DerivedParameter.Z), List.of(DerivedParameter.Z, DerivedParameter.THETA));

    /**
     * The contract map, then {@code u_<name>} and {@code U_<name>} (k = 2) for every contract
     * parameter but the frequency, the coverage factor and the correlations as
     * {@code "r_ohm,z_ohm": r}; infinite or undefined values become {@code null}.
     */
    static String toJson(UncertainImpedance z) {
        Map<String, Object> values = new LinkedHashMap<>();
        values.putAll(DerivedParameter.contractValues(z.value()));
        for (DerivedParameter p : DerivedParameter.contract()) {
            if (p != DerivedParameter.FREQUENCY) {
                values.put("u_" + p.key(), z.standardUncertainty(p));
            }
        }
        for (DerivedParameter p : DerivedParameter.contract()) {
            if (p != DerivedParameter.FREQUENCY) {
                values.put("U_" + p.key(), z.expandedUncertainty(p));
            }
        }
        values.put("coverage_factor", UncertainImpedance.COVERAGE_FACTOR);
        Map<String, Double> correlations = new LinkedHashMap<>();
        for (List<DerivedParameter> pq : CORRELATIONS) {
            correlations.put(pq.get(0).key() + "," + pq.get(1).key(), z.correlation(pq.get(0), pq.get(1)));
        }
        values.put("correlations", correlations);
        Map<String, Object> mc = new LinkedHashMap<>();
        monteCarloCheck(z).forEach((p, r) -> {
            Map<String, Double> o = new LinkedHashMap<>();
            o.put("u", r.standardUncertainty());
            o.put("low95", r.low95());
            o.put("high95", r.high95());
            mc.put(p.key(), o);
        });
        values.put("monte_carlo", mc);
        return Json.text(values).stripTrailing();
    }

    private static void printTable(PrintWriter out, UncertainImpedance z, PartKind kind) {
        int width = 0;
        for (DerivedParameter p : DerivedParameter.values()) {
            width = Math.max(width, p.label().length());
        }
        String row = "%-" + width + "s  %-14s  %-12s  %s%n";
        out.printf(row, "", "value", "u", "U (k = 2)");
        for (DerivedParameter p : DerivedParameter.values()) {
            double u = z.standardUncertainty(p);
            out.printf(row, p.label(), Quantities.format(p.of(z.value()), p.unit(), TABLE_DIGITS),
                    Quantities.format(u, p.unit(), UNCERTAINTY_DIGITS),
                    Quantities.format(z.expandedUncertainty(p), p.unit(), UNCERTAINTY_DIGITS));
        }
        out.println();
        for (List<DerivedParameter> pq : CORRELATIONS) {
            double r = z.correlation(pq.get(0), pq.get(1));
            out.printf("r(%s, %s) = %s%n", pq.get(0).label(), pq.get(1).label(),
                    Double.isNaN(r) ? "-" : String.format(java.util.Locale.ROOT, "%.3f", Math.round(r * 1000) / 1000.0 + 0.0));
        }
        Map<DerivedParameter, MonteCarlo.Result> mc = monteCarloCheck(z);
        if (!mc.isEmpty()) {
            out.println();
            out.printf(java.util.Locale.ROOT, "the linear law does not hold here for %s: the Monte Carlo method (JCGM 101:2008, %,d draws)"
                    + " gives%n", mc.keySet().stream().map(DerivedParameter::label).collect(Collectors.joining(", ")),
                    MONTE_CARLO_TRIALS);
            mc.forEach((p, r) -> out.printf(row, p.label(), "95 % interval",
                    Quantities.format(r.low95(), p.unit(), UNCERTAINTY_DIGITS) + " … "
                            + Quantities.format(r.high95(), p.unit(), UNCERTAINTY_DIGITS),
                    "(u = " + Quantities.format(r.standardUncertainty(), p.unit(), UNCERTAINTY_DIGITS) + ")"));
        }
        suggest(out, z.value(), kind);
    }

    private static void printTable(PrintWriter out, Impedance impedance, PartKind kind) {
        int width = 0;
        for (DerivedParameter p : DerivedParameter.values()) {
            width = Math.max(width, p.label().length());
        }
        for (DerivedParameter p : DerivedParameter.values()) {
            out.printf("%-" + width + "s  %s%n", p.label(), Quantities.format(p.of(impedance), p.unit(), TABLE_DIGITS));
        }
        suggest(out, impedance, kind);
    }

    private static void suggest(PrintWriter out, Impedance impedance, PartKind kind) {
        EquivalentCircuit model = EquivalentCircuit.AUTO.resolve(impedance, kind);
        out.printf("%nsuggested model: %s (%s)%n", model.name().toLowerCase(java.util.Locale.ROOT),
                suggestedParameters(impedance, model));
    }

    private static String suggestedParameters(Impedance impedance, EquivalentCircuit model) {
        boolean series = model == EquivalentCircuit.SERIES;
        double xOhm = impedance.reactanceOhm();
        List<String> names = new ArrayList<>();
        if (xOhm < 0) {
            names.add(series ? "Cs" : "Cp");
        } else if (xOhm > 0) {
            names.add(series ? "Ls" : "Lp");
        }
        names.add(series ? "Rs" : "Rp");
        if (xOhm < 0) {
            names.add("D");
        } else if (xOhm > 0) {
            names.add("Q");
        }
        return names.stream().collect(Collectors.joining(", "));
    }
}
