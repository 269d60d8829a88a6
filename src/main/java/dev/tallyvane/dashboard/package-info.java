/**
 * The dashboard: the overview of every location (sortable, filterable, paged, with a chain total)
 * and the data behind the location page's charts. Reads what the forecasting and accuracy features
 * write; writes nothing.
 */
package dev.tallyvane.dashboard;
