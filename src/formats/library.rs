//! The job library's stored form, with no browser in it: how a job is written to one storage
//! entry and read back, how damaged entries are recognised (and kept, never dropped), and how
//! names and ids are chosen. The UI (`ui::storage`) does the storage I/O around these
//! functions.
//!
//! Each job is one local-storage entry, `phasewise.job.<id>`, holding a [`SavedJob`] envelope
//! as JSON. There is no index entry to go stale: the list is the entries themselves.
//!
//! # Keys and store versions
//!
//! An entry holds
//! `{"format": "phasewise-saved-job", "store_version": 1, "changed_ms": ..., "job": {job file}}`;
//! [`LAST_OPEN_KEY`] (`phasewise.last-open`) holds the id opened last. Store format 1 is kept
//! as `src/formats/tests/fixtures/saved-job-v1.json`. `upgrade` brings an entry of any earlier
//! format up one step at a time; a new format bumps [`STORE_VERSION`], adds its step there and
//! keeps a fixture of the format before it (the unit test
//! `every_store_format_has_a_fixture_that_reads` fails until it exists). A newer format than
//! this build knows is kept aside as damaged, never rewritten.
//!
//! # Damaged entries
//!
//! An entry that does not read (not JSON, not a saved job, a newer format, a job that fails
//! the job-file reader) is `Damaged` ([`read_entry`]): listed with its reason, offered as a
//! download, never written over (only the open job's key is ever written) and never removed
//! unless the user deletes it.
//!
//! # Saving, export and import
//!
//! The autosave stores only an entry that reads back equal ([`entry_to_store`]): a field left
//! empty or holding text is NaN in the job, which JSON would write as `null` and never read
//! back, so while one is marked the copy saved before is kept and the jobs area says why.
//!
//! Export: the open job as a job file, or all jobs as
//! `{"format": "phasewise-jobs", "jobs": [...]}` ([`export_all`]). The open job is exported,
//! and a share link made, only when its file reads back equal ([`job_file`]): while a number
//! field is empty or holds text the job holds NaN, which JSON would write as `null`; the user
//! is told which field to fill instead.
//! Import ([`parse_import`]) takes either, at most 2 MB ([`IMPORT_LIMIT_BYTES`]), reads each
//! job with the job-file reader and checks it with the engine's validation; any problem
//! refuses the whole file with a sentence, so an import adds everything or changes nothing. A
//! name already in the list gets " (2)", " (3)" ([`unique_name`]): an import never writes over
//! a job.

use phasewise_engine::job::{Job, JobFileError};
use serde::{Deserialize, Serialize};

/// The envelope's version. Raise it when the envelope (not the job inside) changes, and add
/// the step to [`upgrade`].
pub const STORE_VERSION: u32 = 1;
/// The key prefix of job entries.
pub const JOB_PREFIX: &str = "phasewise.job.";
/// The key holding the id of the job open last.
pub const LAST_OPEN_KEY: &str = "phasewise.last-open";
const FORMAT: &str = "phasewise-saved-job";

/// One stored job.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct SavedJob {
    pub format: String,
    pub store_version: u32,
    /// When it was last saved, in milliseconds since 1970 (the browser's clock).
    pub changed_ms: f64,
    pub job: Job,
}

/// What a storage entry turned out to hold.
// A library holds tens of entries, read once: boxing the good one would buy nothing.
#[allow(clippy::large_enum_variant)]
#[derive(Clone, Debug, PartialEq)]
pub enum Entry {
    Good {
        id: String,
        saved: SavedJob,
    },
    /// Kept exactly as found, so nothing is lost; offered to the user as a download.
    Damaged {
        id: String,
        raw: String,
        reason: String,
    },
}

impl Entry {
    pub fn id(&self) -> &str {
        match self {
            Entry::Good { id, .. } | Entry::Damaged { id, .. } => id,
        }
    }
}

/// The storage key of a job id.
pub fn key_of(id: &str) -> String {
    format!("{JOB_PREFIX}{id}")
}

/// The job id of a storage key, if the key is a job entry's.
pub fn id_of(key: &str) -> Option<&str> {
    key.strip_prefix(JOB_PREFIX).filter(|id| !id.is_empty())
}

