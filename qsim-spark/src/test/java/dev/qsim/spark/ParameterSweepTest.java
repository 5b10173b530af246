package dev.qsim.spark;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;

import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import dev.qsim.StateVector;
import dev.qsim.observable.Estimate;
import dev.qsim.observable.Expectation;
import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;

/**
 * Parameter sweeps on local Spark against closed forms and the single-machine API.
 *
 * <p>The circuit is {@code ry(θ)} on qubit 0 and {@code rx(φ)} on qubit 1 from {@code |00>}, the
 * observable {@code H = Z0 + 0.5 Z1 + 0.25 X0}. Closed form (Nielsen and Chuang 2010, §4.2: the
 * Bloch vector of {@code ry(θ)|0>} is {@code (sin θ, 0, cos θ)}, of {@code rx(φ)|0>} is
 * {@code (0, -sin φ, cos φ)}): {@code E = cos θ + 0.5 cos φ + 0.25 sin θ},
 * {@code dE/dθ = -sin θ + 0.25 cos θ}, {@code dE/dφ = -0.5 sin φ}.
 */
class ParameterSweepTest {
    private static SparkSession spark;

    private static final Recipe<TunableCircuit> CIRCUIT = () -> TunableCircuit.builder(2)
            .ry(0, "theta").rx(1, "phi").build();
    private static final Recipe<Observable> H = () -> Observable.builder().add(1, "Z0")
            .add(0.5, "Z1").add(0.25, "X0").build();

    @BeforeAll
    static void start() {
        spark = LocalSpark.start();
    }

    @AfterAll
    static void stop() {
        LocalSpark.stop();
    }

    private static double energy(double theta, double phi) {
        return Math.cos(theta) + 0.5 * Math.cos(phi) + 0.25 * Math.sin(theta);
    }

    private static List<Row> collect(Dataset<Row> d) {
        return new ArrayList<>(d.collectAsList());
    }

    @Test
    void exactSweepWithGradientsMatchesTheClosedForm() {
        SweepPoints grid = SweepPoints.grid(List.of(SweepPoints.Axis.parse("theta=0:3:7"),
                SweepPoints.Axis.parse("phi=-1:1:5")));
        Dataset<Row> d = ParameterSweep.of(CIRCUIT, H, grid).withGradient(true)
                .withPartitions(3).run(spark);
        assertEquals(List.of("point", "theta", "phi", "value", "standard_error",
                "gradient_theta", "gradient_phi"), List.of(d.columns()));
        List<Row> rows = collect(d);
        assertEquals(35, rows.size());
        for (int i = 0; i < rows.size(); i++) {
            Row r = rows.get(i);
            assertEquals(i, r.getLong(0));
            double theta = r.getDouble(1);
            double phi = r.getDouble(2);
            // Row-major grid: phi (the last axis) varies fastest.
            assertEquals(0.5 * (i / 5), theta, 1e-15);
            assertEquals(-1 + 0.5 * (i % 5), phi, 1e-15);
            assertEquals(energy(theta, phi), r.getDouble(3), 1e-12);
            assertEquals(0.0, r.getDouble(4));
            assertEquals(-Math.sin(theta) + 0.25 * Math.cos(theta), r.getDouble(5), 1e-12);
            assertEquals(-0.5 * Math.sin(phi), r.getDouble(6), 1e-12);
        }
    }

    @Test
    void sampledSweepIsTheSameForAnyPartitioningAndEqualsTheSingleMachineApi() {
        SweepPoints list = SweepPoints.list(List.of("phi", "theta"), new double[][] {
            {0.1, 0.2}, {0.3, -1.0}, {2.0, 2.5}, {-0.7, 1.1}, {1.5, 0.0}, {0.0, 3.0},
            {0.9, 0.9}, {-2.0, 0.4}, {1.0, -0.5}, {2.2, 1.7}, {0.05, 0.6}});
        ParameterSweep sweep = ParameterSweep.of(CIRCUIT, H, list).withShots(400).withSeed(77);
        List<Row> one = collect(sweep.withPartitions(1).run(spark));
        for (int p : new int[] {2, 4, 7}) {
            assertEquals(one, collect(sweep.withPartitions(p).run(spark)), p + " partitions");
        }
        Observable h = H.make();
        TunableCircuit c = CIRCUIT.make();
        for (int i = 0; i < one.size(); i++) {
            Row r = one.get(i);
            double phi = r.getDouble(1);
            double theta = r.getDouble(2);
            // The single-machine API with the item's seed gives the very same numbers.
            StateVector psi = StateVector.zero(2).apply(c.bind(theta, phi));
            Estimate e = Expectation.sampled(h, psi, 400, ItemSeeds.of(77, i));
            assertEquals(e.value(), r.getDouble(3), 0.0);
            assertEquals(e.standardError(), r.getDouble(4), 0.0);
            // ...and agrees with the closed form within 5 standard errors.
            assertEquals(energy(theta, phi), r.getDouble(3), 5 * r.getDouble(4) + 1e-12);
            assertTrue(r.getDouble(4) > 0);
        }
        assertArrayEquals(new double[] {0.3, -1.0}, new double[] {one.get(1).getDouble(1),
            one.get(1).getDouble(2)});
    }

    @Test
    void parametersThatDoNotMatchThePointsAreRefusedOnTheDriver() {
        SweepPoints wrong = SweepPoints.grid(List.of(SweepPoints.Axis.parse("theta=0:1:3"),
                SweepPoints.Axis.parse("beta=0:1:3")));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> ParameterSweep.of(CIRCUIT, H, wrong).run(spark));
        assertTrue(e.getMessage().contains("[theta, phi]") && e.getMessage().contains("beta"),
                e.getMessage());
        SweepPoints grid = SweepPoints.grid(List.of(SweepPoints.Axis.parse("theta=0:1:3"),
                SweepPoints.Axis.parse("phi=0:1:3")));
        Recipe<Observable> wide = () -> Observable.of(1, "Z5");
        e = assertThrows(IllegalArgumentException.class,
                () -> ParameterSweep.of(CIRCUIT, wide, grid).run(spark));
        assertTrue(e.getMessage().contains("qubit 5"), e.getMessage());
        ParameterSweep sweep = ParameterSweep.of(CIRCUIT, H, grid);
        e = assertThrows(IllegalArgumentException.class, () -> sweep.withShots(1));
        assertTrue(e.getMessage().contains("but were 1"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> sweep.withPartitions(-3));
        assertTrue(e.getMessage().contains("-3"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> sweep.withThreads(0));
        assertTrue(e.getMessage().contains("was 0"), e.getMessage());
    }
}
