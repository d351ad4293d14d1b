package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Figures marked "computed" are the textbook formulas evaluated independently of this code: Z_C = 1/(jωC),
 * |Z| = √(R² + X²), D = R/|X| = tan δ (C. K. Alexander, M. N. O. Sadiku, Fundamentals of Electric Circuits,
 * §9.5, from memory) and the series ↔ parallel equivalents Rp = Rs(1 + Q²), Cp = Cs/(1 + D²),
 * Lp = Ls(1 + 1/Q²) (T. H. Lee, The Design of CMOS Radio-Frequency Integrated Circuits, 2nd ed., ch. 3,
 * from memory).
 */
class ConvertCommandTest {

    private static final ObjectMapper MAPPER = new ObjectMapper();

    /** What one run of {@code zweep} printed and returned. */
    record Run(int exitCode, String out, String err) {
    }

    static Run zweep(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Cli.run(args, new PrintWriter(out), new PrintWriter(err));
        return new Run(code, out.toString(), err.toString());
    }

    static JsonNode json(String... args) throws Exception {
        String[] withJson = new String[args.length + 1];
        System.arraycopy(args, 0, withJson, 0, args.length);
        withJson[args.length] = "--json";
        Run run = zweep(withJson);
        assertEquals(ExitCode.OK, run.exitCode(), run.err());
        assertEquals("", run.err());
        return MAPPER.readTree(run.out());
    }

    private static void assertLine(String out, String label, String value) {
        Pattern line = Pattern.compile("(?m)^" + Pattern.quote(label) + " +" + Pattern.quote(value) + "$");
        assertTrue(line.matcher(out).find(), () -> "no line '" + label + " … " + value + "' in\n" + out);
    }

    @Test
    void tablePrintsEveryParameterOfALossyCapacitor() {
        Run run = zweep("convert", "--frequency", "1kHz", "--cs", "1uF", "--esr", "1");
        assertEquals(ExitCode.OK, run.exitCode());
        assertEquals("", run.err());
        assertLine(run.out(), "X", "-159.155 Ω"); // 1 µF + 1 Ω at 1 kHz, computed: X_C = −159.15494 Ω
        assertLine(run.out(), "|Z|", "159.158 Ω"); // computed: |Z| = 159.158 Ω
        assertLine(run.out(), "θ", "-89.6400°"); // same
        assertLine(run.out(), "δ", "0.359995°"); // same: δ = 0.3600°
        assertLine(run.out(), "D", "0.00628319"); // same: D = 6.28319e-3
        assertLine(run.out(), "Q", "159.155"); // computed: Q = 159.15494
        assertLine(run.out(), "Rp", "25.3313 kΩ"); // computed: Rp = Rs(1 + Q²) = 25 331.296 Ω
        assertLine(run.out(), "Cp", "999.961 nF"); // computed: Cp = Cs/(1 + D²) = 0.9999605231 µF
        assertLine(run.out(), "Cs", "1.00000 µF");
        assertLine(run.out(), "Rs (ESR)", "1.00000 Ω");
        for (String label : List.of("f", "R", "G", "B", "|Y|", "Ls", "Lp")) {
            assertTrue(Pattern.compile("(?m)^" + Pattern.quote(label) + " ").matcher(run.out()).find(), label);
        }
        assertTrue(run.out().contains("suggested model: parallel (Cp, Rp, D)"), run.out()); // rule of thumb
    }

    @Test
    void jsonHasExactlyTheContractFieldsInOrder() throws Exception {
        JsonNode node = json("convert", "-f", "1kHz", "--cs", "1uF", "--esr", "1");
        List<String> names = new ArrayList<>();
        node.fieldNames().forEachRemaining(names::add);
        // issue 2, "zweep convert": the field names are a contract
        assertEquals(List.of("frequency_hz", "r_ohm", "x_ohm", "z_ohm", "theta_deg", "delta_deg", "q", "d", "g_s",
                "b_s", "cs_f", "cp_f", "ls_h", "lp_h", "rs_ohm", "rp_ohm"), names);
        node.properties().forEach(e -> assertTrue(e.getValue().isNumber(), e.getKey()));
    }

