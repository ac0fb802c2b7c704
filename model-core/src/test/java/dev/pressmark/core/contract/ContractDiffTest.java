package dev.pressmark.core.contract;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.Combinators;
import org.junit.jupiter.api.Test;

class ContractDiffTest {

    private static Contract contract(List<String> fields, List<String> labels) {
        return new Contract(new TreeSet<>(fields), new TreeSet<>(labels));
    }

    @Test
    void a_removed_label_is_breaking_and_raises_the_major() {
        ContractDiff diff = ContractDiff.between(contract(List.of("title"), List.of("ham", "spam", "eggs")), contract(List.of("title"), List.of("ham", "spam")));
        assertThat(diff.removedLabels()).containsExactly("eggs");
        assertThat(diff.breaking()).isTrue();
        assertThat(diff.next(new SemanticVersion(1, 3, 0))).isEqualTo(new SemanticVersion(2, 0, 0));
        assertThat(diff.describe()).isEqualTo("removed labels [eggs]");
    }

    @Test
    void an_added_field_is_breaking_because_predict_requires_every_field() {
        ContractDiff diff = ContractDiff.between(contract(List.of("title"), List.of("a", "b")), contract(List.of("title", "body"), List.of("a", "b")));
        assertThat(diff.addedFields()).containsExactly("body");
        assertThat(diff.breaking()).isTrue();
        assertThat(diff.describe()).isEqualTo("added fields [body] (breaking: predict requires every input field)");
    }

    @Test
    void an_added_label_is_not_breaking_and_raises_the_minor() {
        ContractDiff diff = ContractDiff.between(contract(List.of("title"), List.of("a", "b")), contract(List.of("title"), List.of("a", "b", "c")));
        assertThat(diff.addedLabels()).containsExactly("c");
        assertThat(diff.breaking()).isFalse();
        assertThat(diff.next(new SemanticVersion(2, 0, 0))).isEqualTo(new SemanticVersion(2, 1, 0));
    }

    @Test
    void a_reordered_contract_is_no_change_and_keeps_the_version() {
        ContractDiff diff = ContractDiff.between(contract(List.of("a", "b"), List.of("x", "y")), contract(List.of("b", "a"), List.of("y", "x")));
        assertThat(diff.isEmpty()).isTrue();
        assertThat(diff.next(new SemanticVersion(3, 1, 0))).isEqualTo(new SemanticVersion(3, 1, 0));
    }

    @Test
    void a_record_survives_its_json() {
        ContractRecord record = ContractRecord.against("v1", contract(List.of("title"), List.of("a", "b")), SemanticVersion.FIRST,
                contract(List.of("title"), List.of("a")));
        assertThat(record.version()).isEqualTo(new SemanticVersion(2, 0, 0));
        assertThat(ContractRecord.parse(record.toJson())).isEqualTo(record);
        assertThat(record.toJson()).isEqualTo("{\"version\":\"2.0.0\",\"against\":\"v1\",\"diff\":{\"added_fields\":[],\"removed_fields\":[],"
                + "\"added_labels\":[],\"removed_labels\":[\"b\"],\"breaking\":true}}");
        assertThat(ContractRecord.parse(ContractRecord.first().toJson())).isEqualTo(new ContractRecord(SemanticVersion.FIRST, Optional.empty(),
                ContractDiff.NONE));
    }

    @Test
    void versions_order_as_semantic_versioning_says() {
        // Semantic Versioning 2.0.0, item 11, example: 1.0.0 < 2.0.0 < 2.1.0 < 2.1.1
        List<SemanticVersion> ordered = List.of(SemanticVersion.parse("1.0.0"), SemanticVersion.parse("2.0.0"), SemanticVersion.parse("2.1.0"),
                SemanticVersion.parse("2.1.1"));
        for (int i = 1; i < ordered.size(); i++) {
            assertThat(ordered.get(i - 1)).isLessThan(ordered.get(i));
        }
        assertThat(SemanticVersion.parse("10.20.30")).hasToString("10.20.30");
    }

    // ---- properties ----

    @Provide
    Arbitrary<Contract> contracts() {
        Arbitrary<Set<String>> names = Arbitraries.of("title", "body", "sender", "a", "b", "c", "d").set().ofMaxSize(5);
        return Combinators.combine(names, names).as((f, l) -> new Contract(new TreeSet<>(f), new TreeSet<>(l)));
    }

    @Provide
    Arbitrary<SemanticVersion> versions() {
        return Combinators.combine(Arbitraries.integers().between(0, 1000), Arbitraries.integers().between(0, 1000),
                Arbitraries.integers().between(0, 1000)).as(SemanticVersion::new);
    }

    @Property
    void a_contract_against_itself_differs_in_nothing(@ForAll("contracts") Contract c, @ForAll("versions") SemanticVersion v) {
        ContractDiff diff = ContractDiff.between(c, c);
        assertThat(diff).isEqualTo(ContractDiff.NONE);
        assertThat(diff.next(v)).isEqualTo(v);
    }

    @Property
    void a_diff_is_breaking_exactly_when_something_was_removed_or_a_required_field_added(@ForAll("contracts") Contract a,
            @ForAll("contracts") Contract b) {
        ContractDiff diff = ContractDiff.between(a, b);
        boolean removed = !b.inputFields().containsAll(a.inputFields()) || !b.labels().containsAll(a.labels());
        boolean fieldAdded = !a.inputFields().containsAll(b.inputFields());
        assertThat(diff.breaking()).isEqualTo(removed || fieldAdded);
    }

    @Property
    void the_next_version_never_goes_down_and_rises_in_the_major_exactly_when_breaking(@ForAll("contracts") Contract a,
            @ForAll("contracts") Contract b, @ForAll("versions") SemanticVersion v) {
        ContractDiff diff = ContractDiff.between(a, b);
        SemanticVersion next = diff.next(v);
        assertThat(next).isGreaterThanOrEqualTo(v);
        assertThat(next.major() > v.major()).isEqualTo(diff.breaking());
        assertThat(next.equals(v)).isEqualTo(diff.isEmpty());
    }

    @Property
    void applying_a_diff_to_the_old_contract_gives_the_new_one(@ForAll("contracts") Contract a, @ForAll("contracts") Contract b) {
        ContractDiff diff = ContractDiff.between(a, b);
        TreeSet<String> fields = new TreeSet<>(a.inputFields());
        fields.removeAll(diff.removedFields());
        fields.addAll(diff.addedFields());
        TreeSet<String> labels = new TreeSet<>(a.labels());
        labels.removeAll(diff.removedLabels());
        labels.addAll(diff.addedLabels());
        assertThat(new Contract(fields, labels)).isEqualTo(b);
    }
}
