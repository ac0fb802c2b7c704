package dev.pressmark.core.evaluate;

import dev.pressmark.core.PressmarkException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.SplittableRandom;

/** The work behind {@link Resampling}'s grouped split and k-fold; see there for the contract. */
final class GroupedResampling {

    private static final int TRAIN = 0;
    private static final int TEST = 1;

    private GroupedResampling() {}

    static GroupedSplit split(int[] labels, int[] groups, int classCount, double testFraction, long seed) {
        if (!(testFraction > 0.0 && testFraction < 1.0)) {
            throw new IllegalArgumentException("testFraction must be in (0, 1), was " + testFraction);
        }
        GroupTable table = GroupTable.of(labels, groups, classCount);
        if (table.rowCount == 0) {
            throw new IllegalArgumentException("labels must not be empty");
        }
        int testTarget = (int) Math.round(testFraction * table.rowCount);
        int[] preset = new int[table.groupCount()];
        Arrays.fill(preset, -1);
        List<OversizedGroup> oversized = new ArrayList<>();
        for (int g = 0; g < preset.length; g++) {
            if (table.size[g] > testTarget) {
                preset[g] = TRAIN;
                oversized.add(new OversizedGroup(table.ids[g], table.size[g], testTarget));
            } else if (holdsAClassAlone(table, g)) {
                preset[g] = TRAIN;
            }
        }
        int[] side = GroupAssigner.assign(table, new double[] {1 - testFraction, testFraction}, preset,
                new SplittableRandom(seed));
        keepEveryClassInTraining(table, side);
        testAtLeastOneGroup(table, side, preset, testTarget);
        int testRows = 0;
        boolean[] held = new boolean[table.rowCount];
        for (int row = 0; row < held.length; row++) {
            held[row] = side[table.groupOfRow[row]] == TEST;
            testRows += held[row] ? 1 : 0;
        }
        if (testRows == 0) {
            int smallest = Integer.MAX_VALUE;
            for (int g = 0; g < table.groupCount(); g++) {
                smallest = Math.min(smallest, table.size[g]);
            }
            throw new PressmarkException(Resampling.GROUPED_TEST_EMPTY, "no group fits the test side: it may hold "
                    + testTarget + " of " + table.rowCount + " rows, and "
                    + (smallest > testTarget ? "the smallest group has " + smallest
                            : "every group that fits holds the only rows of a class"));
        }
        return new GroupedSplit(Split.ofHeld(held, testRows), (double) testRows / table.rowCount, largestFirst(oversized));
    }

    static GroupedFolds kFold(int[] labels, int[] groups, int classCount, int folds, int repeats, long seed) {
        if (folds < 2) {
            throw new IllegalArgumentException("folds must be >= 2, was " + folds);
        }
        if (repeats < 1) {
            throw new IllegalArgumentException("repeats must be >= 1, was " + repeats);
        }
        GroupTable table = GroupTable.of(labels, groups, classCount);
        if (table.rowCount == 0) {
            throw new IllegalArgumentException("labels must not be empty");
        }
        requireEnoughGroups(table, folds);
        int limit = (table.rowCount + folds - 1) / folds;
        List<OversizedGroup> oversized = new ArrayList<>();
        for (int g = 0; g < table.groupCount(); g++) {
            if (table.size[g] > limit) {
                oversized.add(new OversizedGroup(table.ids[g], table.size[g], limit));
            }
        }
        double[] share = new double[folds];
        Arrays.fill(share, 1.0 / folds);
        int[] preset = new int[table.groupCount()];
        Arrays.fill(preset, -1);
        int[] foldOf = new int[table.rowCount];
        int[] foldSize = new int[folds];
        SplittableRandom root = new SplittableRandom(seed);
        List<Fold> out = new ArrayList<>(repeats * folds);
        for (int repeat = 0; repeat < repeats; repeat++) {
            int[] bin = GroupAssigner.assign(table, share, preset, root.split());
            Arrays.fill(foldSize, 0);
            for (int row = 0; row < foldOf.length; row++) {
                foldOf[row] = bin[table.groupOfRow[row]];
                foldSize[foldOf[row]]++;
            }
            for (int fold = 0; fold < folds; fold++) {
                out.add(Resampling.fold(repeat, fold, foldOf, foldSize[fold]));
            }
        }
        return new GroupedFolds(out, largestFirst(oversized));
    }

    /** The class with the fewest groups, if it has fewer than {@code folds}, fails the call. */
    private static void requireEnoughGroups(GroupTable table, int folds) {
        int fewest = -1;
        for (int k = 0; k < table.classCount; k++) {
            if (table.classRows[k] > 0 && (fewest < 0 || table.classGroups[k] < table.classGroups[fewest])) {
                fewest = k;
            }
        }
        if (table.classGroups[fewest] < folds) {
            throw new TooFewGroupsException(fewest, table.classGroups[fewest], folds);
        }
    }

    private static boolean holdsAClassAlone(GroupTable table, int g) {
        for (int e = table.start[g]; e < table.start[g + 1]; e++) {
            if (table.classGroups[table.classOf[e]] == 1) {
                return true;
            }
        }
        return false;
    }

    /**
     * A class with rows but none on the training side gets its smallest test group (then the
     * lowest id) moved there: a model never shown a class cannot be tested on it.
     */
    private static void keepEveryClassInTraining(GroupTable table, int[] side) {
        int[] trainRows = new int[table.classCount];
        for (int g = 0; g < side.length; g++) {
            if (side[g] == TRAIN) {
                for (int e = table.start[g]; e < table.start[g + 1]; e++) {
                    trainRows[table.classOf[e]] += table.rowsOf[e];
                }
            }
        }
        for (int k = 0; k < table.classCount; k++) {
            if (table.classRows[k] == 0 || trainRows[k] > 0) {
                continue;
            }
            int smallest = -1;
            for (int g = 0; g < side.length; g++) {
                if (side[g] == TEST && rowsOfClass(table, g, k) > 0
                        && (smallest < 0 || table.size[g] < table.size[smallest])) {
                    smallest = g;
                }
            }
            side[smallest] = TRAIN;
            for (int e = table.start[smallest]; e < table.start[smallest + 1]; e++) {
                trainRows[table.classOf[e]] += table.rowsOf[e];
            }
        }
    }

    /**
     * When the greedy left the test side empty (a test share smaller than every group's share of
     * its classes), the smallest group free to go there (then the lowest id) goes; its classes all
     * have other groups, all in training.
     */
    private static void testAtLeastOneGroup(GroupTable table, int[] side, int[] preset, int testTarget) {
        int smallest = -1;
        for (int g = 0; g < side.length; g++) {
            if (side[g] == TEST) {
                return;
            }
            if (preset[g] < 0 && table.size[g] <= testTarget && (smallest < 0 || table.size[g] < table.size[smallest])) {
                smallest = g;
            }
        }
        if (smallest >= 0) {
            side[smallest] = TEST;
        }
    }

    private static int rowsOfClass(GroupTable table, int g, int k) {
        for (int e = table.start[g]; e < table.start[g + 1]; e++) {
            if (table.classOf[e] == k) {
                return table.rowsOf[e];
            }
        }
        return 0;
    }

    private static List<OversizedGroup> largestFirst(List<OversizedGroup> groups) {
        groups.sort(Comparator.comparingInt(OversizedGroup::rows).reversed().thenComparingInt(OversizedGroup::group));
        return groups;
    }
}
