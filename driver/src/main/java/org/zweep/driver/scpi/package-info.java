/**
 * The SCPI conversation with a meter over any transport: writes, queries, numbers, lists,
 * arbitrary blocks, the error queue and synchronisation.
 */
package org.zweep.driver.scpi;
