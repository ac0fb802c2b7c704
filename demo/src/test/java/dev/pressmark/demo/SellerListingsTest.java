package dev.pressmark.demo;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

class SellerListingsTest {

    @Test
    void every_title_starts_with_its_sellers_shop_name_and_the_first_seller_lists_the_most() {
        List<SellerListings.Listing> listings = SellerListings.generate(3000, 60, 7);
        Map<String, Integer> rowsOfSeller = new HashMap<>();
        for (SellerListings.Listing listing : listings) {
            assertThat(listing.title()).startsWith(listing.seller() + " ");
            assertThat(ListingTitles.departments()).contains(listing.department());
            rowsOfSeller.merge(listing.seller(), 1, Integer::sum);
        }
        assertThat(rowsOfSeller).hasSize(60);
        // weights 1/(s+1) over 60 sellers: the first has 1/H_60 = 21 % of the rows in expectation
        assertThat(rowsOfSeller.get("Amberworks")).isBetween(500, 760);
    }

    @Test
    void the_same_seed_gives_the_same_listings_and_bad_counts_are_refused() {
        assertThat(SellerListings.generate(200, 10, 3)).isEqualTo(SellerListings.generate(200, 10, 3));
        assertThat(SellerListings.generate(200, 10, 3)).isNotEqualTo(SellerListings.generate(200, 10, 4));
        assertThatThrownBy(() -> SellerListings.generate(10, 0, 1)).hasMessageContaining("sellers in [1, 160]");
    }
}
