package dev.pressmark.demo;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.pressmark.core.train.LabelledData;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
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
}
