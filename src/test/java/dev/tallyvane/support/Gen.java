package dev.tallyvane.support;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.function.BiFunction;
import java.util.function.Function;

/**
 * A seeded generator of test inputs: {@code next(random)} draws one value. Small combinators
 * (choices, ranges, strings, lists, weighted mixes) build the inputs of the fuzz tests; with the
 * same seed a run draws the same inputs, so a failure names the seed and try that reproduce it.
 *
 * <p>How many tries and which seed: {@link #tries()} and {@link #seed()}, from the system
 * properties {@code tallyvane.fuzz.tries} (default 200) and {@code tallyvane.fuzz.seed} (default a
 * fixed number, so the build is repeatable; the harness run sets its own).
 */
@FunctionalInterface
public interface Gen<T> {

    T next(Random random);

    /** Tries per property: {@code -Dtallyvane.fuzz.tries=N}, default 200. */
    static int tries() {
        return Integer.getInteger("tallyvane.fuzz.tries", 200);
    }

    /** The base seed: {@code -Dtallyvane.fuzz.seed=N}, default 20261203. */
    static long seed() {
        return Long.getLong("tallyvane.fuzz.seed", 20261203L);
    }

    default <R> Gen<R> map(Function<? super T, ? extends R> f) {
        return r -> f.apply(next(r));
    }

    default <R> Gen<R> flatMap(Function<? super T, Gen<R>> f) {
        return r -> f.apply(next(r)).next(r);
    }

    /** Lists of this generator's values, of a size drawn from [min, max]. */
    default Gen<List<T>> list(int min, int max) {
        Gen<Integer> size = ints(min, max);
        return r -> {
            int n = size.next(r);
            List<T> out = new ArrayList<>(n);
            for (int i = 0; i < n; i++) {
                out.add(next(r));
            }
            return out;
        };
    }

    static <A, B, R> Gen<R> combine(Gen<A> a, Gen<B> b, BiFunction<? super A, ? super B, ? extends R> f) {
        return r -> f.apply(a.next(r), b.next(r));
    }

    @SafeVarargs
    static <T> Gen<T> of(T... values) {
        List<T> choices = List.copyOf(Arrays.asList(values));
        return r -> choices.get(r.nextInt(choices.size()));
    }

    @SafeVarargs
    static <T> Gen<T> oneOf(Gen<? extends T>... gens) {
        return r -> gens[r.nextInt(gens.length)].next(r);
    }

    /** Integers uniformly in [min, max]. */
    static Gen<Integer> ints(int min, int max) {
        if (max < min) {
            throw new IllegalArgumentException("empty range [" + min + ", " + max + "]");
        }
        return r -> min + (int) (r.nextLong(max - (long) min + 1));
    }

    /** Strings of the given characters, of a length drawn from [min, max]. */
    static Gen<String> strings(String chars, int min, int max) {
        Gen<Integer> length = ints(min, max);
        return r -> {
            int n = length.next(r);
            StringBuilder sb = new StringBuilder(n);
            for (int i = 0; i < n; i++) {
                sb.append(chars.charAt(r.nextInt(chars.length())));
            }
            return sb.toString();
        };
    }

    /** Strings of the characters from {@code first} to {@code last}. */
    static Gen<String> strings(char first, char last, int min, int max) {
        StringBuilder chars = new StringBuilder();
        for (char c = first; c <= last; c++) {
            chars.append(c);
        }
        return strings(chars.toString(), min, max);
    }

    /** One weighted choice of generators. */
    record Weighted<T>(int weight, Gen<? extends T> gen) {
    }

    static <T> Weighted<T> weight(int weight, Gen<? extends T> gen) {
        return new Weighted<>(weight, gen);
    }

    /** Draws from each generator with a probability proportional to its weight. */
    @SafeVarargs
    static <T> Gen<T> frequency(Weighted<T>... choices) {
        int total = Arrays.stream(choices).mapToInt(Weighted::weight).sum();
        return r -> {
            int pick = r.nextInt(total);
            for (Weighted<T> w : choices) {
                pick -= w.weight();
                if (pick < 0) {
                    return w.gen().next(r);
                }
            }
            throw new IllegalStateException("unreachable");
        };
    }

    /** A check of one drawn value. */
    @FunctionalInterface
    interface Check<T> {
        void accept(T value) throws Exception;
    }

    /**
     * Runs {@code check} on {@link #tries()} values, try {@code i} drawn with seed {@code seed() + i}.
     * A failing try is reported with its seed and try number (rerun it with
     * {@code -Dtallyvane.fuzz.seed=<seed> -Dtallyvane.fuzz.tries=1}).
     */
    static <T> void forAll(Gen<T> gen, Check<? super T> check) throws Exception {
        long base = seed();
        for (int i = 0; i < tries(); i++) {
            T value = gen.next(new Random(base + i));
            try {
                check.accept(value);
            } catch (AssertionError | Exception e) {
                AssertionError failed = new AssertionError("failed on try " + i + " (seed " + (base + i)
                        + "; rerun with -Dtallyvane.fuzz.seed=" + (base + i) + " -Dtallyvane.fuzz.tries=1): "
                        + e.getMessage(), e);
                throw failed;
            }
        }
    }
}
