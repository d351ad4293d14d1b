package org.zweep.simulator.scpi;

import java.util.List;

/**
 * One program message unit (IEEE 488.2 §7.3): a header and its data.
 *
 * @param common a common command ({@code *IDN?}); {@code header} then holds its one mnemonic
 * @param rooted the header began with {@code :} and resolves from the root
 * @param header the mnemonics as typed
 * @param query the header ended in {@code ?}
 * @param params the program data elements
 */
record ProgramUnit(boolean common, boolean rooted, List<Mnemonic> header, boolean query, List<Param> params) {
}
