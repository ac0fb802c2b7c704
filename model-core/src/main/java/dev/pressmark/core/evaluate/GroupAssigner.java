package dev.pressmark.core.evaluate;

import java.util.Arrays;
import java.util.SplittableRandom;

/**
 * Deals whole groups to bins (the two sides of a split, or the folds of a k-fold) with target
 * shares w_b, greedily, as scikit-learn's {@code StratifiedGroupKFold} (1.0 and later, after a
 * kernel by J. Wasikowski) does for equal shares: groups are taken in a seeded random order,
 * stably sorted so that the group whose class counts vary most comes first (mostly the largest,
 * single-class ones), and each goes to the bin where it leaves the class proportions least spread.
 *
 * <p>The spread of class k, with T_k its rows, A_k those placed so far (this group included) and
 * c_bk those in bin b, is
 * <pre>  s_k = sqrt(Σ_b (c_bk − w_b·A_k)² / w_b) / T_k = sqrt(Σ_b c_bk² / w_b − A_k²) / T_k</pre>
 * and a bin's cost is Σ_k s_k after the group joins it. For equal shares 1/F, s_k is F times the
 * standard deviation over the folds of the class's fold share c_bk/T_k, so the choice is
 * scikit-learn's (the mean over classes of that deviation) up to the tie tolerance; unequal
 * shares weigh each bin's gap by its share, as a chi-square distance does. Only the classes the group has change, so one
 * candidate bin costs O(classes of the group), with Σ_b c_bk²/w_b kept per class. Among equal costs
 * (relative 1e−12) the bin least filled for its share wins, then the lower index (scikit-learn:
 * the fold with fewest rows). Fold sizes are not steered beyond that: steering them was tried and
 * made class balance worse on the reference sets.
 */
final class GroupAssigner {

    /** Costs this close (relative) count as equal; they then differ by rounding alone. */
    private static final double TIE = 1e-12;

    private final GroupTable table;
    private final double[] share;
    private final double[] cells;
    private final double[] binRows;
    private final double[] placedOfClass;
    /** Σ_b c_bk² / w_b per class. */
    private final double[] squares;

    private GroupAssigner(GroupTable table, double[] share) {
        this.table = table;
        this.share = share;
        this.cells = new double[share.length * table.classCount];
        this.binRows = new double[share.length];
        this.placedOfClass = new double[table.classCount];
        this.squares = new double[table.classCount];
    }

    /**
     * The bin of every group: {@code preset[g] >= 0} places group g there first, the others follow
     * the greedy in the order drawn from {@code random}.
     */
    static int[] assign(GroupTable table, double[] share, int[] preset, SplittableRandom random) {
        GroupAssigner assigner = new GroupAssigner(table, share);
        int[] bin = preset.clone();
        for (int g = 0; g < bin.length; g++) {
            if (bin[g] >= 0) {
                assigner.place(g, bin[g]);
            }
        }
        for (int g : order(table, random)) {
            if (bin[g] < 0) {
                bin[g] = assigner.best(g);
                assigner.place(g, bin[g]);
            }
        }
        return bin;
    }

    /** A seeded shuffle of the groups, then a stable sort by decreasing {@link GroupTable#spreadKey}. */
    static int[] order(GroupTable table, SplittableRandom random) {
        int groupCount = table.groupCount();
        Integer[] order = new Integer[groupCount];
        for (int g = 0; g < groupCount; g++) {
            order[g] = g;
        }
        for (int i = groupCount - 1; i > 0; i--) {
            int j = random.nextInt(i + 1);
            Integer swap = order[i];
            order[i] = order[j];
            order[j] = swap;
        }
        long[] key = new long[groupCount];
        for (int g = 0; g < groupCount; g++) {
            key[g] = table.spreadKey(g);
        }
        Arrays.sort(order, (a, b) -> Long.compare(key[b], key[a]));
        int[] out = new int[groupCount];
        for (int i = 0; i < groupCount; i++) {
            out[i] = order[i];
        }
        return out;
    }

    private int best(int g) {
        int chosen = -1;
        double chosenCost = 0;
        for (int b = 0; b < share.length; b++) {
            double cost = cost(g, b);
            if (chosen < 0 || cost < chosenCost - TIE * Math.max(1.0, Math.abs(chosenCost))
                    || (cost <= chosenCost + TIE * Math.max(1.0, Math.abs(chosenCost))
                            && binRows[b] / share[b] < binRows[chosen] / share[chosen])) {
                chosen = b;
                chosenCost = cost;
            }
        }
        return chosen;
    }

    /** Σ_k s_k over group g's classes were it to join bin b; the other classes' s_k are alike for every bin. */
    private double cost(int g, int b) {
        int classCount = table.classCount;
        double w = share[b];
        double sum = 0;
        for (int e = table.start[g]; e < table.start[g + 1]; e++) {
            int k = table.classOf[e];
            double a = table.rowsOf[e];
            double c = cells[b * classCount + k];
            double placed = placedOfClass[k] + a;
            double q = squares[k] + ((c + a) * (c + a) - c * c) / w;
            // Rounding can leave the difference a hair below 0 when the bins match their targets exactly.
            sum += Math.sqrt(Math.max(0, q - placed * placed)) / table.classRows[k];
        }
        return sum;
    }

    private void place(int g, int b) {
        int classCount = table.classCount;
        for (int e = table.start[g]; e < table.start[g + 1]; e++) {
            int k = table.classOf[e];
            double c = cells[b * classCount + k];
            squares[k] += ((c + table.rowsOf[e]) * (c + table.rowsOf[e]) - c * c) / share[b];
            cells[b * classCount + k] += table.rowsOf[e];
            placedOfClass[k] += table.rowsOf[e];
        }
        binRows[b] += table.size[g];
    }
}
