//! The job library's stored form, with no browser in it: how a job is written to one storage
//! entry and read back, how damaged entries are recognised (and kept, never dropped), and how
//! names and ids are chosen. The UI (`ui::jobs`) does the storage I/O around these functions.
//!
//! Each job is one local-storage entry, `phasewise.job.<id>`, holding a [`SavedJob`] envelope
//! as JSON. There is no index entry to go stale: the list is the entries themselves.

use crate::engine::job::{Job, JobFileError};
use serde::{Deserialize, Serialize};

/// The envelope's version. Raise it when the envelope (not the job inside) changes, and add
/// the step to [`read_entry`].
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
    match value.get("store_version").and_then(|v| v.as_u64()) {
        Some(v) if v as u32 == STORE_VERSION => {}
        Some(v) if v as u32 > STORE_VERSION => {
            return damaged(format!(
                "it was saved by a newer Phasewise (store format {v})"
            ))
        }
        _ => return damaged("it has no known store format".into()),
    }
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
    use crate::engine::demo::scrap_baler;

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
                good.replace("\"schema_version\":1", "\"schema_version\":7"),
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
    fn the_format_1_fixture_reads() {
        // tests/fixtures/saved-job-v1.json is a store entry of format 1, kept for migrations.
        let raw = include_str!("../tests/fixtures/saved-job-v1.json");
        assert!(matches!(read_entry("fixture", raw), Entry::Good { .. }));
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
