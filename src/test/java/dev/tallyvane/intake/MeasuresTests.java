package dev.tallyvane.intake;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;

class MeasuresTests {

    @Test
    void editDistance() {
        // from memory: the textbook example of Levenshtein distance, kitten → sitting takes 3 edits (checkable by hand:
        // k→s, e→i, insert g)
        assertThat(Measures.distance("kitten", "sitting")).isEqualTo(3);
        assertThat(Measures.distance("", "abc")).isEqualTo(3);
        assertThat(Measures.distance("net_sales", "net_sales")).isZero();
        assertThat(Measures.distance("net_salse", "net_sales")).isEqualTo(2);
    }

    @Test
    void theNearestDeclaredMeasureIsSuggested() {
        List<String> declared = List.of("cake_orders", "net_sales", "transactions");
        assertThat(Measures.undeclared("net_sales", declared)).isNull();
        assertThat(Measures.undeclared("transaction", declared)).startsWith("'transaction' is not a measure here; "
                + "did you mean 'transactions'? The measures are cake_orders, net_sales, transactions.");
        assertThat(Measures.undeclared("gross_widgets", List.of("net_sales"))).isEqualTo("'gross_widgets' is not a "
                + "measure here; did you mean 'net_sales'? The owner declares new measures on the Measures page.");
    }
}
