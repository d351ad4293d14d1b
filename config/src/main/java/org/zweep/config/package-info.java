/**
 * Reading YAML configuration files nobody vouches for (sequences, benches, meter dialects):
 * {@link org.zweep.config.BoundedYaml} loads within limits, {@link org.zweep.config.YamlNode} keeps
 * each node's {@code file:line:column}, {@link org.zweep.config.Schema} declares a mapping's keys
 * as data and {@link org.zweep.config.Suggest} offers the near miss for a mistyped one. Generic:
 * no zweep domain types.
 */
package org.zweep.config;
