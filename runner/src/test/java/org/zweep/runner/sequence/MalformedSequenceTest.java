package org.zweep.runner.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.zweep.driver.InvalidInputException;

/**
 * Sequences that must be refused, each with the exact {@code line:column: message} the user sees.
 * Lines and columns are 1-based and point at the offending node (for a missing key: the mapping
 * that lacks it). Expected positions were counted by hand in the text blocks.
 */
class MalformedSequenceTest {
    @TempDir
    Path dir;

    @BeforeEach
    void bench() throws IOException {
        Files.writeString(dir.resolve("b.bench.yaml"), "# placeholder: the loader only checks that the file exists\n");
    }

    /** Lines 1–4 of every case that does not change them. */
    static final String HEAD = """
            format: zweep-sequence/1
            meter: {bench: b.bench.yaml}
            safety: {max_bias_voltage: 25 V, max_level_voltage: 1 V}
            part: {kind: capacitor, nominal: 100 nF, tolerance: K}
            """;

    /** Lines 5–8: one valid step. */
    static final String STEP = """
            steps:
              - name: sweep
                frequency: [1 kHz, 10 kHz]
                level: 1 V
            """;

    /** Lines 5–9: one valid step that sweeps bias. */
    static final String BIAS_STEP = STEP + "    bias: [0 V, 5 V]\n";

