package dev.pressmark.demo;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.Progress;
import dev.pressmark.core.evaluate.Metric;
import dev.pressmark.core.evaluate.Resampling;
import dev.pressmark.core.evaluate.Split;
import dev.pressmark.core.train.LabelledData;
import dev.pressmark.core.train.TrainConfig;
import dev.pressmark.core.train.TrainingRun;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Collectors;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ListingTitlesTest {

    @Test
    void the_same_seed_gives_the_same_listings() {
        assertThat(ListingTitles.generate(500, 3)).isEqualTo(ListingTitles.generate(500, 3));
        assertThat(ListingTitles.generate(500, 3)).isNotEqualTo(ListingTitles.generate(500, 4));
    }

    @Test
    void every_department_appears_with_a_share_near_a_quarter() {
        List<ListingTitles.Listing> listings = ListingTitles.generate(8000, 11);
        Map<String, Long> byDepartment = listings.stream()
                .collect(Collectors.groupingBy(ListingTitles.Listing::department, Collectors.counting()));
        assertThat(byDepartment).containsOnlyKeys("plumbing", "electrical", "garden", "fasteners");
        // Four equally likely departments: 2,000 expected each; 5 standard deviations is about 195.
        assertThat(byDepartment.values()).allSatisfy(n -> assertThat(n).isBetween(1800L, 2200L));
    }

    @Test
    void titles_are_non_empty_single_lines() {
        assertThat(ListingTitles.generate(2000, 5)).allSatisfy(listing -> {
            assertThat(listing.title()).isNotBlank().doesNotContain("\n", "\t");
        });
    }

    @Test
    void the_csv_form_reads_back_as_labelled_data(@TempDir Path dir) throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        PrintStream original = System.out;
        try (PrintStream capture = new PrintStream(bytes, true, StandardCharsets.UTF_8)) {
            System.setOut(capture);
            ListingTitles.main(new String[] {"300", "--csv"});
        } finally {
            System.setOut(original);
        }
        Path file = dir.resolve("listings.csv");
        Files.write(file, bytes.toByteArray());
        LabelledData data = LabelledData.read(file, List.of("title"), "department", false);
        List<ListingTitles.Listing> expected = ListingTitles.generate(300, 7);
        assertThat(data.rows()).isEqualTo(300);
        for (int i = 0; i < 300; i++) {
            assertThat(data.texts().get(i)[0]).isEqualTo(expected.get(i).title());
            assertThat(data.labels().get(i)).isEqualTo(expected.get(i).department());
        }
    }

    @Test
    void refuses_a_negative_count() {
        assertThatThrownBy(() -> ListingTitles.generate(-1, 1)).hasMessage("count must be >= 0, was -1");
    }

    @Test
    void most_brands_of_a_held_out_part_never_occur_in_its_training_part() {
        List<ListingTitles.Listing> listings = ListingTitles.generate(15_000, 7);
        int[] labels = new int[listings.size()];
        for (int i = 0; i < labels.length; i++) {
            labels[i] = ListingTitles.departments().indexOf(listings.get(i).department());
        }
        Split split = Resampling.stratifiedSplit(labels, ListingTitles.departments().size(), 0.25, 7);
        Set<String> trainBrands = new HashSet<>();
        for (int i : split.train()) {
            trainBrands.add(brand(listings.get(i)));
        }
        int unseen = 0;
        for (int i : split.test()) {
            unseen += trainBrands.contains(brand(listings.get(i))) ? 0 : 1;
        }
        // 8 x 30 x 30 brands per first-syllable set against some 3,400 training rows per department:
        // a test row's brand was seen with probability about 1 - exp(-3400 / 7200), some 0.38.
        assertThat((double) unseen / split.test().length).isBetween(0.5, 0.8);
    }

    @Test
    void a_brand_usually_starts_with_a_syllable_of_its_own_department() {
        List<ListingTitles.Listing> listings = ListingTitles.generate(8000, 13);
        long own = listings.stream()
                .filter(l -> ListingTitles.brandRoots(l.department()).stream().anyMatch(brand(l)::startsWith))
                .count();
        // 0.9 by choice plus a quarter of the other 0.1 by chance: 0.925; 5 standard deviations of 8,000 draws is about 0.015.
        assertThat((double) own / listings.size()).isBetween(0.91, 0.94);
    }

    @Test
    void some_titles_name_their_product_with_a_typing_slip() {
        List<ListingTitles.Listing> listings = ListingTitles.generate(8000, 17);
        long slipped = listings.stream()
                .filter(l -> ListingTitles.productNames().stream().noneMatch(l.title()::contains))
                .count();
        // A slip is drawn for a fifth of the 60 % specific titles (0.12); about one draw in twelve lands
        // beside a space and leaves the name whole, so some 0.1 of all titles.
        assertThat((double) slipped / listings.size()).isBetween(0.08, 0.14);
    }

    @Test
    void subword_features_classify_held_out_titles_better_than_whole_words(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("listings.csv");
        try (Writer out = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            ListingTitles.writeCsv(ListingTitles.generate(4000, 19), out);
        }
        LabelledData data = LabelledData.read(file, List.of("title"), "department", false);
        double words = testAccuracy("word", data);
        double subwords = testAccuracy("wordpiece", data);
        // For the 40 % generic titles only the brand tells the department: whole words lose most of them
        // (some 0.7 overall); subwords keep the brand's first syllable (above 0.9).
        assertThat(words).isLessThan(0.8);
        assertThat(subwords).isGreaterThan(words + 0.15);
    }

    private static double testAccuracy(String tokenizer, LabelledData data) {
        TrainConfig config = TrainConfig.parse("""
                name: listings
                data: {file: listings.csv, text: [title], label: department}
                tokenizer: {kind: %s, vocab_size: 800}
                features: {max_tokens: 800}
                evaluation: {folds: 2}
                """.formatted(tokenizer), "test");
        return new TrainingRun(config, data).run(Progress.NONE).test().overall().get(Metric.ACCURACY);
    }

    private static String brand(ListingTitles.Listing listing) {
        return listing.title().substring(0, listing.title().indexOf(' '));
    }
}