/// The stored text for a job.
pub fn write_entry(job: &Job, changed_ms: f64) -> String {
    let saved = SavedJob {
        format: FORMAT.into(),
        store_version: STORE_VERSION,
        changed_ms,
        job: job.clone(),
    };
    serde_json::to_string(&saved).expect("a saved job always serialises")
}

/// The text to store for `job`, or why it cannot be stored yet. A number field left empty or
/// holding text is NaN in the job, which JSON cannot hold (it would be written as `null` and
/// never read back): such an entry must not replace the good copy saved before.
pub fn entry_to_store(job: &Job, changed_ms: f64) -> Result<String, String> {
    let text = write_entry(job, changed_ms);
    match read_entry("check", &text) {
        Entry::Good { saved, .. } if saved.job == *job => Ok(text),
        _ => Err("a field holds no number yet (it is marked); the copy saved before is kept until every field has one".into()),
    }
}

/// The open job as a job file to export or share, or why not: while a number field is empty
/// or holds text the job holds NaN, which JSON cannot carry (it would be written as `null`,
/// and the file would then be refused on import).
pub fn job_file(job: &Job) -> Result<String, String> {
    let text = job.to_json();
    match Job::from_json(&text) {
        Ok(back) if back == *job => Ok(text),
        _ => Err(HALF_TYPED.into()),
    }
}

/// Why a job with an empty or non-number field is not exported or shared.
pub const HALF_TYPED: &str =
    "a field holds no number yet (it is marked in red): fill it in, then try again";

/// Brings a stored entry of format `from` up to [`STORE_VERSION`], one format at a time.
/// A new format adds its step here and a fixture `tests/fixtures/saved-job-v<N>.json` of the
/// format before it (the test `every_store_format_has_a_fixture_that_reads` asks for it).
fn upgrade(entry: serde_json::Value, from: u32) -> Result<serde_json::Value, String> {
    match from {
        STORE_VERSION => Ok(entry),
        other => Err(format!(
            "it has store format {other}, which no Phasewise wrote"
        )),
    }
}

/// Reads a stored entry. Anything that is not a readable saved job of a known version is
/// `Damaged`, with the reason in words and the text untouched.
pub fn read_entry(id: &str, raw: &str) -> Entry {
    let damaged = |reason: String| Entry::Damaged {
        id: id.to_string(),
        raw: raw.to_string(),
        reason,
    };
    let value: serde_json::Value = match serde_json::from_str(raw) {
        Ok(v) => v,
        Err(e) => return damaged(format!("it is not readable ({e})")),
    };
    if value.get("format").and_then(|f| f.as_str()) != Some(FORMAT) {
        return damaged("it is not a Phasewise saved job".into());
    }
    let value = match value.get("store_version").and_then(|v| v.as_u64()) {
        Some(v) if v > u64::from(STORE_VERSION) => {
            return damaged(format!(
                "it was saved by a newer Phasewise (store format {v})"
            ))
        }
        Some(v) => match upgrade(value, v as u32) {
            Ok(value) => value,
            Err(why) => return damaged(why),
        },
        None => return damaged("it has no known store format".into()),
    };
    let changed_ms = value
        .get("changed_ms")
        .and_then(|c| c.as_f64())
        .unwrap_or(0.0);
    let Some(job) = value.get("job") else {
        return damaged("it holds no job".into());
    };
    // The job inside goes through the job file reader, with its own version check.
    match Job::from_json(&job.to_string()) {
        Ok(job) => Entry::Good {
            id: id.to_string(),
            saved: SavedJob {
                format: FORMAT.into(),
                store_version: STORE_VERSION,
                changed_ms,
                job,
            },
        },
        Err(JobFileError::TooNew { version }) => damaged(format!(
            "its job was saved by a newer Phasewise (format {version})"
        )),
        Err(JobFileError::Unreadable(why)) => damaged(format!("its job cannot be read ({why})")),
    }
}

/// A new id: the time, and a counter if that is taken.
pub fn new_id(now_ms: f64, taken: &[&str]) -> String {
    let base = format!("{:x}", now_ms.max(0.0) as u64);
    let mut id = base.clone();
    let mut n = 1;
    while taken.contains(&id.as_str()) {
        n += 1;
        id = format!("{base}-{n}");
    }
    id
}

