-- Shadow scoring: a candidate version scored beside the active one on a sample of live traffic.
-- ${double} is set per database by the store (Dialect). Times are milliseconds since 1970, UTC.
-- (There is no V2 on this line of the schema; Flyway allows the gap.)

-- At most one shadow per model. started_at identifies the run: every start is a new run.
CREATE TABLE shadows (
    model VARCHAR(64) NOT NULL PRIMARY KEY REFERENCES models (name),
    tag VARCHAR(64) NOT NULL,
    fraction ${double} NOT NULL,
    started_at BIGINT NOT NULL,
    actor VARCHAR(200) NOT NULL,
    CONSTRAINT shadows_version FOREIGN KEY (model, tag) REFERENCES versions (model, tag)
);

-- Each replica's snapshot of one run, replaced as the run goes on and kept after it stops.
CREATE TABLE shadow_reports (
    model VARCHAR(64) NOT NULL,
    tag VARCHAR(64) NOT NULL,
    replica VARCHAR(200) NOT NULL,
    run_started_at BIGINT NOT NULL,
    updated_at BIGINT NOT NULL,
    report_json TEXT NOT NULL,
    PRIMARY KEY (model, tag, replica, run_started_at)
);
CREATE INDEX shadow_reports_by_run ON shadow_reports (model, run_started_at);
