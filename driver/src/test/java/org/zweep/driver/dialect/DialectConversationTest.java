package org.zweep.driver.dialect;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.Drive;
import org.zweep.driver.meter.ImpedanceRange;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;

/**
 * Replays every conversation file under {@code conversations/}: a dialect drives a scripted fake
 * meter, and every message it sends, every reply and every result is written in the file.
 *
 * <p>File format, one item a line ({@code #} lines are comments):
 * <pre>
 * dialect NAME-OR-FILE        the dialect: a built-in, or a .yaml file beside the conversation
 * call OPERATION [ARGS]       a Meter call; what follows until the next call belongs to it
 * &gt; MESSAGE                   a message the meter must receive next
 * &lt; REPLY                     ...its reply (a query); no reply line means a plain write; several
 *                             reply lines: one line per query (a meter that frames replies so)
 * &lt;# HEX                      ...its reply as an arbitrary block's payload bytes
 * &lt;#; HEX ; HEX ; TEXT        ...its reply as blocks then a text unit, on one line (the last is the text)
 * ! TEXT                      ...the link fails instead (MeterException with TEXT)
 * = RESULT                    the call's result: "R X [±TOL]" or "no-value" per reading,
 *                             "true"/"false", the identity, or "error Class: message"
 * </pre>
 * limits asks the meter's own limits ({@code statedLimits}); its result is
 * {@code FMIN..FMAX VMIN..VMAX IMIN..IMAX BVMIN..BVMAX BIMIN..BIMAX}.
 * fixture takes a state ({@code part open short load secondary-open secondary-shorted}).
 * apply takes {@code frequency= voltage= current= bias-voltage= bias-current= bias=off averaging=
 * aperture= range=auto|OHMS quantity=impedance|ratio}, each changing the previous setting
 * (initially 1 kHz, 1 V, no bias, 1 average, 20 ms, auto range), as does measure-at (apply and
 * measure in one); measure-list takes
 * {@code frequencies=F1,F2,...} at the previous setting, and so does acquire-list after the standard
 * ({@code acquire-list open frequencies=F1,F2,...}).
 */
class DialectConversationTest {
    private static final Clock CLOCK = Clock.fixed(Instant.parse("2024-01-01T00:00:00Z"), ZoneOffset.UTC);

    private record Call(int line, String operation, List<String> args, int exchangesEnd, List<String> results) {
    }

    static Stream<Path> conversations() {
        return TestResources.files("conversations", ".conv");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("conversations")
    void conversationRunsExactlyAsWritten(Path file) throws IOException {
        String name = file.getFileName().toString().replace(".conv", "");
        ScriptedSession session = new ScriptedSession("fake:" + name);
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        String dialectName = null;
        List<Call> calls = new ArrayList<>();
        int exchanges = 0;
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i);
            int n = i + 1;
            if (line.isBlank() || line.startsWith("#")) {
                continue;
            }
            if (line.startsWith("dialect ")) {
                dialectName = line.substring(8).trim();
            } else if (line.startsWith("call ")) {
                List<String> words = Arrays.asList(line.substring(5).trim().split("\\s+"));
                calls.add(new Call(n, words.get(0), words.subList(1, words.size()), -1, new ArrayList<>()));
            } else if (line.startsWith("> ")) {
                String message = line.substring(2);
                String following = i + 1 < lines.size() ? lines.get(i + 1) : "";
                if (following.startsWith("<#; ")) {
                    session.expectBlocksQuery(n, message, following.substring(4));
                    i++;
                } else if (following.startsWith("<# ")) {
                    session.expectBlockQuery(n, message, following.substring(3));
                    i++;
                } else if (following.startsWith("< ")) {
                    List<String> replies = new ArrayList<>();
                    while (i + 1 < lines.size() && lines.get(i + 1).startsWith("< ")) {
                        replies.add(lines.get(++i).substring(2));
                    }
                    session.expectQuery(n, message, replies);
                } else if (following.startsWith("! ")) {
                    session.expectFailure(n, message, following.substring(2));
                    i++;
                } else {
                    session.expectWrite(n, message);
                }
                exchanges++;
                replaceLast(calls, exchanges, n);
            } else if (line.startsWith("= ")) {
                if (calls.isEmpty()) {
                    fail(file + ":" + n + ": a result before any call");
                }
                calls.get(calls.size() - 1).results.add(line.substring(2).trim());
            } else {
                fail(file + ":" + n + ": cannot read '" + line + "'");
            }
        }
        assertNotNull(dialectName, file + ": no 'dialect' line");
        Dialect dialect = dialectName.endsWith(".yaml")
                ? Dialect.load(file.resolveSibling(dialectName).toString()) : Dialect.load(dialectName);
        DialectMeter meter = new DialectMeter(session, dialect, CLOCK);

