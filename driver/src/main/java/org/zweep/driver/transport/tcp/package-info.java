/**
 * Raw SCPI over TCP ({@code tcp://HOST[:PORT]}, port 5025 by default): a blocking socket with
 * TCP_NODELAY and keep-alive, a separate connect timeout and per-read timeouts.
 */
package org.zweep.driver.transport.tcp;