    @Test
    void jsonValuesAreSiNumbersMatchingPublishedExamples() throws Exception {
        JsonNode node = json("convert", "-f", "1kHz", "--cs", "1uF", "--esr", "1");
        assertEquals(1000.0, node.get("frequency_hz").asDouble(), 0.0); // the input, in Hz
        assertEquals(1e-6, node.get("cs_f").asDouble(), 1e-21); // the input, in F
        assertEquals(-159.15494, node.get("x_ohm").asDouble(), 1e-5); // computed, as above
        assertEquals(25_331.296, node.get("rp_ohm").asDouble(), 1e-3); // same
        assertEquals(0.9999605231e-6, node.get("cp_f").asDouble(), 1e-16); // same
        assertEquals(-89.6400, node.get("theta_deg").asDouble(), 1e-4); // same
    }

    @ParameterizedTest(name = "{0} gives {1} = {2}")
    @CsvSource(delimiter = '|', value = {
        // args | field | expected | relative tolerance | where the figure comes from (see the class comment)
        "--r 3 --x 4                 | z_ohm     | 5           | 1e-15 | 3 + j4 Ω, computed",
        "--z 5 --theta 53.130102354  | r_ohm     | 3           | 1e-9  | 3 + j4 Ω, computed",
        "--cs 1u --d 0.0062831853    | rp_ohm    | 25331.296   | 1e-7  | Cs = 1 µF and Rs = 1 Ω at 1 kHz, computed",
        "--cp 0.9999605231u --d 0.0062831853 | cs_f | 1e-6     | 1e-9  | the same capacitor, backwards",
        "--ls 10mH --q 6.2831853     | rp_ohm    | 404.78418   | 1e-7  | Ls = 10 mH and Rs = 10 Ω at 1 kHz, computed",
        "--lp 10.25330296mH --q 6.2831853 | ls_h | 10e-3       | 1e-8  | the same inductor, backwards",
        "--cs 100u --esr 5           | theta_deg | -79.3253    | 1e-6  | 5 Ω + 100 µF at 60 Hz: Kuphaldt, Lessons in Electric Circuits, Vol. II, series R-C example, from memory; computed",
        "--cp 10nF --rp 1Meg         | rs_ohm    | 253.23881   | 1e-7  | Cp = 10 nF and Rp = 1 MΩ at 1 kHz, computed",
        "--ls 10m --rs 10            | z_ohm     | 63.6227     | 1e-5  | 10 mH + 10 Ω at 1 kHz, computed",
        "--lp 10.25330296m --rp 404.78418 | rs_ohm | 10        | 1e-7  | the same inductor, parallel to series",
    })
    void everyPairIsAccepted(String args, String field, double expected, double relative, String source)
            throws Exception {
        String frequency = source.contains("60 Hz") ? "60" : "1kHz";
        List<String> all = new ArrayList<>(List.of("convert", "--frequency", frequency));
        all.addAll(List.of(args.trim().split(" +")));
        JsonNode node = json(all.toArray(String[]::new));
        assertEquals(expected, node.get(field).asDouble(), Math.abs(expected) * relative, source);
    }

    @Test
    void iec60062CodesAreAcceptedAsValues() throws Exception {
        JsonNode node = json("convert", "-f", "1k", "--cs", "4u7", "--esr", "R47");
        assertEquals(4.7e-6, node.get("cs_f").asDouble(), 1e-21); // IEC 60062 RKM code, via Wikipedia "RKM code"
        assertEquals(0.47, node.get("rs_ohm").asDouble(), 1e-16); // same
    }

