-- The store's tables. Times are milliseconds since 1970-01-01T00:00:00Z, UTC.
-- ${id_pk} and ${bytes} are set per database by the store (Dialect).

CREATE TABLE models (
    name VARCHAR(64) NOT NULL PRIMARY KEY,
    created_at BIGINT NOT NULL
);

-- A published version: immutable except retired_at, which is set once.
CREATE TABLE versions (
    id ${id_pk},
    model VARCHAR(64) NOT NULL REFERENCES models (name),
    tag VARCHAR(64) NOT NULL,
    sha256 CHAR(64) NOT NULL,
    size BIGINT NOT NULL,
    created_at BIGINT NOT NULL,
    manifest_json TEXT NOT NULL,
    bundle ${bytes} NOT NULL,
    retired_at BIGINT,
    CONSTRAINT versions_model_tag UNIQUE (model, tag)
);

-- Append-only. The newest row of a model names its active version; seq is the change feed.
-- parent_seq is the row this one replaced on the rollback stack (see JdbcBundleStore.rollback).
CREATE TABLE activations (
    seq ${id_pk},
    model VARCHAR(64) NOT NULL,
    tag VARCHAR(64) NOT NULL,
    activated_at BIGINT NOT NULL,
    actor VARCHAR(200) NOT NULL,
    reason TEXT NOT NULL,
    is_rollback INTEGER NOT NULL,
    parent_seq BIGINT REFERENCES activations (seq),
    CONSTRAINT activations_version FOREIGN KEY (model, tag) REFERENCES versions (model, tag)
);
CREATE INDEX activations_by_model ON activations (model, seq);

-- Audit trail of every change.
CREATE TABLE events (
    id ${id_pk},
    at BIGINT NOT NULL,
    actor VARCHAR(200) NOT NULL,
    action VARCHAR(32) NOT NULL,
    model VARCHAR(64) NOT NULL,
    tag VARCHAR(64) NOT NULL,
    detail TEXT NOT NULL
);
CREATE INDEX events_by_model ON events (model, id);
