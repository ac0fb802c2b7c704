package dev.pressmark.demo;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;
import org.junit.jupiter.api.Test;

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
    void refuses_a_negative_count() {
        assertThatThrownBy(() -> ListingTitles.generate(-1, 1)).hasMessage("count must be >= 0, was -1");
    }
}
