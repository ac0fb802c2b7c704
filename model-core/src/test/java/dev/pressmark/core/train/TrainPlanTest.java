package dev.pressmark.core.train;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.search.Pick;
import org.junit.jupiter.api.Test;

class TrainPlanTest {

    private static final String BASE = """
            name: routing
            data: {file: listings.csv, text: [title], label: department}
            tokenizer: {vocab_size: 500}
            """;

    private static TrainPlan parse(String search) {
        return TrainPlan.parse(BASE + search, "train.yaml");
    }

    private static void rejects(String search, String message) {
        assertThatThrownBy(() -> parse(search)).isInstanceOf(PressmarkException.class)
                .hasMessage(message)
                .satisfies(e -> assertThat(((PressmarkException) e).code()).isEqualTo("invalid-config"));
    }

    @Test
    void a_config_without_a_search_is_the_config_alone() {
        TrainPlan plan = TrainPlan.parse(BASE, "train.yaml");
        assertThat(plan.search()).isNull();
        assertThat(plan.config()).isEqualTo(TrainConfig.parse(BASE, "train.yaml"));
    }

    @Test
    void spans_the_grid_in_order_with_each_candidate_read_as_a_whole_config() {
        TrainPlan plan = parse("""
                search:
                  grid:
                    classifier.c: [0.1, 1]
                    tokenizer.0.vocab_size: [300, 900]
                    features.weighting: [tf, tfidf]
                  metric: f1
                  pick: one-se
                """);
        assertThat(plan.search().settings().metric()).isEqualTo(Metric.F1);
        assertThat(plan.search().settings().pick()).isEqualTo(Pick.ONE_SE);
        assertThat(plan.search().candidates()).hasSize(8);
        assertThat(plan.search().candidates().get(0).describe())
                .isEqualTo("classifier.c=0.1, tokenizer.0.vocab_size=300, features.weighting=tf");
        assertThat(plan.search().candidates().get(7).describe())
                .isEqualTo("classifier.c=1, tokenizer.0.vocab_size=900, features.weighting=tfidf");
        TrainConfig last = plan.search().configs().get(7);
        assertThat(last.classifier().c()).isEqualTo(1.0);
        assertThat(last.tokenizer().vocabSize()).isEqualTo(900);
        assertThat(last.features().weighting().key()).isEqualTo("tfidf");
        assertThat(last.name()).isEqualTo("routing");
        assertThat(last.data()).isEqualTo(plan.config().data());
    }

    @Test
    void a_list_index_picks_a_tokenizer_entry() {
        TrainPlan plan = TrainPlan.parse("""
                data: {file: names.csv, text: [name], label: region}
                tokenizer:
                  - {kind: wordpiece, vocab_size: 500}
                  - {kind: char-ngrams, min_n: 1, max_n: 4}
                search:
                  grid:
                    tokenizer.1.max_n: [3, 5]
                    tokenizer.0.vocab_size: [300]
                """, "train.yaml");
        assertThat(plan.search().configs().get(0).tokenizers().get(1).maxN()).isEqualTo(3);
        assertThat(plan.search().configs().get(1).tokenizers().get(1).maxN()).isEqualTo(5);
        assertThat(plan.search().configs().get(1).tokenizers().get(0).vocabSize()).isEqualTo(300);
        assertThatThrownBy(() -> TrainPlan.parse("""
                tokenizer:
                  - {kind: wordpiece}
                  - {kind: char-ngrams}
                search:
                  grid:
                    tokenizer.2.max_n: [3]
                """, "train.yaml")).hasMessage("train.yaml: line 6: search.grid.tokenizer.2.max_n: tokenizer has 2 entries (0 to 1),"
                + " so there is no entry 2");
        assertThatThrownBy(() -> TrainPlan.parse("""
                tokenizer:
                  - {kind: wordpiece}
                search:
                  grid:
                    tokenizer.vocab_size: [300]
                """, "train.yaml")).hasMessage("train.yaml: line 5: search.grid.tokenizer.vocab_size: tokenizer is a list; name an"
                + " entry by its index, as in tokenizer.0.vocab_size");
    }

