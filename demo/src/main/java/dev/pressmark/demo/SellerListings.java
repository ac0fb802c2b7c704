package dev.pressmark.demo;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Invented listings where one name repeats many times: every seller puts its shop name first in
 * each of its titles and sells mostly one department. A few sellers list a large share of all
 * titles. Most titles name a product every department sells, so the shop name is often the only
 * clue, and a model can score well on rows of sellers it has seen by remembering the name alone.
 * For the worked example of {@code data.group} in the README.
 */
public final class SellerListings {

    /** One listing: its title (the seller's shop name first), its department and its seller. */
    public record Listing(String title, String department, String seller) {
    }

    /** The share of titles that name a product every department sells. */
    static final double GENERIC_SHARE = 0.7;
    /** The share of a seller's titles in its main department. */
    static final double MAIN_DEPARTMENT_SHARE = 0.9;

    private static final String[] SHOP_STARTS = {"Amber", "Birch", "Copper", "Delta", "Ember", "Flint", "Granite", "Harbor",
        "Iron", "Juniper", "Kestrel", "Lumen", "Maple", "North", "Onyx", "Pine", "Quarry", "Ridge", "Slate", "Timber"};
    private static final String[] SHOP_ENDS = {"works", "supply", "depot", "mart", "trade", "goods", "yard", "store"};

    private SellerListings() {
    }

    /** {@code count} listings from {@code sellers} sellers and {@code seed}. */
    public static List<Listing> generate(int count, int sellers, long seed) {
        if (count < 0 || sellers < 1 || sellers > SHOP_STARTS.length * SHOP_ENDS.length) {
            throw new IllegalArgumentException("count must be >= 0 and sellers in [1, " + SHOP_STARTS.length * SHOP_ENDS.length
                    + "], were " + count + " and " + sellers);
        }
        SplittableRandom random = new SplittableRandom(seed);
        List<String> departments = ListingTitles.departments();
        int[] main = new int[sellers];
        for (int s = 0; s < sellers; s++) {
            main[s] = random.nextInt(departments.size());
        }
        List<String> generic = ListingTitles.genericProducts();
        List<Listing> listings = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            // seller s is chosen with weight 1 / (s + 1): the first few list a large share
            int seller = skewed(random, sellers);
            int department = random.nextDouble() < MAIN_DEPARTMENT_SHARE ? main[seller] : random.nextInt(departments.size());
            List<String> own = ListingTitles.products(departments.get(department));
            String product = random.nextDouble() < GENERIC_SHARE ? generic.get(random.nextInt(generic.size()))
                    : own.get(random.nextInt(own.size()));
            String shop = shop(seller);
            listings.add(new Listing(shop + " " + product, departments.get(department), shop));
        }
        return listings;
    }

    private static String shop(int seller) {
        return SHOP_STARTS[seller % SHOP_STARTS.length] + SHOP_ENDS[seller / SHOP_STARTS.length];
    }

    private static int skewed(SplittableRandom random, int sellers) {
        double total = 0;
        for (int s = 0; s < sellers; s++) {
            total += 1.0 / (s + 1);
        }
        double at = random.nextDouble() * total;
        for (int s = 0; s < sellers; s++) {
            at -= 1.0 / (s + 1);
            if (at < 0) {
                return s;
            }
        }
        return sellers - 1;
    }

    /** Prints {@code COUNT} listings (default 3,000) of {@code SELLERS} sellers (default 60) as a CSV: title,department,seller. */
    public static void main(String[] args) throws IOException {
        int count = args.length > 0 ? Integer.parseInt(args[0]) : 3000;
        int sellers = args.length > 1 ? Integer.parseInt(args[1]) : 60;
        Writer out = new BufferedWriter(new OutputStreamWriter(System.out, StandardCharsets.UTF_8));
        out.write("title,department,seller\r\n");
        for (Listing listing : generate(count, sellers, 7)) {
            out.write('"' + listing.title() + "\"," + listing.department() + "," + listing.seller() + "\r\n");
        }
        out.flush();
    }
}