/// `name`, or `name (2)`, `name (3)`, ... so that no two jobs in the list share a name.
pub fn unique_name(name: &str, taken: &[&str]) -> String {
    let name = if name.trim().is_empty() {
        "Untitled job"
    } else {
        name.trim()
    };
    if !taken.contains(&name) {
        return name.to_string();
    }
    (2..)
        .map(|n| format!("{name} ({n})"))
        .find(|candidate| !taken.contains(&candidate.as_str()))
        .expect("an unused name")
}

/// Whether `stored` is `name` or the name [`unique_name`] gives it beside others ("Baler (2)").
pub fn is_name_of(stored: &str, name: &str) -> bool {
    let name = name.trim();
    stored == name
        || stored
            .strip_prefix(name)
            .and_then(|rest| rest.strip_prefix(" ("))
            .and_then(|rest| rest.strip_suffix(')'))
            .is_some_and(|n| !n.is_empty() && n.bytes().all(|b| b.is_ascii_digit()))
}

/// The largest file the import reads: far above any real set of jobs, far below what would
/// stall a phone.
pub const IMPORT_LIMIT_BYTES: usize = 2 * 1024 * 1024;
const BUNDLE: &str = "phasewise-jobs";

/// Several jobs in one file: `{"format": "phasewise-jobs", "jobs": [job file, ...]}`.
/// Each job is written as its own job file is ([`Job::to_json`]), indented into the list: one
/// way of writing a job, and no second copy of it in the module.
pub fn export_all(jobs: &[&Job]) -> String {
    let mut out = format!("{{\n  \"format\": \"{BUNDLE}\",\n  \"jobs\": [");
    for (i, job) in jobs.iter().enumerate() {
        out.push_str(if i == 0 { "\n" } else { ",\n" });
        // JSON strings hold no raw line breaks, so indenting each line changes no value.
        for (k, line) in job.to_json().lines().enumerate() {
            out.push_str(if k == 0 { "    " } else { "\n    " });
            out.push_str(line);
        }
    }
    out.push_str("\n  ]\n}");
    out
}

/// The jobs in an imported file (a job file, or several from [`export_all`]), each checked by
/// the engine's own validation, renamed where a name is taken. Any problem refuses the whole
/// file with a sentence saying what is wrong, so an import changes nothing or adds everything.
pub fn parse_import(text: &str, taken_names: &[&str]) -> Result<Vec<Job>, String> {
    if text.len() > IMPORT_LIMIT_BYTES {
        return Err(format!(
            "the file is {} KB; a Phasewise file is at most {} KB",
            text.len() / 1024,
            IMPORT_LIMIT_BYTES / 1024
        ));
    }
    let value: serde_json::Value = serde_json::from_str(text)
        .map_err(|_| "this is not a Phasewise job file (it is not JSON)".to_string())?;
    let files: Vec<String> = if value.get("format").and_then(|f| f.as_str()) == Some(BUNDLE) {
        match value.get("jobs").and_then(|j| j.as_array()) {
            Some(jobs) if !jobs.is_empty() => jobs.iter().map(|j| j.to_string()).collect(),
            _ => return Err("this Phasewise file holds no jobs".into()),
        }
    } else if value.get("schema_version").is_some() {
        vec![text.to_string()]
    } else {
        return Err("this is not a Phasewise job file".into());
    };
    let mut taken: Vec<String> = taken_names.iter().map(|n| n.to_string()).collect();
    let mut jobs = Vec::with_capacity(files.len());
    for (i, file) in files.iter().enumerate() {
        let mut job = Job::from_json(file).map_err(|e| format!("job {}: {e}", i + 1))?;
        if let Err(errors) = phasewise_engine::validate::validate(&job) {
            let first = &errors[0];
            return Err(format!(
                "job {} (“{}”) has {} problem(s), the first at {}: {}",
                i + 1,
                job.name,
                errors.len(),
                first.field,
                first.message
            ));
        }
        job.name = unique_name(
            &job.name,
            &taken.iter().map(String::as_str).collect::<Vec<_>>(),
        );
        taken.push(job.name.clone());
        jobs.push(job);
    }
    Ok(jobs)
}