    @Test
    void a_key_left_to_its_default_can_be_searched() {
        TrainPlan plan = parse("search: {grid: {classifier.kind: [linear-svm, logistic-regression]}}\n");
        assertThat(plan.search().configs().get(1).classifier().kind().key()).isEqualTo("logistic-regression");
    }

    @Test
    void names_an_unknown_grid_key_and_its_line() {
        rejects("""
                search:
                  grid:
                    classifier.c: [1]
                    classifier.cost: [0.1, 1]
                """, "train.yaml: line 7: search.grid.classifier.cost = 0.1: unknown key \"classifier.cost\"; known keys here:"
                + " c, class_weight, kind, loss, max_iterations, probabilities, tolerance");
    }

    @Test
    void names_a_tokenizer_entry_that_does_not_exist() {
        rejects("""
                search:
                  grid:
                    tokenizer.1.vocab_size: [100]
                """, "train.yaml: line 6: search.grid.tokenizer.1.vocab_size: tokenizer is a single entry (0), so there is no entry 1");
    }

    @Test
    void names_a_value_of_the_wrong_type() {
        rejects("""
                search:
                  grid:
                    classifier.c: [0.1, lots]
                """, "train.yaml: line 6: search.grid.classifier.c = lots: classifier.c: expected a number, was \"lots\"");
    }

    @Test
    void names_a_value_out_of_bounds() {
        rejects("search:\n  grid:\n    classifier.c: [-1]\n",
                "train.yaml: line 6: search.grid.classifier.c = -1: classifier.c must be > 0, was -1.0");
    }

    @Test
    void names_an_empty_list() {
        rejects("search:\n  grid:\n    classifier.c: []\n",
                "train.yaml: line 6: search.grid.classifier.c: expected a list of at least one value, was an empty list");
    }

    @Test
    void names_a_value_that_is_not_a_list() {
        rejects("search:\n  grid:\n    classifier.c: 3\n", "train.yaml: line 6: search.grid.classifier.c: expected a list of values, was 3");
    }

    @Test
    void refuses_more_than_a_thousand_candidates_saying_how_many() {
        rejects("""
                search:
                  grid:
                    classifier.c: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11]
                    tokenizer.vocab_size: [100, 200, 300, 400, 500, 600, 700, 800, 900, 1000]
                    features.max_tokens: [10, 20, 30, 40, 50, 60, 70, 80, 90, 100]
                """, "train.yaml: line 5: search.grid spans 1,100 candidates; the limit is 1000");
    }

    @Test
    void refuses_keys_every_candidate_must_share() {
        rejects("search:\n  grid:\n    split.seed: [1, 2]\n", "train.yaml: line 6: search.grid.split.seed: only keys under tokenizer,"
                + " features and classifier can be searched (every candidate shares the data, the split and the folds)");
    }

    @Test
    void names_an_unknown_metric_pick_or_search_key() {
        rejects("search:\n  grid: {classifier.c: [1]}\n  metric: precision_at_k\n", "train.yaml: line 6: search.metric: unknown metric"
                + " 'precision_at_k', expected one of accuracy, balanced_accuracy, sensitivity, specificity, precision, npv, f1, mcc,"
                + " kappa, roc_auc, pr_auc");
        rejects("search:\n  grid: {classifier.c: [1]}\n  pick: worst\n",
                "train.yaml: line 6: search.pick must be one of best, one-se; was \"worst\"");
        rejects("search:\n  grid: {classifier.c: [1]}\n  folds: 3\n",
                "train.yaml: line 6: unknown key \"search.folds\"; known keys here: grid, metric, pick, warm_start");
    }

    @Test
    void names_a_repeated_value_and_a_missing_grid() {
        rejects("search:\n  grid:\n    classifier.c: [1, 1.0, 1]\n", "train.yaml: line 6: search.grid.classifier.c: the value 1 is listed twice");
        rejects("search:\n  metric: f1\n", "train.yaml: line 4: search.grid is missing: name at least one config key and its values,"
                + " as in grid: {classifier.c: [0.1, 1, 10]}");
    }

    @Test
    void refuses_candidates_that_are_the_same_config() {
        rejects("search:\n  grid:\n    classifier.c: [1, 1.0]\n",
                "train.yaml: line 5: search.grid: the candidates classifier.c=1 and classifier.c=1.0 are the same config"
                        + " (equal values, or a key that has no effect beside the others)");
    }
}
