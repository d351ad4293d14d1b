package org.zweep.runner.live;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class EventTailTest {
    @TempDir
    Path dir;

    private void append(Path f, String text) throws Exception {
        Files.writeString(f, text, StandardCharsets.UTF_8, StandardOpenOption.CREATE, StandardOpenOption.APPEND);
    }

    private static List<String> texts(List<EventTail.Line> lines) {
        return lines.stream().map(EventTail.Line::text).toList();
    }

    @Test
    void givesEachCompleteLineOnceAndHoldsATornOneUntilItsLineBreak() throws Exception {
        Path f = dir.resolve("events.jsonl");
        EventTail tail = new EventTail(f, 0);
        assertEquals(List.of(), tail.read());
        append(f, "{\"a\":1}\n{\"b\":");
        List<EventTail.Line> first = tail.read();
        assertEquals(List.of("{\"a\":1}"), texts(first));
        assertEquals(8, first.get(0).end());
        assertEquals(List.of(), tail.read());
        append(f, "2}\n");
        assertEquals(List.of("{\"b\":2}"), texts(tail.read()));
    }

    @Test
    void fromTheEndSeesOnlyWhatIsAppendedAndAShorterFileStartsAgain() throws Exception {
        Path f = dir.resolve("events.jsonl");
        append(f, "old\n");
        EventTail tail = EventTail.fromEnd(f);
        append(f, "new\n");
        assertEquals(List.of("new"), texts(tail.read()));
        Files.writeString(f, "x\n");
        assertEquals(List.of("x"), texts(tail.read()));
    }
}