/// The good entries, newest first, then the damaged ones.
pub fn sorted(mut entries: Vec<Entry>) -> Vec<Entry> {
    entries.sort_by(|a, b| match (a, b) {
        (Entry::Good { saved: x, .. }, Entry::Good { saved: y, .. }) => {
            y.changed_ms.total_cmp(&x.changed_ms)
        }
        (Entry::Good { .. }, Entry::Damaged { .. }) => std::cmp::Ordering::Less,
        (Entry::Damaged { .. }, Entry::Good { .. }) => std::cmp::Ordering::Greater,
        (x, y) => x.id().cmp(y.id()),
    });
    entries
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A blank job cannot be stored or exported half-typed: the file writer says so rather
    /// than write it.
    #[test]
    fn a_blank_job_is_refused_rather_than_written_half_typed() {
        let job = Job::blank(
            "New job".into(),
            phasewise_engine::units::UnitSystem::Si,
            "GBP".into(),
        );
        assert!(job_file(&job).is_err());
    }
    use phasewise_engine::demo::scrap_baler;
    use phasewise_engine::job::SCHEMA_VERSION;

    #[test]
    fn a_half_typed_job_is_no_job_file() {
        let mut job = scrap_baler();
        assert_eq!(Job::from_json(&job_file(&job).unwrap()).unwrap(), job);
        job.site.tariff_per_kwh = f64::NAN;
        assert_eq!(job_file(&job), Err(HALF_TYPED.to_string()));
    }

    #[test]
    fn a_saved_job_reads_back_unchanged() {
        let job = scrap_baler();
        let raw = write_entry(&job, 1_700_000_000_000.0);
        match read_entry("a1", &raw) {
            Entry::Good { id, saved } => {
                assert_eq!(id, "a1");
                assert_eq!(saved.job, job);
                assert_eq!(saved.changed_ms, 1_700_000_000_000.0);
            }
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn a_half_typed_job_is_not_stored_over_a_good_copy() {
        let job = scrap_baler();
        assert!(entry_to_store(&job, 1.0).is_ok());
        let mut half = job.clone();
        if let phasewise_engine::cycle::PhaseKind::Move(m) = &mut half.cycle[0].kind {
            m.cylinder.bore.value = f64::NAN;
        }
        // Written plainly it would not read back: JSON has no NaN.
        assert!(!matches!(
            read_entry("a1", &write_entry(&half, 1.0)),
            Entry::Good { .. }
        ));
        let why = entry_to_store(&half, 1.0).unwrap_err();
        assert!(why.contains("copy saved before is kept"), "{why}");
    }

    #[test]
    fn damaged_entries_are_kept_with_a_reason() {
        let good = write_entry(&scrap_baler(), 1.0);
        let cases = [
            ("{not json".to_string(), "not readable"),
            ("[1, 2]".to_string(), "not a Phasewise saved job"),
            (
                good.replace("\"store_version\":1", "\"store_version\":9"),
                "newer Phasewise",
            ),
            (
                good.replace(
                    &format!("\"schema_version\":{SCHEMA_VERSION}"),
                    "\"schema_version\":7",
                ),
                "newer Phasewise (format 7)",
            ),
            (
                good.replace("\"bore_m\":0.16", "\"bore_m\":\"big\""),
                "cannot be read",
            ),
            (good[..good.len() / 2].to_string(), "not readable"),
        ];
        for (raw, says) in cases {
            match read_entry("x", &raw) {
                Entry::Damaged {
                    raw: kept, reason, ..
                } => {
                    assert_eq!(kept, raw, "kept as found");
                    assert!(reason.contains(says), "{reason} / {says}");
                }
                other => panic!("{says}: {other:?}"),
            }
        }
    }

    #[test]
    fn every_store_format_has_a_fixture_that_reads() {
        // tests/fixtures/saved-job-v<N>.json: one store entry as each format wrote it, read
        // through every upgrade step to the current format.
        let fixtures = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures");
        for version in 1..=STORE_VERSION {
            let path = fixtures.join(format!("saved-job-v{version}.json"));
            let raw = std::fs::read_to_string(&path).unwrap_or_else(|_| {
                panic!(
                    "{} is missing: keep a fixture of every store format",
                    path.display()
                )
            });
            match read_entry("fixture", &raw) {
                Entry::Good { saved, .. } => assert_eq!(saved.store_version, STORE_VERSION),
                Entry::Damaged { reason, .. } => panic!("format {version} fixture: {reason}"),
            }
        }
        // Format 0 never existed: refused, and kept.
        let zero = std::fs::read_to_string(fixtures.join("saved-job-v1.json"))
            .unwrap()
            .replace("\"store_version\": 1", "\"store_version\": 0")
            .replace("\"store_version\":1", "\"store_version\":0");
        assert!(matches!(read_entry("zero", &zero), Entry::Damaged { .. }));
    }

    #[test]
    fn keys_ids_and_names() {
        assert_eq!(id_of(&key_of("18c2a")), Some("18c2a"));
        assert_eq!(id_of("phasewise.last-open"), None);
        assert_eq!(id_of("phasewise.job."), None);
        assert_eq!(new_id(255.0, &[]), "ff");
        assert_eq!(new_id(255.0, &["ff", "ff-2"]), "ff-3");
        assert_eq!(unique_name("Baler", &["Baler", "Baler (2)"]), "Baler (3)");
        assert_eq!(unique_name(" ", &[]), "Untitled job");
        assert!(is_name_of("Baler", "Baler") && is_name_of("Baler (12)", "Baler"));
        assert!(!is_name_of("Baler (x)", "Baler") && !is_name_of("Baler ()", "Baler"));
        assert!(!is_name_of("Baler 2", "Baler") && !is_name_of("Bale", "Baler"));
    }

    #[test]
    fn an_export_imports_back_equal_and_beside_same_named_jobs() {
        let a = scrap_baler();
        let mut b = scrap_baler();
        b.name = "Second".into();
        let file = export_all(&[&a, &b]);
        assert_eq!(
            parse_import(&file, &[]).unwrap(),
            vec![a.clone(), b.clone()]
        );
        let beside = parse_import(&file, &[a.name.as_str()]).unwrap();
        assert_eq!(beside[0].name, format!("{} (2)", a.name));
        assert_eq!(beside[1].name, "Second");
        // A single job file imports too.
        assert_eq!(parse_import(&a.to_json(), &[]).unwrap(), vec![a]);
    }

    #[test]
    fn a_bad_file_is_refused_whole_with_a_reason() {
        let good = scrap_baler().to_json();
        let mut invalid = scrap_baler();
        invalid.designs[0].motor.full_load_efficiency = 1.5;
        let cases = [
            ("not json at all".to_string(), "not JSON"),
            ("{\"some\": \"other file\"}".to_string(), "not a Phasewise job file"),
            ("{\"format\": \"phasewise-jobs\", \"jobs\": []}".to_string(), "holds no jobs"),
            (export_all(&[]), "holds no jobs"),
            (good.replace(&format!("\"schema_version\": {SCHEMA_VERSION}"), "\"schema_version\": 5"), "newer Phasewise"),
            (export_all(&[&scrap_baler(), &invalid]), "job 2 (“Scrap baler (example)”) has 1 problem(s), the first at designs[0].motor.full_load_efficiency"),
            ("x".repeat(IMPORT_LIMIT_BYTES + 1), "at most 2048 KB"),
        ];
        for (text, says) in cases {
            let err = parse_import(&text, &[]).unwrap_err();
            assert!(err.contains(says), "{err} / {says}");
        }
    }

    #[test]
    fn newest_first_and_damaged_last() {
        let good = |id: &str, t: f64| Entry::Good {
            id: id.into(),
            saved: SavedJob {
                format: FORMAT.into(),
                store_version: 1,
                changed_ms: t,
                job: scrap_baler(),
            },
        };
        let bad = Entry::Damaged {
            id: "z".into(),
            raw: String::new(),
            reason: String::new(),
        };
        let order: Vec<String> = sorted(vec![bad, good("a", 1.0), good("b", 3.0)])
            .iter()
            .map(|e| e.id().to_string())
            .collect();
        assert_eq!(order, ["b", "a", "z"]);
    }
}