    static Stream<Arguments> cases() {
        return Stream.of(
                Arguments.of("unknown top-level key with a suggestion", HEAD + STEP + "chekcs: []\n",
                        "9:1: unknown key 'chekcs' in the sequence (did you mean 'checks'?); expected one of: format, "
                                + "name, description, meter, safety, fixture, part, steps, checks, decision_rule"),
                Arguments.of("missing format names the document start", """
                        meter: {bench: b.bench.yaml}
                        """, "1:1: missing key 'format' in the sequence"),
                Arguments.of("unsupported format version", "format: zweep-sequence/2\n",
                        "1:9: unsupported format 'zweep-sequence/2': expected zweep-sequence/1"),
                Arguments.of("meter without address or bench", """
                        format: zweep-sequence/1
                        meter: {dialect: standard}
                        """, "2:8: missing key 'address' or 'bench' in meter"),
                Arguments.of("meter with both address and bench", """
                        format: zweep-sequence/1
                        meter: {address: "tcp://127.0.0.1:5025", bench: b.bench.yaml}
                        """, "2:49: give either address or bench, not both"),
                Arguments.of("safety limit in the wrong unit", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {max_bias_voltage: 25 A}
                        """, "3:28: \"25 A\" has the wrong unit A; expected a voltage in V, e.g. 10 mV or -2 V"),
                Arguments.of("negative safety limit", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {max_level_current: -1 mA}
                        """, "3:29: \"-1 mA\" is not a valid current: it must not be negative"),
                Arguments.of("safety given as a list", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: [25 V]
                        """, "3:9: expected safety (a mapping), got a list"),
                Arguments.of("misspelt part kind", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        part: {kind: capacitr, nominal: 100 nF}
                        """, "4:14: expected part kind capacitor, inductor, resistor or transformer, got 'capacitr' "
                                + "(did you mean 'capacitor'?)"),
                Arguments.of("capacitor nominal in henries", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        part: {kind: capacitor, nominal: 100 nH}
                        """, "4:34: \"100 nH\" has the wrong unit H; expected a capacitance in F, e.g. 100 nF or 4n7"),
                Arguments.of("unknown tolerance letter", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        part: {kind: resistor, nominal: 10 kohm, tolerance: X}
                        """, "4:53: unknown tolerance letter 'X': expected one of E L P W B C D F G H J K M N (IEC 60062) "
                                + "or a percentage such as ±10 %"),
                Arguments.of("turns ratio on a capacitor", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        part: {kind: capacitor, nominal: 1 nF, turns_ratio: 4}
                        """, "4:53: turns_ratio is only for a transformer"),
                Arguments.of("empty list of steps", HEAD + "steps: []\n", "5:8: empty list: expected at least one step"),
                Arguments.of("steps given as a mapping", HEAD + "steps: {name: sweep}\n",
                        "5:8: expected a list of steps, got a mapping"),
                Arguments.of("step without frequency names the step's mapping", HEAD + """
                        steps:
                          - name: sweep
                            level: 1 V
                        """, "6:5: missing key 'frequency' in step 'sweep'"),
                Arguments.of("misspelt step key with a suggestion", HEAD + """
                        steps:
                          - name: sweep
                            frequncy: 1 kHz
                            level: 1 V
                        """, "7:5: unknown key 'frequncy' in step 'sweep' (did you mean 'frequency'?); expected one "
                                + "of: name, prompt, quantity, wiring, frequency, level, bias, order, averaging, "
                                + "integration, repeats, delay, range, derating"),
                Arguments.of("frequency in volts", HEAD + """
                        steps:
                          - name: sweep
                            frequency: 1 kV
                            level: 1 V
                        """, "7:16: \"1 kV\" has the wrong unit V; expected a frequency in Hz, e.g. 1 kHz or 1.5k"),
                Arguments.of("drive level without a unit", HEAD + """
                        steps:
                          - name: sweep
                            frequency: 1000
                            level: 1
                        """, "8:12: expected a drive level in V or A, got '1'"),
                Arguments.of("empty frequency list", HEAD + """
                        steps:
                          - name: sweep
                            frequency: []
                            level: 1 V
                        """, "7:16: empty list: expected at least one value (a frequency)"),
                Arguments.of("sweep stop below start", HEAD + """
                        steps:
                          - name: sweep
                            frequency: {start: 10 kHz, stop: 100 Hz, points: 5}
                            level: 1 V
                        """, "7:38: stop 100 Hz is below start 10 kHz"),
                Arguments.of("too many points in a sweep", HEAD + """
                        steps:
                          - name: sweep
                            frequency: {start: 1 Hz, stop: 1 MHz, points: 200000}
                            level: 1 V
                        """, "7:51: too many points: 200000 (at most 100000)"),
                Arguments.of("both points and per_decade", HEAD + """
                        steps:
                          - name: sweep
                            frequency: {start: 1 Hz, stop: 1 MHz, points: 7, per_decade: 10}
                            level: 1 V
                        """, "7:66: give either points or per_decade, not both"),
                Arguments.of("sweep without points", HEAD + """
                        steps:
                          - name: sweep
                            frequency: {start: 1 Hz, stop: 1 MHz}
                            level: 1 V
                        """, "7:16: missing key 'points' in a frequency sweep"),
                Arguments.of("zero frequency", HEAD + """
                        steps:
                          - name: sweep
                            frequency: [0 Hz, 1 kHz]
                            level: 1 V
                        """, "7:17: \"0 Hz\" is not a valid frequency: it must be greater than zero"),
                Arguments.of("levels in mixed units", HEAD + """
                        steps:
                          - name: sweep
                            frequency: 1 kHz
                            level: [1 V, 10 mA]
                        """, "8:18: expected a drive level in V, got '10 mA'"),
                Arguments.of("drive level above the safety limit names the step", HEAD + """
                        steps:
                          - name: sweep
                            frequency: 1 kHz
                            level: [0.5 V, 2 V]
                        """, "8:12: step 'sweep': drive level 2 V rms exceeds safety max_level_voltage 1 V"),
                Arguments.of("bias above the safety limit names the step", HEAD + """
                        steps:
                          - name: derating
                            frequency: 1 kHz
                            level: 1 V
                            bias: {start: 0 V, stop: 30 V, points: 4}
                        """, "9:11: step 'derating': DC bias 30 V exceeds safety max_bias_voltage 25 V"),
                Arguments.of("current bias where the limit is left at zero", HEAD + """
                        steps:
                          - name: sweep
                            frequency: 1 kHz
                            level: 1 V
                            bias: 500 mA
                        """, "9:11: step 'sweep': DC bias 500 mA exceeds safety max_bias_current 0 A"),
                Arguments.of("ramp rate in the other source's unit", HEAD + """
                        steps:
                          - name: sweep
                            frequency: 1 kHz
                            level: 1 V
                            bias: {values: [0 V, 5 V], ramp: 1 A/s}
                        """, "9:38: expected a ramp rate in V/s, got '1 A/s'"),
                Arguments.of("bias with values and start", HEAD + """
                        steps:
                          - name: sweep
                            frequency: 1 kHz
                            level: 1 V
                            bias: {values: [0 V], start: 0 V}
                        """, "9:34: give either values or start/stop, not both"),
                Arguments.of("duplicate step name", HEAD + STEP + """
                          - name: sweep
                            frequency: 1 kHz
                            level: 1 V
                        """, "9:11: duplicate step name 'sweep' (first at " + "%s:6:11)"),
                Arguments.of("averaging not a number", HEAD + STEP + "    averaging: many\n",
                        "9:16: expected an averaging count (a whole number), got 'many'"),
                Arguments.of("zero repeats", HEAD + STEP + "    repeats: 0\n",
                        "9:14: expected a repeat count of at least 1, got 0"),
                Arguments.of("unknown axis in order", HEAD + STEP + "    order: [bias, frequncy]\n",
                        "9:19: expected axis bias, repeat, level or frequency, got 'frequncy' "
                                + "(did you mean 'frequency'?)"),
                Arguments.of("empty value", HEAD + STEP + "    delay:\n", "9:5: 'delay' has no value"),
                Arguments.of("duplicate key", HEAD + STEP + "    level: 2 V\n", "9:5: duplicate key 'level' in step 'sweep'"),
                Arguments.of("voltage ratio on a capacitor", HEAD + STEP + "    quantity: voltage_ratio\n",
                        "9:15: quantity voltage_ratio needs part kind transformer"),
                Arguments.of("transformer step without wiring", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {max_level_voltage: 1 V}
                        part: {kind: transformer, nominal: 10 mH, turns_ratio: "4:1"}
                        steps:
                          - name: primary
                            frequency: 1 kHz
                            level: 1 V
                        """, "6:5: missing key 'wiring' in step 'primary' (secondary_open or secondary_shorted)"),
                Arguments.of("check naming an unknown step", HEAD + STEP + """
                        checks:
                          - {name: c, step: swep, parameter: cs_f, at: 1 kHz, within: tolerance}
                        """, "10:21: unknown step 'swep' (did you mean 'sweep'?); steps are: sweep"),
                Arguments.of("check naming an unknown parameter", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: ls_hh, at: 1 kHz, max: 1 H}
                        """, "10:39: unknown parameter 'ls_hh' (did you mean 'ls_h'?); expected one of: r_ohm, x_ohm, "
                                + "z_ohm, theta_deg, delta_deg, q, d, g_s, b_s, cs_f, cp_f, ls_h, lp_h, rs_ohm, rp_ohm, "
                                + "ratio, srf_hz, saturation, c_f, esl_h, esr_ohm"),
                Arguments.of("a fitted value checked at one frequency", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: c_f, at: 1 kHz, within: tolerance}
                        """, "10:48: c_f is a whole-sweep figure: remove 'at'"),
                Arguments.of("an inductor's fitted value on a capacitor", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: l_h, min: 1 uH}
                        """, "10:39: unknown parameter 'l_h' (did you mean 'ls_h'?); expected one of: r_ohm, x_ohm, "
                                + "z_ohm, theta_deg, delta_deg, q, d, g_s, b_s, cs_f, cp_f, ls_h, lp_h, rs_ohm, rp_ohm, "
                                + "ratio, srf_hz, saturation, c_f, esl_h, esr_ohm"),
                Arguments.of("check at a frequency not in the sweep", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: d, at: 1.5 kHz, max: 0.025}
                        """, "10:46: 1.5 kHz is not a frequency of step 'sweep' (nearest: 1 kHz)"),
                Arguments.of("check limit in the wrong unit", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: cs_f, at: 1 kHz, min: 90 nH}
                        """, "10:61: \"90 nH\" has the wrong unit H; expected a capacitance in F, e.g. 100 nF or 4n7"),
                Arguments.of("check of D with a unit", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: d, at: 1 kHz, max: 0.025 V}
                        """, "10:58: \"0.025 V\" has the wrong unit V; expected a number, e.g. 0.01, 1e-3 or 1%"),
                Arguments.of("check with an unknown decision rule", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: d, at: 1 kHz, max: 0.025, rule: strict}
                        """, "10:71: unknown decision rule \"strict\": use simple, guarded or probability P"
                                + " (e.g. probability 0.95)"),
                Arguments.of("sequence decision rule with a probability below one half", HEAD + STEP
                        + "decision_rule: probability 0.3\n",
                        "9:16: a minimum probability of conformance must be above 0.5 and below 1, got 0.3"),
                Arguments.of("check max below min", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: q, at: 1 kHz, min: 50, max: 10}
                        """, "10:67: max 10 is below min 50"),
                Arguments.of("check without any limit", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: q, at: 1 kHz}
                        """, "10:5: missing key 'min', 'max' or 'within' in check 'c'"),
                Arguments.of("srf check with a frequency", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: srf_hz, at: 1 kHz, min: 10 MHz}
                        """, "10:51: srf_hz is a whole-sweep figure: remove 'at'"),
                Arguments.of("check bias not among the step's bias values", HEAD + BIAS_STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: cs_f, at: 1 kHz, bias: 3 V, min: 1 nF}
                        """, "11:62: 3 V is not a bias value of step 'sweep' (nearest: 5 V)"),
                Arguments.of("check bias on a step without bias", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: cs_f, at: 1 kHz, bias: 0 V, min: 1 nF}
                        """, "10:62: step 'sweep' applies no bias: remove 'bias'"),
                Arguments.of("check level not among the step's levels", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: cs_f, at: 1 kHz, level: 2 V, min: 1 nF}
                        """, "10:63: 2 V is not a drive level of step 'sweep' (nearest: 1 V)"),
                Arguments.of("saturation on a step without a bias sweep", HEAD + STEP + """
                        checks:
                          - {name: s, step: sweep, parameter: saturation, at: 1 kHz, drop: 20 %, min: 1 V}
                        """, "10:39: saturation needs a bias sweep; step 'sweep' has no bias"),
                Arguments.of("saturation without drop", HEAD + BIAS_STEP + """
                        checks:
                          - {name: s, step: sweep, parameter: saturation, at: 1 kHz, min: 1 V}
                        """, "11:5: missing key 'drop' in check 's' (the fall in value, such as 30 %, at which the bias is read)"),
                Arguments.of("saturation drop that is not a whole percentage", HEAD + BIAS_STEP + """
                        checks:
                          - {name: s, step: sweep, parameter: saturation, at: 1 kHz, drop: 12.5 %, min: 1 V}
                        """, "11:68: expected a drop as a whole percentage such as 30 %, got '12.5 %'"),
                Arguments.of("saturation with a bias selection", HEAD + BIAS_STEP + """
                        checks:
                          - {name: s, step: sweep, parameter: saturation, at: 1 kHz, bias: 0 V, drop: 20 %, min: 1 V}
                        """, "11:68: saturation finds the bias itself: remove 'bias'"),
                Arguments.of("drop on a point check", HEAD + BIAS_STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: cs_f, at: 1 kHz, drop: 20 %, min: 1 nF}
                        """, "11:62: drop is only for parameter saturation"),
                Arguments.of("srf_hz with a bias selection", HEAD + BIAS_STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: srf_hz, bias: 0 V, min: 10 MHz}
                        """, "11:53: srf_hz is found on the step's first fitted sweep: remove 'bias'"),
                Arguments.of("derating on a step without a bias sweep", HEAD + STEP + """
                            derating: [10 %]
                        """, "9:15: derating needs a bias sweep; step 'sweep' has no bias"),
                Arguments.of("derating drop given twice", HEAD + BIAS_STEP + """
                            derating: [10 %, 20 %, 10 %]
                        """, "10:28: drop '10 %' given twice"),

                Arguments.of("within tolerance of a part without tolerance", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {max_level_voltage: 1 V}
                        part: {kind: capacitor, nominal: 100 nF}
                        """ + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: cs_f, at: 1 kHz, within: tolerance}
                        """, "10:64: within tolerance needs part tolerance"),
                Arguments.of("within tolerance on a parameter of another unit", HEAD + STEP + """
                        checks:
                          - {name: c, step: sweep, parameter: ls_h, at: 1 kHz, within: tolerance}
                        """, "10:64: within compares with the nominal 100 nF: for a capacitor use cs_f, cp_f, not 'ls_h'"),
                Arguments.of("ratio check on an impedance step", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {max_level_voltage: 1 V}
                        part: {kind: transformer, nominal: 10 mH, turns_ratio: 4}
                        steps:
                          - {name: sweep, wiring: secondary_open, frequency: 1 kHz, level: 1 V}
                        checks:
                          - {name: c, step: sweep, parameter: ratio, at: 1 kHz, within: 2 %}
                        """, "8:39: parameter 'ratio' needs a voltage_ratio step; step 'sweep' measures impedance"),
                Arguments.of("load standard without its value", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        fixture: {terminals: 4, compensation: host, standards: [open, short, load]}
                        """, "4:10: missing key 'load' in fixture (the load standard's known value)"),
                Arguments.of("load standard's coverage factor without an uncertainty", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        fixture: {terminals: 4, compensation: host, standards: [open, short, load], load: {r: 100 ohm, k: 2}}
                        """, "4:99: k given but no u_r or u_x to divide by it"),
                Arguments.of("negative load standard uncertainty", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        fixture: {terminals: 4, compensation: host, standards: [open, short, load], load: {r: 100 ohm, u_r: -1 ohm}}
                        """, "4:101: \"-1 ohm\" is not a valid impedance: it must not be negative"),
                Arguments.of("three terminals", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        fixture: {terminals: 3}
                        """, "4:22: expected terminals 2 or 4, got '3'"),
                Arguments.of("reuse age in words", """
                        format: zweep-sequence/1
                        meter: {bench: b.bench.yaml}
                        safety: {}
                        fixture: {terminals: 4, compensation: host, reuse: 2 hours}
                        """, "4:52: expected an age in s, min, h or d (e.g. 90 s, 30 min, 2h), got '2 hours'"),
                Arguments.of("sequence name with a space", """
                        format: zweep-sequence/1
                        name: my sequence
                        """, "2:7: expected a sequence name of letters, digits, '.', '_' or '-', got 'my sequence'"),
                Arguments.of("unclosed flow list is a YAML syntax error", HEAD + """
                        steps:
                          - name: sweep
                            frequency: [1 kHz, 10 kHz
                            level: 1 V
                        """, "8:10: YAML syntax: expected ',' or ']', but got : (while parsing a flow sequence at line 7, column 16)"));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void isRefusedWithLineColumnAndMessage(String what, String text, String expected) {
        Path source = dir.resolve("s.yaml");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> SequenceLoader.parse(text, source));
        assertEquals(source + ":" + expected.replace("%s", source.toString()), e.getMessage());
    }
}
