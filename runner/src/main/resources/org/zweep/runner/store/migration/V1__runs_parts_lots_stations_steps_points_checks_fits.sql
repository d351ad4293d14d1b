-- The results index (zweep-index schema 1). The same statements run on SQLite and PostgreSQL.
-- Every row comes from a run folder (run.json, points.csv, the analysis of both): the folders are
-- the source of truth and `zweep index DIR...` rebuilds these tables from them.

CREATE TABLE stations (
    name VARCHAR(200) NOT NULL PRIMARY KEY
);

CREATE TABLE lots (
    name VARCHAR(200) NOT NULL PRIMARY KEY
);

CREATE TABLE parts (
    serial VARCHAR(200) NOT NULL,
    part_name VARCHAR(200) NOT NULL,
    kind VARCHAR(40),
    PRIMARY KEY (serial, part_name)
);

CREATE TABLE runs (
    run_id VARCHAR(64) NOT NULL PRIMARY KEY,
    folder TEXT NOT NULL,
    sequence_name TEXT,
    sequence_sha256 TEXT,
    part_name TEXT,
    part_kind TEXT,
    nominal DOUBLE PRECISION,
    nominal_unit TEXT,
    tolerance_percent DOUBLE PRECISION,
    serial TEXT,
    lot TEXT,
    operator_name TEXT,
    station TEXT,
    meter_address TEXT,
    meter_identity TEXT,
    host TEXT,
    seed BIGINT,
    compensation_mode TEXT,
    compensation_source TEXT,
    compensation_reused_from TEXT,
    compensation_measured_at TEXT,
    started TEXT,
    ended TEXT,
    outcome TEXT,
    verdict TEXT,
    planned INTEGER,
    measured INTEGER
);

CREATE INDEX runs_by_part ON runs (part_name);
CREATE INDEX runs_by_serial ON runs (serial);
CREATE INDEX runs_by_lot ON runs (lot);
CREATE INDEX runs_by_started ON runs (started);

CREATE TABLE steps (
    run_id VARCHAR(64) NOT NULL,
    step_index INTEGER NOT NULL,
    name TEXT NOT NULL,
    points INTEGER NOT NULL,
    PRIMARY KEY (run_id, step_index)
);

CREATE TABLE points (
    run_id VARCHAR(64) NOT NULL,
    point_no INTEGER NOT NULL,
    step TEXT NOT NULL,
    step_index INTEGER NOT NULL,
    repeat_no INTEGER NOT NULL,
    quantity TEXT NOT NULL,
    wiring TEXT NOT NULL,
    frequency_hz DOUBLE PRECISION,
    drive TEXT,
    drive_level DOUBLE PRECISION,
    bias_mode TEXT,
    bias DOUBLE PRECISION,
    r_ohm DOUBLE PRECISION,
    x_ohm DOUBLE PRECISION,
    ratio DOUBLE PRECISION,
    status TEXT NOT NULL,
    point_check TEXT,
    measured_at TEXT NOT NULL,
    PRIMARY KEY (run_id, point_no)
);

CREATE TABLE checks (
    run_id VARCHAR(64) NOT NULL,
    check_index INTEGER NOT NULL,
    name TEXT NOT NULL,
    parameter TEXT NOT NULL,
    step TEXT,
    frequency_hz DOUBLE PRECISION,
    lower_limit DOUBLE PRECISION,
    upper_limit DOUBLE PRECISION,
    check_value DOUBLE PRECISION,
    value_count INTEGER,
    result TEXT,
    expanded_u DOUBLE PRECISION,
    probability DOUBLE PRECISION,
    PRIMARY KEY (run_id, check_index)
);

CREATE INDEX checks_by_name ON checks (name);

CREATE TABLE fits (
    run_id VARCHAR(64) NOT NULL,
    step_index INTEGER NOT NULL,
    sweep_no INTEGER NOT NULL,
    sweep TEXT NOT NULL,
    model TEXT NOT NULL,
    parameter TEXT NOT NULL,
    fit_value DOUBLE PRECISION,
    sigma DOUBLE PRECISION,
    PRIMARY KEY (run_id, step_index, sweep_no, parameter)
);
