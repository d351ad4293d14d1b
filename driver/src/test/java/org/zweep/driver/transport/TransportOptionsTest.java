package org.zweep.driver.transport;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.time.Duration;
import org.junit.jupiter.api.Test;

class TransportOptionsTest {

    @Test
    void defaultsSpinBrieflyForAReplyAndNeverWaitForEver() {
        assertEquals(Duration.ofNanos(50_000), TransportOptions.DEFAULT.replySpin());
        assertEquals(Duration.ofSeconds(5), TransportOptions.DEFAULT.connectTimeout());
        assertEquals(Duration.ZERO, TransportOptions.DEFAULT.withReplySpin(Duration.ZERO).replySpin());
    }

    @Test
    void aNegativeSpinOrANonPositiveTimeoutIsRefused() {
        assertThrows(IllegalArgumentException.class,
                () -> TransportOptions.DEFAULT.withReplySpin(Duration.ofNanos(-1)));
        assertThrows(IllegalArgumentException.class, () -> TransportOptions.DEFAULT.withConnectTimeout(Duration.ZERO));
    }
}