        MeasurementSetting setting = MeasurementSetting.at(1000);
        int consumed = 0;
        for (Call call : calls) {
            int end = call.exchangesEnd < 0 ? consumed : call.exchangesEnd;
            Object result = null;
            RuntimeException thrown = null;
            try {
                if (call.operation.equals("apply") || call.operation.equals("measure-at")) {
                    setting = changed(setting, call.args);
                }
                result = run(meter, call, setting);
            } catch (RuntimeException e) {
                thrown = e;
            }
            String where = file.getFileName() + ":" + call.line + " (call " + call.operation + ")";
            assertEquals(end, session.position(), where + ": number of exchanges consumed; meter received "
                    + session.received());
            consumed = end;
            check(where, call.results, result, thrown);
            if (call.operation.equals("shutdown")) {
                assertTrue(session.closed(), where + ": shutdown must close the session");
            }
        }
        assertEquals(exchanges, session.position(), file + ": every scripted exchange must be used");
    }

    private static void replaceLast(List<Call> calls, int exchanges, int line) {
        if (calls.isEmpty()) {
            fail("line " + line + ": an exchange before any call");
        }
        Call c = calls.remove(calls.size() - 1);
        calls.add(new Call(c.line, c.operation, c.args, exchanges, c.results));
    }

    private static Object run(DialectMeter meter, Call call, MeasurementSetting setting) {
        switch (call.operation) {
            case "identify":
                return meter.identify();
            case "reset":
                meter.reset();
                return null;
            case "apply":
                meter.apply(setting);
                return null;
            case "measure":
                return meter.measure();
            case "measure-at":
                return meter.measureAt(setting);
            case "measure-list":
                String freqs = call.args.get(0).substring("frequencies=".length());
                return meter.measureList(Arrays.stream(freqs.split(","))
                        .map(f -> setting.withFrequencyHz(Double.parseDouble(f))).toList());
            case "acquire":
                meter.acquireCorrection(CorrectionStandard.valueOf(call.args.get(0).toUpperCase()));
                return null;
            case "acquire-list":
                String at = call.args.get(1).substring("frequencies=".length());
                meter.acquireCorrection(CorrectionStandard.valueOf(call.args.get(0).toUpperCase()), Arrays.stream(
                        at.split(",")).map(f -> setting.withFrequencyHz(Double.parseDouble(f))).toList());
                return null;
            case "load":
                meter.setLoadStandard(new Impedance(setting.frequencyHz(), Double.parseDouble(call.args.get(0)),
                        Double.parseDouble(call.args.get(1))));
                return null;
            case "correction":
                meter.setCorrectionEnabled(call.args.get(0).equals("on"));
                return null;
            case "bias-off":
                meter.biasOff();
                return null;
            case "shutdown":
                return meter.safeShutdown();
            case "limits":
                org.zweep.driver.meter.MeterCapabilities c = meter.statedLimits();
                return Stream.of(c.frequencyHz(), c.voltageLevelVrms(), c.currentLevelArms(), c.biasVoltageV(),
                        c.biasCurrentA()).map(v -> v.min() + ".." + v.max())
                        .collect(java.util.stream.Collectors.joining(" "));
            case "fixture":
                meter.fixture().orElseThrow().hold(org.zweep.driver.meter.FixtureState.valueOf(
                        call.args.get(0).toUpperCase(java.util.Locale.ROOT).replace('-', '_')));
                return null;
            default:
                throw new AssertionError("unknown call " + call.operation + " at line " + call.line);
        }
    }

    private static MeasurementSetting changed(MeasurementSetting s, List<String> args) {
        for (String a : args) {
            String[] kv = a.split("=", 2);
            String v = kv[1];
            s = switch (kv[0]) {
                case "frequency" -> s.withFrequencyHz(Double.parseDouble(v));
                case "voltage" -> s.withDrive(Drive.voltage(Double.parseDouble(v)));
                case "current" -> s.withDrive(Drive.current(Double.parseDouble(v)));
                case "bias-voltage" -> s.withBias(Bias.voltage(Double.parseDouble(v)));
                case "bias-current" -> s.withBias(Bias.current(Double.parseDouble(v)));
                case "bias" -> s.withBias(Bias.OFF);
                case "averaging" -> s.withAveragingCount(Integer.parseInt(v));
                case "aperture" -> s.withIntegrationTimeS(Double.parseDouble(v));
                case "range" -> s.withRange(v.equals("auto") ? ImpedanceRange.AUTO
                        : ImpedanceRange.hold(Double.parseDouble(v)));
                case "quantity" -> s.withQuantity(v.equals("ratio") ? MeasuredQuantity.VOLTAGE_RATIO
                        : MeasuredQuantity.IMPEDANCE);
                default -> throw new AssertionError("unknown apply argument " + a);
            };
        }
        return s;
    }

    private static void check(String where, List<String> expected, Object result, RuntimeException thrown) {
        if (!expected.isEmpty() && expected.get(0).startsWith("error ")) {
            assertNotNull(thrown, where + ": expected " + expected.get(0) + " but nothing was thrown");
            assertEquals(expected.get(0).substring(6), thrown.getClass().getSimpleName() + ": " + thrown.getMessage(),
                    where);
            return;
        }
        if (thrown != null) {
            throw new AssertionError(where + ": unexpected failure", thrown);
        }
        List<String> actual = new ArrayList<>();
        if (result instanceof Reading r) {
            checkReadings(where, expected, List.of(r));
            return;
        }
        if (result instanceof List<?> list) {
            checkReadings(where, expected, list.stream().map(Reading.class::cast).toList());
            return;
        }
        if (result != null) {
            actual.add(result.toString());
        }
        assertEquals(expected, actual, where + ": result");
    }

    private static void checkReadings(String where, List<String> expected, List<Reading> readings) {
        assertEquals(expected.size(), readings.size(), where + ": number of readings");
        for (int i = 0; i < readings.size(); i++) {
            Reading r = readings.get(i);
            String e = expected.get(i);
            String at = where + ", reading " + (i + 1);
            if (e.equals("no-value")) {
                assertEquals(ReadingStatus.NO_VALUE, r.status(), at);
                continue;
            }
            String[] w = e.split("\\s+");
            double tol = w.length > 2 ? Double.parseDouble(w[2].replace("±", "")) : 0.0;
            assertEquals(ReadingStatus.OK, r.status(), at);
            assertEquals(Double.parseDouble(w[0]), r.real(), tol, at + " real part");
            assertEquals(Double.parseDouble(w[1]), r.imaginary(), tol, at + " imaginary part");
            assertEquals(CLOCK.instant(), r.timestamp(), at + " timestamp");
        }
    }
}
