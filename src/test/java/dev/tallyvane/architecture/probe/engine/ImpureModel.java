package dev.tallyvane.architecture.probe.engine;

import java.sql.Connection;
import java.util.List;
import java.util.concurrent.ExecutorService;

/** Probe for ArchitectureTests: what an engine class must never do (storage, threads, parallel streams). */
public class ImpureModel {

    double fit(Connection connection, ExecutorService pool, List<Double> values) {
        return values.parallelStream().mapToDouble(Double::doubleValue).parallel().sum();
    }
}
