package org.zweep.simulator.scpi;

/**
 * The IEEE 488.2 status structure (§11) with the SCPI-1999 OPERation and QUEStionable register
 * sets (Vol 2 §20) and the error queue. One per instrument, shared by every connection; all
 * methods are synchronized.
 *
 * <p>Transition filters are fixed at their {@code STATus:PRESet} values: an event bit latches on
 * a rising condition bit.
 */
final class StatusModel {
    // IEEE 488.2 §11.5.1: Standard Event Status Register bits
    static final int ESR_OPC = 1;
    static final int ESR_QYE = 1 << 2;
    static final int ESR_DDE = 1 << 3;
    static final int ESR_EXE = 1 << 4;
    static final int ESR_CME = 1 << 5;
    static final int ESR_PON = 1 << 7;
    // IEEE 488.2 §11.2 and SCPI-1999 Vol 2 §20: Status Byte bits
    static final int STB_EAV = 1 << 2;
    static final int STB_QUES = 1 << 3;
    static final int STB_MAV = 1 << 4;
    static final int STB_ESB = 1 << 5;
    static final int STB_MSS = 1 << 6;
    static final int STB_OPER = 1 << 7;
    // SCPI-1999 Vol 2 §20: OPERation bits
    static final int OPER_CALIBRATING = 1;
    static final int OPER_MEASURING = 1 << 4;
    static final int OPER_WAITING_FOR_TRIGGER = 1 << 5;
    /** QUEStionable bit 9 (designer-defined): the last reading overloaded its range. */
    static final int QUES_OVERLOAD = 1 << 9;

    private final ErrorQueue queue;
    private int esr = ESR_PON;
    private int ese;
    private int sre;
    private int operCondition;
    private int operEvent;
    private int operEnable;
    private int quesCondition;
    private int quesEvent;
    private int quesEnable;

    StatusModel(int errorQueueDepth) {
        this.queue = new ErrorQueue(errorQueueDepth);
    }

    /** Queues an error and sets the one ESR bit its class maps to (SCPI-1999 Vol 2 §21.8.9–12). */
    synchronized void report(int code, String text) {
        esr |= esrBitOf(code);
        if (!queue.push(code, text)) {
            esr |= ESR_DDE;
        }
    }

    synchronized void report(ScpiException e) {
        report(e.error().code(), e.getMessage());
    }

    static int esrBitOf(int code) {
        if (code > 0 || (code <= -300 && code > -400)) {
            return ESR_DDE;
        }
        if (code <= -100 && code > -200) {
            return ESR_CME;
        }
        if (code <= -200 && code > -300) {
            return ESR_EXE;
        }
        if (code <= -400 && code > -500) {
            return ESR_QYE;
        }
        if (code <= -500 && code > -600) {
            return ESR_PON;
        }
        if (code <= -600 && code > -700) {
            return 1 << 6;
        }
        if (code <= -700 && code > -800) {
            return 1 << 1;
        }
        if (code <= -800 && code > -900) {
            return ESR_OPC;
        }
        return 0;
    }

    synchronized ErrorQueue.Entry nextError() {
        return queue.next();
    }

    synchronized int errorCount() {
        return queue.count();
    }

    synchronized void setEsrBits(int bits) {
        esr |= bits;
    }

    /** Reads and clears the ESR (IEEE 488.2 §10.12). */
    synchronized int readEsr() {
        int v = esr;
        esr = 0;
        return v;
    }

    synchronized int ese() {
        return ese;
    }

    synchronized void setEse(int v) {
        ese = v & 0xFF;
    }

    synchronized int sre() {
        return sre;
    }

    /** Sets the service request enable mask; bit 6 is ignored (IEEE 488.2 §11.3.2). */
    synchronized void setSre(int v) {
        sre = v & 0xFF & ~STB_MSS;
    }

    /** The status byte with MSS in bit 6 (IEEE 488.2 §10.36, §11.2); clears nothing. */
    synchronized int statusByte(boolean messageAvailable) {
        int stb = 0;
        if (!queue.isEmpty()) {
            stb |= STB_EAV;
        }
        if ((quesEvent & quesEnable) != 0) {
            stb |= STB_QUES;
        }
        if (messageAvailable) {
            stb |= STB_MAV;
        }
        if ((esr & ese) != 0) {
            stb |= STB_ESB;
        }
        if ((operEvent & operEnable) != 0) {
            stb |= STB_OPER;
        }
        if ((stb & sre) != 0) {
            stb |= STB_MSS;
        }
        return stb;
    }

    /** {@code *CLS} (IEEE 488.2 §10.3): event registers and the error queue; enables untouched. */
    synchronized void clear() {
        esr = 0;
        queue.clear();
        operEvent = 0;
        quesEvent = 0;
    }

    /** {@code STATus:PRESet} (SCPI-1999 Vol 2 §20.2): OPERation and QUEStionable enables to 0. */
    synchronized void preset() {
        operEnable = 0;
        quesEnable = 0;
    }

    synchronized void setOperation(int bits, boolean on) {
        int before = operCondition;
        operCondition = on ? operCondition | bits : operCondition & ~bits;
        operEvent |= operCondition & ~before;
    }

    synchronized void setQuestionable(int bits, boolean on) {
        int before = quesCondition;
        quesCondition = on ? quesCondition | bits : quesCondition & ~bits;
        quesEvent |= quesCondition & ~before;
    }

    synchronized int operationCondition() {
        return operCondition;
    }

    /** Reads and clears the OPERation event register (SCPI-1999 Vol 2 §20.1.4). */
    synchronized int readOperationEvent() {
        int v = operEvent;
        operEvent = 0;
        return v;
    }

    synchronized int operationEnable() {
        return operEnable;
    }

    synchronized void setOperationEnable(int v) {
        operEnable = v & 0x7FFF;
    }

    synchronized int questionableCondition() {
        return quesCondition;
    }

    synchronized int readQuestionableEvent() {
        int v = quesEvent;
        quesEvent = 0;
        return v;
    }

    synchronized int questionableEnable() {
        return quesEnable;
    }

    synchronized void setQuestionableEnable(int v) {
        quesEnable = v & 0x7FFF;
    }
}