    @Test
    void infiniteValuesAreNullInJson() throws Exception {
        JsonNode node = json("convert", "-f", "1kHz", "--r", "0", "--x", "-1");
        assertTrue(node.get("q").isNull()); // R = 0: Q = |X|/R is infinite (documented choice)
        assertTrue(node.get("rp_ohm").isNull()); // Rp = |Z|²/R infinite
        assertEquals(0.0, node.get("d").asDouble(), 0.0); // D = R/|X| = 0
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        "convert --cs 1u --d 0.01 | zweep: convert needs --frequency, e.g. --frequency 1kHz",
        "convert -f 1kHz | zweep: convert needs one pair of values: --r/--x, --z/--theta, --cs/--d, --cp/--d, "
                + "--ls/--q, --lp/--q, --cs/--esr, --cp/--rp, --ls/--rs or --lp/--rp",
        "convert -f 1kHz --cs 1u | zweep: --cs needs --d or --esr to make a pair",
        "convert -f 1kHz --q 10 | zweep: --q needs --ls or --lp to make a pair",
        "convert -f 1kHz --r 1 --d 0.1 | zweep: --r with --d is not a pair; give one of --r/--x, --z/--theta, "
                + "--cs/--d, --cp/--d, --ls/--q, --lp/--q, --cs/--esr, --cp/--rp, --ls/--rs or --lp/--rp",
        "convert -f 1kHz --r 1 --x 1 --cs 1u --d 0.1 | zweep: give exactly one pair of values, got --r, --x, --cs, --d",
        "convert -f 0 --r 1 --x 1 | zweep: --frequency: \"0\" is not a valid frequency: it must be greater than zero",
        "convert -f -1k --r 1 --x 1 | zweep: --frequency: \"-1k\" is not a valid frequency: it must be greater than zero",
        "convert -f 1kHz --cs 100nH --d 0.01 | zweep: --cs: \"100nH\" has the wrong unit H; expected a capacitance "
                + "in F, e.g. 100 nF or 4n7",
        "convert -f 1kHz --ls -10mH --q 5 | zweep: --ls: \"-10mH\" is not a valid inductance: it must be greater "
                + "than zero",
        "convert -f 1kHz --r abc --x 1 | zweep: --r: \"abc\" is not a number; expected an impedance in Ω, e.g. "
                + "4.7 kΩ, 4k7 or R47",
        "convert -f 1kHz --z 10 --theta 200 | zweep: --theta \"200\" is out of range: θ must be from -180 to 180°",
        "convert -f 1kHz --cs 1u --d -0.1 | zweep: --d: \"-0.1\" is not a valid number: it must not be negative",
    })
    void badInputExitsTwoWithOneLine(String args, String message) {
        Run run = zweep(args.trim().split(" +"));
        assertEquals(ExitCode.USAGE, run.exitCode());
        assertEquals("", run.out());
        assertEquals(message + System.lineSeparator(), run.err());
    }

    @Test
    void emptyValueExitsTwo() {
        Run run = zweep("convert", "-f", "1kHz", "--r", "", "--x", "1");
        assertEquals(ExitCode.USAGE, run.exitCode());
        assertEquals("zweep: --r: empty value; expected an impedance in Ω, e.g. 4.7 kΩ, 4k7 or R47"
                + System.lineSeparator(), run.err());
    }

    @Test
    void unknownOptionExitsTwo() {
        Run run = zweep("convert", "-f", "1kHz", "--bogus", "1");
        assertEquals(ExitCode.USAGE, run.exitCode());
        assertEquals("zweep: unknown option '--bogus'; see 'zweep convert --help'" + System.lineSeparator(), run.err());
    }

    @Test
    void mistypedOptionIsOneLineWithTheNearOption() {
        Run run = zweep("convert", "--frequncy", "1kHz", "--cs", "1n", "--d", "0.1");
        assertEquals(ExitCode.USAGE, run.exitCode());
        assertEquals("zweep: unknown option '--frequncy' (did you mean --frequency?); see 'zweep convert --help'"
                + System.lineSeparator(), run.err());
    }

    @Test
    void mistypedCommandIsOneLineWithTheNearCommand() {
        Run run = zweep("convrt");
        assertEquals(ExitCode.USAGE, run.exitCode());
        assertEquals(1, run.err().lines().count(), run.err());
        assertTrue(run.err().startsWith("zweep: unknown command 'convrt' (did you mean "), run.err());
        assertTrue(run.err().contains("convert"), run.err());
    }

    @Test
    void missingParameterIsOneLine() {
        Run run = zweep("check");
        assertEquals(ExitCode.USAGE, run.exitCode());
        assertEquals("zweep: missing required parameter: 'FILE'; see 'zweep check --help'" + System.lineSeparator(),
                run.err());
    }

    @Test
    void convertIsListedInTopLevelHelp() {
        Run run = zweep("--help");
        assertTrue(run.out().contains("convert"), run.out());
    }
}
