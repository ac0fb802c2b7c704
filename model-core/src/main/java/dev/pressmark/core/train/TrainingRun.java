package dev.pressmark.core.train;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import dev.pressmark.core.bundle.ModelWeights;
import dev.pressmark.core.bundle.TextPipeline;
import dev.pressmark.core.classify.ClassWeights;
import dev.pressmark.core.classify.LinearClassifier;
import dev.pressmark.core.classify.LogisticTrainer;
import dev.pressmark.core.classify.PlattScaling;
import dev.pressmark.core.classify.SvmTrainer;
import dev.pressmark.core.classify.WarmStart;
import dev.pressmark.core.evaluate.DuplicateCounts;
import dev.pressmark.core.evaluate.Evaluation;
import dev.pressmark.core.evaluate.Fold;
import dev.pressmark.core.evaluate.FoldSummary;
import dev.pressmark.core.evaluate.GroupedFolds;
import dev.pressmark.core.evaluate.GroupedSplit;
import dev.pressmark.core.evaluate.MetricValues;
import dev.pressmark.core.evaluate.OversizedGroup;
import dev.pressmark.core.evaluate.Resampling;
import dev.pressmark.core.evaluate.RowAssignments;
import dev.pressmark.core.evaluate.Split;
import dev.pressmark.core.evaluate.TooFewGroupsException;
import dev.pressmark.core.feature.SparseMatrix;
import dev.pressmark.core.search.SearchSummary;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.SplittableRandom;
import java.util.TreeSet;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * One training run, from labelled rows to a fitted model with honest estimates of its quality:
 *
 * <ol>
 *   <li>find identical normalised texts ({@code data.duplicates}): count them, group them, or drop
 *       later repeats of a (text, label) pair;
 *   <li>hold out the test part (stratified by default; with {@code data.group} or
 *       {@code duplicates: group}, whole groups, as {@link Resampling#groupedStratifiedSplit}
 *       places them);
 *   <li>cross-validate on the training part only (in grouped folds with {@code data.group}): in every fold the whole preprocessing and the
 *       classifier are fitted on the fold's training rows and scored on its held-out rows;
 *   <li>fit Platt sigmoids, when asked, on the out-of-fold decision values of the first repeat;
 *   <li>fit the final model on the whole training part and score the test part, once.
 * </ol>
 *
 * Folds run in parallel on {@code evaluation.threads}; each fold draws its randomness from a seed
 * derived from the run's seed and its place, so the result is the same at any thread count.
 */
public final class TrainingRun {

    /**
     * What a run produces.
     *
     * @param labels the label set, sorted
     * @param positiveClass the class binary metrics treat as positive, or -1 for more than two classes
     * @param pipeline the final preprocessing
     * @param model the final classifier
     * @param cv the cross-validated metrics, mean and standard error per metric
     * @param test the metrics on the held-out test part
     * @param trainRows the rows of the training part, as indices into the data
     * @param testRows the rows of the test part
     * @param warnings solver warnings, for example an iteration cap that was hit, and groups too
     *     large for the part they went to
     * @param search what the search found, or null when the config has no search
     * @param grouping the groups' figures when {@code data.group} is set or {@code data.duplicates}
     *     is {@code group}, else null
     * @param foldOfRow per data row, the fold (from 0) of the first repeat that held it out, or
     *     {@link RowAssignments#TEST} for a test row
     * @param duplicates how often the rows of each part repeat a normalised text
     */
    public record Result(
            List<String> labels,
            int positiveClass,
            TextPipeline pipeline,
            ModelWeights model,
            FoldSummary cv,
            Evaluation test,
            int[] trainRows,
            int[] testRows,
            List<String> warnings,
            Searched search,
            Grouping grouping,
            int[] foldOfRow,
            DuplicateCounts duplicates) {
    }

    /**
     * What grouping did.
     *
     * @param groups the distinct groups among the data rows (each empty group value counts as one)
     * @param testFractionAchieved the test part's share of the rows, or NaN when a test file was given
     */
    public record Grouping(int groups, double testFractionAchieved) {
    }

    /**
     * A search's outcome.
     *
     * @param summary every candidate's score and the chosen one, as the manifest records them
     * @param chosen the chosen candidate's config, which the final model was trained with
     */
    public record Searched(SearchSummary summary, TrainConfig chosen) {
    }

    private final TrainConfig config;
    private final TrainPlan.Search search;
    private final LabelledData data;
    private final List<String> labels;
    private final int[] y;
    private final int positiveClass;
    private final PipelineFitter fitter;
    /** The train/test split given by the caller, or null to hold out a part as {@code config.split()} says. */
    private final Split fixedSplit;
    /**
     * The rows' groups when {@code data.group} is set or {@code data.duplicates} is {@code group}
     * (then joined with the groups of identical texts), else null.
     */
    private final RowGroups groups;
    /** The rows after {@code data.duplicates: drop}, their text ids, and the split a test file fixed. */
    private final PreparedRows prepared;
    /** Each data row's case weight when {@code data.weight} is set, else null (every row weighs 1). */
    private final double[] caseWeights;

    public TrainingRun(TrainConfig config, LabelledData data) {
        this(TrainPlan.of(config), data);
    }

    /** A run of {@code plan}: its config, or the search over its candidates and the chosen one. */
    public TrainingRun(TrainPlan plan, LabelledData data) {
        this(plan, data, null);
    }

    /**
     * A run that trains (and cross-validates) on every row of {@code train} and tests once on
     * every row of {@code test}, instead of holding out a part of one file; {@code config.split()}
     * is then not used. The result's row indices count {@code train}'s rows first, then
     * {@code test}'s, as in {@link #data()}.
     */
    public static TrainingRun withTestData(TrainConfig config, LabelledData train, LabelledData test) {
        return withTestData(TrainPlan.of(config), train, test);
    }

    /** As {@link #withTestData(TrainConfig, LabelledData, LabelledData)}, for a plan that may search. */
    public static TrainingRun withTestData(TrainPlan plan, LabelledData train, LabelledData test) {
        return new TrainingRun(plan, train.followedBy(test), new Split(range(0, train.rows()),
                range(train.rows(), train.rows() + test.rows())));
    }

    private TrainingRun(TrainPlan plan, LabelledData data, Split fixedSplit) {
        this(plan, PreparedRows.of(plan, data, fixedSplit));
    }

    private TrainingRun(TrainPlan plan, PreparedRows prepared) {
        this.config = plan.config();
        this.search = plan.search();
        this.prepared = prepared;
        this.data = prepared.data();
        this.fixedSplit = prepared.fixedSplit();
        this.labels = List.copyOf(new TreeSet<>(data.labels()));
        if (labels.size() < 2) {
            throw new PressmarkException("one-class", data.labelColumn() + ": every row has the label \"" + labels.get(0)
                    + "\"; a classifier needs at least two labels");
        }
        this.y = new int[data.rows()];
        for (int i = 0; i < y.length; i++) {
            y[i] = labels.indexOf(data.labels().get(i));
        }
        this.positiveClass = positiveClass(config.data().positive(), labels);
        requireTextInEveryColumn(data);
        this.fitter = new PipelineFitter(config.tokenizers(), config.features(), config.data().text());
        RowGroups byColumn = rowGroups(config.data().group(), data);
        this.groups = config.data().duplicates() == DuplicatesMode.GROUP
                ? RowGroups.joined(byColumn, prepared.textIds(), data.texts()) : byColumn;
        this.caseWeights = caseWeights(config.data().weight(), data);
    }

    private static double[] caseWeights(String column, LabelledData data) {
        if (column == null) {
            return null;
        }
        if (!data.hasWeights()) {
            throw new IllegalArgumentException("data.weight is \"" + column + "\", but the data was read without that column");
        }
        return data.weights();
    }

    /** The case weights of {@code rows} (indices into the data), or null when rows are unweighted. */
    double[] weightsOf(int[] rows) {
        if (caseWeights == null) {
            return null;
        }
        double[] out = new double[rows.length];
        for (int i = 0; i < rows.length; i++) {
            out[i] = caseWeights[rows[i]];
        }
        return out;
    }

    private static RowGroups rowGroups(String column, LabelledData data) {
        if (column == null) {
            return null;
        }
        if (!data.hasGroups()) {
            throw new IllegalArgumentException("data.group is \"" + column + "\", but the data was read without that column");
        }
        return RowGroups.of(data.groups(), data.rowNumbers());
    }

    private static void requireTextInEveryColumn(LabelledData data) {
        for (int c = 0; c < data.textColumns().size(); c++) {
            boolean any = false;
            for (int i = 0; i < data.rows() && !any; i++) {
                any = !data.texts().get(i)[c].isBlank();
            }
            if (!any) {
                throw new PressmarkException("empty-column", "text column \"" + data.textColumns().get(c)
                        + "\" is empty in every row; drop it from data.text");
            }
        }
    }

    /** Fails early, naming the label, when a fold could not hold a row of every class. */
    private void requireEnoughRowsForFolds(int[] trainLabels) {
        int[] counts = new int[labels.size()];
        for (int label : trainLabels) {
            counts[label]++;
        }
        int folds = config.evaluation().folds();
        for (int k = 0; k < counts.length; k++) {
            if (counts[k] < folds) {
                throw new PressmarkException(Resampling.FOLDS_EXCEED_CLASS, "evaluation.folds is " + folds + ", but label \""
                        + labels.get(k) + "\" has only " + counts[k] + " rows in the training part; lower evaluation.folds"
                        + " (at most " + Math.max(2, counts[k]) + ") or add rows");
            }
        }
    }

    private static int positiveClass(String positive, List<String> labels) {
        int index = positive == null ? 1 : labels.indexOf(positive);
        if (index < 0) {
            throw new PressmarkException("unknown-positive", "data.positive \"" + positive + "\" is not a label; the labels are "
                    + String.join(", ", labels));
        }
        return labels.size() > 2 ? -1 : index;
    }

    public List<String> labels() {
        return labels;
    }

    /** The rows this run reads: the data given, or the training rows followed by the test rows. */
    public LabelledData data() {
        return data;
    }

    /** The positive class, or -1 for more than two classes. */
    public int positiveClass() {
        return positiveClass;
    }

    /** Runs everything; progress goes to {@code progress}. */
    public Result run(Progress progress) {
        long seed = config.split().seed();
        List<String> warnings = new ArrayList<>();
        Split split;
        Grouping grouping = null;
        if (fixedSplit != null) {
            split = fixedSplit;
            grouping = groups == null ? null : new Grouping(groups.count(), Double.NaN);
        } else if (groups != null) {
            GroupedSplit grouped = Resampling.groupedStratifiedSplit(y, groups.ids(), labels.size(),
                    config.split().testFraction(), seed);
            split = grouped.split();
            grouping = new Grouping(groups.count(), grouped.achievedTestFraction());
            for (OversizedGroup group : grouped.oversized()) {
                warnings.add(String.format(Locale.ROOT, "split: group \"%s\" has %d rows, more than the test part's %d;"
                        + " it stays in the training part", groups.name(group.group()), group.rows(), group.limit()));
            }
        } else {
            split = split(seed);
        }
        int[] trainRows = split.train();
        int[] trainLabels = select(y, trainRows);
        requireEnoughRowsForFolds(trainLabels);
        List<Fold> folds = groups == null
                ? Resampling.stratifiedKFold(trainLabels, labels.size(), config.evaluation().folds(), config.evaluation().repeats(), seed)
                : groupedFolds(trainRows, trainLabels, seed, warnings);
        Resampled resampled = new Resampled(split, folds, grouping, warnings);
        if (search != null) {
            SearchRun.Outcome outcome = new SearchRun(this, search, config.evaluation(), trainRows, trainLabels, folds).run(progress);
            TrainConfig chosen = search.configs().get(outcome.summary().chosen());
            return new TrainingRun(TrainPlan.of(chosen), prepared).finish(resampled, trainLabels, outcome.chosenFolds(),
                    progress, new Searched(outcome.summary(), chosen));
        }
        return finish(resampled, trainLabels, crossValidate(trainRows, trainLabels, folds, progress), progress, null);
    }

    /** The split and folds a run made, with what grouping did and the warnings it gave. */
    private record Resampled(Split split, List<Fold> folds, Grouping grouping, List<String> warnings) {
    }

    /** Grouped folds over the training part; a label in fewer groups than folds is an error naming it. */
    private List<Fold> groupedFolds(int[] trainRows, int[] trainLabels, long seed, List<String> warnings) {
        int folds = config.evaluation().folds();
        GroupedFolds grouped;
        try {
            grouped = Resampling.groupedStratifiedKFold(trainLabels, select(groups.ids(), trainRows), labels.size(), folds,
                    config.evaluation().repeats(), seed);
        } catch (TooFewGroupsException e) {
            throw new PressmarkException(e.code(), "evaluation.folds is " + folds + ", but label \"" + labels.get(e.classIndex())
                    + "\" has rows in only " + e.groups() + " group" + (e.groups() == 1 ? "" : "s") + " of " + groupingName()
                    + " in the training part; lower evaluation.folds (at most "
                    + Math.max(2, e.groups()) + ") or add groups", e);
        }
        for (OversizedGroup group : grouped.oversized()) {
            warnings.add(String.format(Locale.ROOT, "folds: group \"%s\" has %d rows, more than a fold's share of %d;"
                    + " its fold is larger than the others", groups.name(group.group()), group.rows(), group.limit()));
        }
        return grouped.folds();
    }

    /** What makes the groups, for messages: the group column, identical texts, or both. */
    private String groupingName() {
        String column = config.data().group() == null ? null : "data.group \"" + config.data().group() + "\"";
        if (config.data().duplicates() != DuplicatesMode.GROUP) {
            return column;
        }
        return (column == null ? "" : column + " joined with ") + "the groups of identical texts (data.duplicates: group)";
    }

    /** Platt sigmoids from the folds, the final model on the whole training part, and the test part scored once. */
    private Result finish(Resampled resampled, int[] trainLabels, List<FoldResult> results, Progress progress, Searched searched) {
        long seed = config.split().seed();
        Split split = resampled.split();
        int[] trainRows = split.train();
        List<MetricValues> foldMetrics = new ArrayList<>();
        List<String> warnings = new ArrayList<>(resampled.warnings());
        for (FoldResult result : results) {
            foldMetrics.add(result.evaluation.overall());
            result.warning.ifPresent(w -> warnings.add("fold " + (result.fold.index() + 1) + ": " + w));
        }
        List<PlattScaling> platt = List.of();
        if (config.classifier().kind() == ClassifierConfig.Kind.LINEAR_SVM && config.classifier().hasProbabilities()) {
            platt = PlattScaling.fitScores(outOfFold(results, trainLabels.length), trainLabels, weightsOf(trainRows), labels.size());
        }

        PipelineFitter.Fitted fitted = fitter.fit(rows(trainRows), progress);
        progress.start("final model", 3);
        progress.advance(1);
        Trained trained = train(config.classifier(), fitted.x(), trainLabels, weightsOf(trainRows), seed, null);
        trained.warning.ifPresent(w -> warnings.add("final model: " + w));
        ModelWeights model = new ModelWeights(kindKey(), trained.model.weights(), platt);
        progress.advance(2);
        Evaluation test = evaluate(model.classifier(), fitted.pipeline().transform(rows(split.test())), select(y, split.test()),
                weightsOf(split.test()), "the test part");
        progress.advance(3);
        progress.finish();
        warnings.forEach(progress::note);
        return new Result(labels, positiveClass, fitted.pipeline(), model, FoldSummary.of(foldMetrics), test,
                trainRows, split.test(), warnings, searched, resampled.grouping(),
                RowAssignments.foldOfRow(data.rows(), split, resampled.folds()),
                DuplicateCounts.count(prepared.textIds(), y, split, config.data().duplicates().key(), prepared.droppedRows()));
    }

    private Split split(long seed) {
        if (config.split().stratify()) {
            return Resampling.stratifiedSplit(y, labels.size(), config.split().testFraction(), seed);
        }
        int[] order = new int[y.length];
        for (int i = 0; i < order.length; i++) {
            order[i] = i;
        }
        SplittableRandom random = new SplittableRandom(seed);
        for (int i = order.length - 1; i > 0; i--) {
            int j = random.nextInt(i + 1);
            int t = order[i];
            order[i] = order[j];
            order[j] = t;
        }
        int testCount = (int) Math.round(config.split().testFraction() * y.length);
        int[] test = java.util.Arrays.copyOfRange(order, 0, testCount);
        int[] train = java.util.Arrays.copyOfRange(order, testCount, order.length);
        java.util.Arrays.sort(test);
        java.util.Arrays.sort(train);
        return new Split(train, test);
    }

    /** One fold's evaluation, its held-out decision values (null when nothing needs them), and a solver warning. */
    record FoldResult(Fold fold, Evaluation evaluation, double[][] decisionValues, Optional<String> warning) {
    }

    record Trained(LinearClassifier model, Optional<String> warning) {
    }

    private List<FoldResult> crossValidate(int[] trainRows, int[] trainLabels, List<Fold> folds, Progress progress) {
        int threads = Math.min(config.evaluation().effectiveThreads(), folds.size());
        ExecutorService pool = Workers.pool(threads, "pressmark-fold");
        AtomicInteger done = new AtomicInteger();
        progress.start("folds", folds.size());
        try {
            List<Future<FoldResult>> futures = new ArrayList<>();
            for (Fold fold : folds) {
                futures.add(pool.submit(() -> {
                    FoldResult result = runFold(fold, trainRows, trainLabels);
                    int finished = done.incrementAndGet();
                    synchronized (progress) {
                        progress.advance(finished);
                    }
                    return result;
                }));
            }
            return Workers.await(futures, "training");
        } finally {
            pool.shutdownNow();
            progress.finish();
        }
    }

    private FoldResult runFold(Fold fold, int[] trainRows, int[] trainLabels) {
        int[] foldTrain = select(trainRows, fold.train());
        int[] foldTest = select(trainRows, fold.test());
        PipelineFitter.Fitted fitted = fitter.fit(rows(foldTrain), Progress.NONE);
        Trained trained = train(config.classifier(), fitted.x(), select(trainLabels, fold.train()), weightsOf(foldTrain),
                foldSeed(fold), null);
        SparseMatrix xTest = fitted.pipeline().transform(rows(foldTest));
        return foldResult(fold, trained, xTest, select(trainLabels, fold.test()), weightsOf(foldTest), true);
    }

    /**
     * The result of {@code trained} on a fold's held-out rows (of case weights {@code weights}, or
     * null for all 1), with their decision values when {@code keepValues}.
     */
    FoldResult foldResult(Fold fold, Trained trained, SparseMatrix xTest, int[] truth, double[] weights, boolean keepValues) {
        Evaluation evaluation = evaluate(trained.model, xTest, truth, weights,
                "fold " + (fold.index() + 1) + (fold.repeat() > 0 ? " of repeat " + (fold.repeat() + 1) : ""));
        double[][] values = null;
        if (keepValues) {
            values = new double[trained.model.weights().numScores()][];
            for (int k = 0; k < values.length; k++) {
                values[k] = trained.model.decisionColumn(xTest, k);
            }
        }
        return new FoldResult(fold, evaluation, values, trained.warning);
    }

    long foldSeed(Fold fold) {
        return new SplittableRandom(config.split().seed() + 0x9E3779B97F4A7C15L * (1L + fold.repeat() * 1_000_003L + fold.index()))
                .nextLong();
    }

    /** The decision values of every training row from the fold that held it out, first repeat only. */
    private static double[][] outOfFold(List<FoldResult> results, int rows) {
        double[][] values = null;
        for (FoldResult result : results) {
            if (result.fold.repeat() != 0) {
                continue;
            }
            if (values == null) {
                values = new double[result.decisionValues.length][rows];
            }
            int[] held = result.fold.test();
            for (int k = 0; k < values.length; k++) {
                for (int i = 0; i < held.length; i++) {
                    values[k][held[i]] = result.decisionValues[k][i];
                }
            }
        }
        return values;
    }

    /**
     * Trains {@code classifier} on {@code x}, whose rows have the case weights {@code rowWeights}
     * (null for all 1); {@code warm}, when not null, carries the previous C's solution.
     */
    Trained train(ClassifierConfig classifier, SparseMatrix x, int[] labels, double[] rowWeights, long seed, WarmStart warm) {
        ClassWeights weights = classifier.classWeight().resolve(this.labels);
        int k = this.labels.size();
        if (classifier.kind() == ClassifierConfig.Kind.LOGISTIC_REGRESSION) {
            var model = new LogisticTrainer(classifier.logisticConfig(), weights).train(x, labels, rowWeights, k, seed, warm);
            return new Trained(model, model.warning());
        }
        var model = new SvmTrainer(classifier.svmConfig(), weights).train(x, labels, rowWeights, k, seed, warm);
        return new Trained(model, model.warning());
    }

    /** Scores {@code model} on {@code x}, each row counting its case weight (all 1 when {@code weights} is null). */
    private Evaluation evaluate(LinearClassifier model, SparseMatrix x, int[] truth, double[] weights, String part) {
        requireSomeWeight(weights, part);
        int[] predicted = model.predict(x);
        if (labels.size() == 2) {
            double[] scores = model.decisionColumn(x, 0);
            if (positiveClass == 0) {
                for (int i = 0; i < scores.length; i++) {
                    scores[i] = -scores[i];
                }
            }
            return Evaluation.binary(truth, predicted, scores, weights, positiveClass);
        }
        int k = labels.size();
        double[] scores = new double[x.rows() * k];
        double[] row = new double[k];
        for (int i = 0; i < x.rows(); i++) {
            model.weights().decisionValues(x, i, row);
            System.arraycopy(row, 0, scores, i * k, k);
        }
        return Evaluation.multiClass(truth, predicted, scores, weights, k);
    }

    private void requireSomeWeight(double[] weights, String part) {
        if (weights == null) {
            return;
        }
        for (double w : weights) {
            if (w > 0.0) {
                return;
            }
        }
        throw new PressmarkException("zero-weight", part + ": every one of its " + weights.length + " rows has case weight 0"
                + " in column \"" + config.data().weight() + "\", so nothing there can be scored; give some of them weight");
    }

    private String kindKey() {
        return config.classifier().kind() == ClassifierConfig.Kind.LOGISTIC_REGRESSION
                ? ModelWeights.LOGISTIC_REGRESSION : ModelWeights.LINEAR_SVM;
    }

    List<String[]> rows(int[] indices) {
        List<String[]> rows = new ArrayList<>(indices.length);
        for (int i : indices) {
            rows.add(data.texts().get(i));
        }
        return rows;
    }

    private static int[] range(int from, int to) {
        int[] out = new int[to - from];
        for (int i = 0; i < out.length; i++) {
            out[i] = from + i;
        }
        return out;
    }

    static int[] select(int[] values, int[] indices) {
        int[] out = new int[indices.length];
        for (int i = 0; i < indices.length; i++) {
            out[i] = values[indices[i]];
        }
        return out;
    }
}
