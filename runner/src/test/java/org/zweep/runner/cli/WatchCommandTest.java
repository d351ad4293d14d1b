package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code zweep watch} prints a run's events for people and ends with the run's verdict as exit code. */
class WatchCommandTest {
    @TempDir
    Path dir;

    @Test
    void followsTheEventsToTheVerdictWithValuesAndASparklinePerStep() throws Exception {
        Path events = dir.resolve("events.jsonl");
        Files.writeString(events, String.join("\n",
                "{\"type\":\"run_started\",\"time_ms\":1,\"name\":\"demo\",\"total\":3,\"done\":0,"
                        + "\"main_parameter\":\"cs_f\",\"main_label\":\"Cs\",\"main_unit\":\"F\"}",
                "{\"type\":\"prompt\",\"time_ms\":2,\"id\":\"0f0f0f0f\",\"text\":\"Insert the part.\"}",
                "{\"type\":\"prompt_answered\",\"time_ms\":3,\"id\":\"0f0f0f0f\",\"by\":\"page\"}",
                "{\"type\":\"step_started\",\"time_ms\":4,\"step\":\"sweep\",\"step_index\":0}",
                "{\"type\":\"point\",\"time_ms\":5,\"done\":1,\"total\":3,\"frequency_hz\":1000.0,\"z_ohm\":1591.5,"
                        + "\"theta_deg\":-89.9,\"cs_f\":1.0E-7}",
                "{\"type\":\"point\",\"time_ms\":6,\"done\":2,\"total\":3,\"frequency_hz\":10000.0,\"z_ohm\":159.15,"
                        + "\"theta_deg\":-89.8,\"cs_f\":1.0E-7}",
                "{\"type\":\"check\",\"time_ms\":7,\"name\":\"capacitance\",\"parameter\":\"cs_f\",\"label\":\"Cs\","
                        + "\"value_text\":\"no value\",\"result\":\"fail\"}",
                "{\"type\":\"finished\",\"time_ms\":8,\"outcome\":\"completed\",\"verdict\":\"fail\",\"measured\":3,"
                        + "\"total\":3}") + "\n");
        StringWriter out = new StringWriter();
        int code = WatchCommand.follow(events, new PrintWriter(out));
        assertEquals(ExitCode.CHECK_FAILED, code);
        List<String> lines = out.toString().lines().toList();
        assertEquals("run demo: 3 points (0 already measured)", lines.get(0));
        assertTrue(lines.contains(">> Insert the part. (answer at the run's terminal or on its live page)"), lines.toString());
        // 1/(2π·1 kHz·100 nF) = 1.5915 kΩ: the values arrive as written and are shown with SI prefixes
        assertTrue(lines.contains("[1/3] 1 kHz  |Z| 1.592 kΩ  θ -89.9°  Cs 100 nF"), lines.toString());
        assertTrue(lines.contains("  |Z| █▁  159 Ω … 1.59 kΩ"), lines.toString());
        assertTrue(lines.contains("check capacitance: Cs = no value: fail"), lines.toString());
        assertEquals("finished: completed, 3 of 3 points, verdict fail", lines.get(lines.size() - 1));
    }

    @Test
    void aConditionalPassEndsWithTheSameExitCodeAsRunAndAnalyze() throws Exception {
        Path events = dir.resolve("events.jsonl");
        Files.writeString(events, String.join("\n",
                "{\"type\":\"run_started\",\"time_ms\":1,\"name\":\"demo\",\"total\":1,\"done\":0}",
                "{\"type\":\"finished\",\"time_ms\":2,\"outcome\":\"completed\",\"verdict\":\"conditional pass\","
                        + "\"measured\":1,\"total\":1}") + "\n");
        // a conditional pass is not a proven pass: zweep run and zweep analyze exit 1 for it, and so does watch
        assertEquals(ExitCode.CHECK_FAILED, WatchCommand.follow(events, new PrintWriter(new StringWriter())));
    }
}
