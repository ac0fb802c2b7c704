"""The reference side of scripts/bench-solver.sh: one large feature matrix, solved by the C LIBLINEAR.

    python3 bench_solver.py SET.csv DIR C TOLERANCE REPEATS

Builds a character n-gram tf-idf matrix of the place names of cities-country.csv with
scikit-learn (TfidfVectorizer(analyzer="char_wb", ngram_range=(1, 5), sublinear_tf=True,
min_df=2), l2-normalised rows), labels each row +1 when its country's main language is a Romance
one (IT FR ES MX BR RO) and -1 otherwise (US DE IN CN RU GB), and writes:

  DIR/problem.svm        the matrix in the svmlight / libsvm text format, indices from 1
                         (sklearn.datasets.dump_svmlight_file, zero_based=False)
  DIR/reference.w        LinearSVC's weights, one per line, feature 1 first
  DIR/reference.json     rows, features, non-zeros, C, tolerance, solve times, passes, objective

LinearSVC(loss="squared_hinge", dual=True, fit_intercept=False, C, tol, max_iter=1000) runs
LIBLINEAR's L2R_L2LOSS_SVC_DUAL solver in C (scikit-learn ships LIBLINEAR 2.x's C++ sources);
without an intercept the problem it solves is exactly

    min_w  1/2 ||w||^2 + C sum_i max(0, 1 - y_i w.x_i)^2

and that objective is computed here from its weights. Each of REPEATS fits is timed with
time.perf_counter around fit(), which also converts the CSR matrix to LIBLINEAR's rows; the same
fit stopped after one pass is timed too, as a bound on that overhead.
"""

import csv
import json
import os
import statistics
import sys
import time
import warnings

import numpy as np
from sklearn.datasets import dump_svmlight_file
from sklearn.exceptions import ConvergenceWarning
from sklearn.feature_extraction.text import TfidfVectorizer
from sklearn.svm import LinearSVC

ROMANCE = {"IT", "FR", "ES", "MX", "BR", "RO"}
SEED = 7


def main(source, out_dir, c, tolerance, repeats):
    c, tolerance, repeats = float(c), float(tolerance), int(repeats)
    with open(source, encoding="utf-8", newline="") as f:
        rows = list(csv.DictReader(f))
    texts = [r["text"] for r in rows]
    y = np.array([1 if r["label"] in ROMANCE else -1 for r in rows])
    x = TfidfVectorizer(analyzer="char_wb", ngram_range=(1, 5), sublinear_tf=True, min_df=2).fit_transform(texts)
    x.sort_indices()
    os.makedirs(out_dir, exist_ok=True)
    dump_svmlight_file(x, y, os.path.join(out_dir, "problem.svm"), zero_based=False,
                       comment="char_wb 1-5 tf-idf of the place names of %s" % os.path.basename(source))
    times, model = [], None
    for _ in range(repeats):
        model = LinearSVC(C=c, loss="squared_hinge", dual=True, fit_intercept=False, tol=tolerance,
                          max_iter=1000, random_state=SEED)
        start = time.perf_counter()
        model.fit(x, y)
        times.append(time.perf_counter() - start)
    # The same fit stopped after one pass: the conversion to LIBLINEAR's rows, the solver's set-up
    # and one pass, an upper bound on what fit() spends outside the passes.
    one_pass = []
    for _ in range(repeats):
        short = LinearSVC(C=c, loss="squared_hinge", dual=True, fit_intercept=False, tol=tolerance,
                          max_iter=1, random_state=SEED)
        start = time.perf_counter()
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", ConvergenceWarning)
            short.fit(x, y)
        one_pass.append(time.perf_counter() - start)
    w = model.coef_.ravel()
    # classes_ is [-1, 1], so coef_ scores class +1: the margin of row i is y_i w.x_i.
    margins = y * (x @ w)
    objective = 0.5 * float(w @ w) + c * float(np.sum(np.maximum(0.0, 1.0 - margins) ** 2))
    np.savetxt(os.path.join(out_dir, "reference.w"), w, fmt="%.17g")
    result = {
        "rows": x.shape[0], "features": x.shape[1], "non_zeros": int(x.nnz), "positives": int(np.sum(y == 1)),
        "c": c, "tolerance": tolerance, "passes": int(model.n_iter_), "objective": objective,
        "times_s": times, "median_s": statistics.median(times), "min_s": min(times),
        "one_pass_median_s": statistics.median(one_pass),
    }
    with open(os.path.join(out_dir, "reference.json"), "w") as f:
        json.dump(result, f, indent=1)
    print(json.dumps(result))


if __name__ == "__main__":
    main(*sys.argv[1:])
