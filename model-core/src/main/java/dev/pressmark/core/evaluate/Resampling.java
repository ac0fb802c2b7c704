package dev.pressmark.core.evaluate;

import dev.pressmark.core.PressmarkException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Stratified resampling of labelled rows, by row or by group. Labels are class indices in
 * {@code [0, classCount)}; every random choice comes from a {@link SplittableRandom} seeded by the
 * caller, so the same labels (and groups) and seed always give the same rows. Classes with no rows
 * are allowed and take no part.
 *
 * <p>The grouped forms ({@link #groupedStratifiedSplit}, {@link #groupedStratifiedKFold}) take a
 * group id per row (any ints; rows with the same id form one group) and never put one group's rows
 * on both sides of a split or into two folds of a repeat. They deal whole groups greedily, in the
 * manner of scikit-learn's {@code StratifiedGroupKFold}: groups in a seeded random order, stably
 * sorted so that the group whose class counts vary most comes first, each to the part where it
 * leaves the parts' class proportions least spread from their targets (the measure and its tie
 * rules are in {@code GroupAssigner}). What they guarantee beyond the seed: the result depends on the rows
 * only through the multiset of (group id, label) pairs and on the ids only through their order, so
 * permuting the rows moves each row's side or fold with it, and so does renaming the groups by any
 * increasing map.
 */
public final class Resampling {

    /** The error code when a class has fewer rows than there are folds. */
    public static final String FOLDS_EXCEED_CLASS = "fold-count-exceeds-class-size";

    /** The error code when a class's rows lie in fewer groups than there are folds. */
    public static final String FOLDS_EXCEED_CLASS_GROUPS = "fold-count-exceeds-class-groups";

    /** The error code when no group can go to the test side of a grouped split. */
    public static final String GROUPED_TEST_EMPTY = "grouped-split-empty-test";

    private Resampling() {}

    /**
     * Splits the rows into a training and a test side, whole groups at a time, stratified as far
     * as the groups allow. The test side aims at {@code round(testFraction × n)} rows and at the
     * same share of every class; {@link GroupedSplit#achievedTestFraction()} says where it landed.
     * Three rules come before the greedy and put a group on the training side: a group larger than
     * the test target (reported in {@link GroupedSplit#oversized()}, since it can only go there);
     * the only group of a class (as a one-row class in {@link #stratifiedSplit}: a model never
     * shown a class cannot be tested on it); and after the greedy, a class left without training
     * rows gets its smallest test group moved back.
     *
     * @param labels class index of each row
     * @param groups group id of each row
     * @param classCount number of classes K; every label must be below it
     * @param testFraction target share of the test side, in (0, 1)
     * @param seed seed of the group order
     * @return the sorted row indices of both sides, the achieved test share and the oversized groups
     * @throws PressmarkException with code {@value #GROUPED_TEST_EMPTY} when no group can go to the test side
     */
    public static GroupedSplit groupedStratifiedSplit(int[] labels, int[] groups, int classCount, double testFraction,
            long seed) {
        return GroupedResampling.split(labels, groups, classCount, testFraction, seed);
    }

    /**
     * Repeated k-fold over whole groups, stratified as far as the groups allow: each fold aims at
     * a k-th of every class and of all rows. Every row is in exactly one fold's test part per
     * repeat, and no fold is empty (an empty fold is always among the cheapest for the next
     * group, and wins the tie as the least filled). No fold is promised a row of every class: the
     * greedy only makes it likely. Repeat r orders the groups with the r-th
     * {@link SplittableRandom#split()} of a generator seeded with {@code seed}, so each repeat
     * reshuffles the groups and the first repeats do not depend on how many follow. A group with
     * more rows than {@code ⌈n / k⌉} is reported in {@link GroupedFolds#oversized()}.
     *
     * @param labels class index of each row
     * @param groups group id of each row
     * @param classCount number of classes K; every label must be below it
     * @param folds number of folds k, at least 2 and at most the group count of every non-empty class
     * @param repeats number of repeats, at least 1
     * @param seed seed of the group orders
     * @return {@code repeats × folds} folds, ordered by repeat and then by fold index, and the oversized groups
     * @throws TooFewGroupsException (code {@value #FOLDS_EXCEED_CLASS_GROUPS}) naming the class with
     *     the fewest groups when it has fewer than {@code folds}
     */
    public static GroupedFolds groupedStratifiedKFold(int[] labels, int[] groups, int classCount, int folds,
            int repeats, long seed) {
        return GroupedResampling.kFold(labels, groups, classCount, folds, repeats, seed);
    }

    /**
     * Splits the rows into a training and a test side, class by class. Each class's rows are
     * shuffled and the first {@code round(testFraction × n_k)} go to the test side, where
     * {@code round} is {@link Math#round(double)} on the double product (halves round up: 0.25 × 10
     * gives 3). The training side always keeps at least one row of every class, so the test count
     * is capped at {@code n_k − 1}; a class with one row stays wholly on the training side, since a
     * model never shown a class cannot be tested on it. Because each class is rounded on its own,
     * the test side can differ from {@code round(testFraction × n)} by up to half a row per class,
     * more where the cap applies.
     *
     * @param labels class index of each row
     * @param classCount number of classes K; every label must be below it
     * @param testFraction share of each class held out, in (0, 1)
     * @param seed seed of the shuffle
     * @return sorted row indices of both sides
     */
    public static Split stratifiedSplit(int[] labels, int classCount, double testFraction, long seed) {
        int[] counts = RowIndices.classCounts(labels, classCount);
        if (!(testFraction > 0.0 && testFraction < 1.0)) {
            throw new IllegalArgumentException("testFraction must be in (0, 1), was " + testFraction);
        }
        int[] start = classStarts(counts);
        int[] byClass = groupByClass(labels, start);
        SplittableRandom random = new SplittableRandom(seed);
        boolean[] held = new boolean[labels.length];
        int testSize = 0;
        for (int k = 0; k < classCount; k++) {
            shuffle(byClass, start[k], start[k + 1], random);
            int take = testCount(counts[k], testFraction);
            for (int i = start[k]; i < start[k] + take; i++) {
                held[byClass[i]] = true;
            }
            testSize += take;
        }
        return Split.ofHeld(held, testSize);
    }

    /** The documented rounding of {@link #stratifiedSplit}: half up, capped at {@code n − 1}. */
    static int testCount(int classRows, double testFraction) {
        if (classRows < 2) {
            return 0;
        }
        long rounded = Math.round(testFraction * classRows);
        return (int) Math.min(rounded, classRows - 1);
    }

    /**
     * Repeated stratified k-fold. In each repeat every class's rows are shuffled and dealt to the
     * folds in turn, one class after another without restarting at fold 0; so each fold holds
     * {@code floor(n_k / k)} or {@code ceil(n_k / k)} rows of class k, and {@code floor(n / k)} or
     * {@code ceil(n / k)} rows in all. Repeat r shuffles with the r-th {@link SplittableRandom#split()}
     * of a generator seeded with {@code seed}, so the first repeats do not depend on how many follow.
     *
     * @param labels class index of each row
     * @param classCount number of classes K; every label must be below it
     * @param folds number of folds k, at least 2 and at most the row count of the smallest non-empty class
     * @param repeats number of repeats, at least 1
     * @param seed seed of the shuffles
     * @return {@code repeats × folds} folds, ordered by repeat and then by fold index
     * @throws PressmarkException with code {@value #FOLDS_EXCEED_CLASS} when a class has fewer rows than {@code folds}
     */
    public static List<Fold> stratifiedKFold(int[] labels, int classCount, int folds, int repeats, long seed) {
        int[] counts = RowIndices.classCounts(labels, classCount);
        if (folds < 2) {
            throw new IllegalArgumentException("folds must be >= 2, was " + folds);
        }
        if (repeats < 1) {
            throw new IllegalArgumentException("repeats must be >= 1, was " + repeats);
        }
        if (labels.length == 0) {
            throw new IllegalArgumentException("labels must not be empty");
        }
        requireEnoughRows(counts, folds);
        int[] start = classStarts(counts);
        int[] byClass = groupByClass(labels, start);
        int[] foldOf = new int[labels.length];
        int[] foldSize = new int[folds];
        SplittableRandom root = new SplittableRandom(seed);
        List<Fold> out = new ArrayList<>(repeats * folds);
        for (int repeat = 0; repeat < repeats; repeat++) {
            SplittableRandom random = root.split();
            Arrays.fill(foldSize, 0);
            for (int k = 0; k < classCount; k++) {
                shuffle(byClass, start[k], start[k + 1], random);
            }
            // byClass runs class after class, so dealing it in one sweep balances classes and folds alike.
            for (int i = 0; i < byClass.length; i++) {
                int fold = i % folds;
                foldOf[byClass[i]] = fold;
                foldSize[fold]++;
            }
            for (int fold = 0; fold < folds; fold++) {
                out.add(fold(repeat, fold, foldOf, foldSize[fold]));
            }
        }
        return List.copyOf(out);
    }

    private static void requireEnoughRows(int[] counts, int folds) {
        int smallest = -1;
        for (int k = 0; k < counts.length; k++) {
            if (counts[k] > 0 && (smallest < 0 || counts[k] < counts[smallest])) {
                smallest = k;
            }
        }
        if (counts[smallest] < folds) {
            throw new PressmarkException(FOLDS_EXCEED_CLASS, "fold count " + folds + " exceeds the "
                    + counts[smallest] + " rows of class " + smallest);
        }
    }

    static Fold fold(int repeat, int index, int[] foldOf, int testSize) {
        int[] train = new int[foldOf.length - testSize];
        int[] test = new int[testSize];
        int nTrain = 0;
        int nTest = 0;
        for (int row = 0; row < foldOf.length; row++) {
            if (foldOf[row] == index) {
                test[nTest++] = row;
            } else {
                train[nTrain++] = row;
            }
        }
        return new Fold(repeat, index, train, test);
    }

    /** Offsets of each class's segment in the grouped order; {@code start[K]} is the row count. */
    private static int[] classStarts(int[] counts) {
        int[] start = new int[counts.length + 1];
        for (int k = 0; k < counts.length; k++) {
            start[k + 1] = start[k] + counts[k];
        }
        return start;
    }

    /** Row indices grouped by class (a counting sort), ascending within each class. */
    private static int[] groupByClass(int[] labels, int[] start) {
        int[] next = Arrays.copyOf(start, start.length - 1);
        int[] byClass = new int[labels.length];
        for (int row = 0; row < labels.length; row++) {
            byClass[next[labels[row]]++] = row;
        }
        return byClass;
    }

    /** Fisher-Yates shuffle of {@code values[from, to)}. */
    private static void shuffle(int[] values, int from, int to, SplittableRandom random) {
        for (int i = to - 1; i > from; i--) {
            int j = from + random.nextInt(i - from + 1);
            int swap = values[i];
            values[i] = values[j];
            values[j] = swap;
        }
    }
}
