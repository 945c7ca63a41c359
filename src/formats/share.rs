//! A job packed into a link, and that link as a QR code: pure, so it is tested natively.
//!
//! The link is the app's own address with the job in its fragment:
//! `https://…/#share=1.<payload>`, where the payload is the job file (compact JSON), deflated
//! (miniz_oxide) and written in URL-safe base64 without padding. The fragment never reaches
//! a server, so sharing sends the job to nobody but the person who opens the link. Opening it
//! reads the job through the same checks as a file import ([`crate::library::parse_import`]).
//!
//! The fragment is `#share=1.<payload>`: `1.` is the packing's own version, and the deflate
//! runs at its best level. The demo job makes a link of about 1,300 characters, a version-26
//! QR code (121 modules, level L). [`unpack`] inflates to at most the import limit
//! ([`crate::library::IMPORT_LIMIT_BYTES`]) before the import checks. [`qr`] draws the code as
//! one SVG path from the `qrcode` crate's modules, with the four-module quiet zone.

use crate::library;
use base64::Engine as _;
use phasewise_engine::Job;

/// What starts a fragment that carries a job.
pub const FRAGMENT_PREFIX: &str = "#share=";
/// The payload's own version, ahead of the data: a later packing gets a new number, and this
/// one stays readable.
const PACKING: &str = "1.";
/// Deflate at its best: links are made rarely and read on phones.
const LEVEL: u8 = 10;
const BASE64: base64::engine::GeneralPurpose = base64::engine::general_purpose::URL_SAFE_NO_PAD;

/// The job's payload for a link.
pub fn pack(job: &Job) -> String {
    let json = serde_json::to_vec(job).expect("a job always serialises");
    let deflated = miniz_oxide::deflate::compress_to_vec(&json, LEVEL);
    format!("{PACKING}{}", BASE64.encode(deflated))
}

/// The share link for `job` on the app at `app_address` (its address without a fragment).
pub fn link(app_address: &str, job: &Job) -> String {
    let base = app_address.split('#').next().unwrap_or(app_address);
    format!("{base}{FRAGMENT_PREFIX}{}", pack(job))
}

/// The payload of a fragment that carries a job, if it does.
pub fn payload_in(fragment: &str) -> Option<&str> {
    fragment.strip_prefix(FRAGMENT_PREFIX)
}

/// The job in a payload, checked as an import is and renamed beside `taken_names`; or a
/// sentence saying why the link cannot be read.
pub fn unpack(payload: &str, taken_names: &[&str]) -> Result<Job, String> {
    let data = payload
        .strip_prefix(PACKING)
        .ok_or("it was made by a different version of Phasewise, or it is not a Phasewise link")?;
    let deflated = BASE64
        .decode(data.trim())
        .map_err(|_| "part of it is missing or changed (was it cut short when copied?)")?;
    let json =
        miniz_oxide::inflate::decompress_to_vec_with_limit(&deflated, library::IMPORT_LIMIT_BYTES)
            .map_err(|_| "part of it is missing or changed, or it holds more than a job")?;
    let text = String::from_utf8(json).map_err(|_| "it does not hold a Phasewise job")?;
    let mut jobs = library::parse_import(&text, taken_names)?;
    match (jobs.pop(), jobs.is_empty()) {
        (Some(job), true) => Ok(job),
        _ => Err("it holds more than one job".into()),
    }
}

/// A QR code drawn as one SVG path of unit squares, with the standard four-module quiet zone
/// around it (ISO/IEC 18004 asks for it; scanners need it).
#[derive(Clone, Debug, PartialEq)]
pub struct QrDrawing {
    /// Modules across, quiet zone included: the SVG's view box is `0 0 size size`.
    pub size: usize,
    /// The dark modules.
    pub path: String,
}

const QUIET_ZONE: usize = 4;

/// The QR code for `text` at the lowest error correction (the densest data: a link to a job
/// is long, and the code is shown on a screen, not printed on a dirty label).
pub fn qr(text: &str) -> Result<QrDrawing, String> {
    let code = qrcode::QrCode::with_error_correction_level(text.as_bytes(), qrcode::EcLevel::L)
        .map_err(|_| {
            "this job is too large for a QR code; share the link or a file instead".to_string()
        })?;
    let width = code.width();
    let colors = code.to_colors();
    let mut path = String::with_capacity(width * width * 3);
    for y in 0..width {
        let mut x = 0;
        while x < width {
            if colors[y * width + x] == qrcode::Color::Dark {
                // One rectangle per run of dark modules along a row keeps the path short.
                let start = x;
                while x < width && colors[y * width + x] == qrcode::Color::Dark {
                    x += 1;
                }
                path.push_str(&format!(
                    "M{} {}h{}v1h-{}z",
                    start + QUIET_ZONE,
                    y + QUIET_ZONE,
                    x - start,
                    x - start
                ));
            } else {
                x += 1;
            }
        }
    }
    Ok(QrDrawing {
        size: width + 2 * QUIET_ZONE,
        path,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use phasewise_engine::demo::scrap_baler;

    #[test]
    fn a_link_carries_the_job_unchanged() {
        let job = scrap_baler();
        let link = link("http://127.0.0.1:8080/#/jobs", &job);
        assert!(
            link.starts_with("http://127.0.0.1:8080/#share=1."),
            "{link}"
        );
        let fragment = &link[link.find('#').unwrap()..];
        // URL-safe: nothing a browser or a chat app would change or cut at.
        let payload = payload_in(fragment).unwrap();
        assert!(payload
            .bytes()
            .all(|b| b.is_ascii_alphanumeric() || b"-_.".contains(&b)));
        assert_eq!(unpack(payload, &[]).unwrap(), job);
        // Beside a job of the same name it is renamed, as an import is.
        let renamed = unpack(payload, &[&job.name]).unwrap();
        assert_ne!(renamed.name, job.name);
        assert_eq!(renamed.cycle, job.cycle);
    }

    #[test]
    fn a_damaged_link_says_what_is_wrong() {
        let payload = pack(&scrap_baler());
        let cut = &payload[..payload.len() / 2];
        assert!(unpack(cut, &[]).unwrap_err().contains("missing or changed"));
        assert!(unpack("2.abc", &[])
            .unwrap_err()
            .contains("different version"));
        assert!(unpack("1.%%%", &[])
            .unwrap_err()
            .contains("missing or changed"));
        let not_a_job = format!(
            "{PACKING}{}",
            BASE64.encode(miniz_oxide::deflate::compress_to_vec(b"{\"a\":1}", 6))
        );
        assert!(unpack(&not_a_job, &[])
            .unwrap_err()
            .contains("not a Phasewise job file"));
    }

    #[test]
    fn a_link_that_inflates_beyond_the_import_limit_is_refused() {
        // 3 MB of spaces deflate to a few kilobytes: the limit is on what comes out.
        let bomb = vec![b' '; 3 * 1024 * 1024];
        let payload = format!(
            "{PACKING}{}",
            BASE64.encode(miniz_oxide::deflate::compress_to_vec(&bomb, 6))
        );
        assert!(payload.len() < 10_000);
        assert!(unpack(&payload, &[]).is_err());
    }

    #[test]
    fn the_qr_drawing_has_its_quiet_zone_and_only_whole_modules() {
        let drawing = qr("http://127.0.0.1:8080/#share=1.abc").unwrap();
        // Byte mode at level L: version 2 holds 32 bytes, version 3 holds 53 (ISO/IEC 18004
        // capacity table, from memory); this text is 34, so version 3: 29 modules across.
        assert_eq!(drawing.size, 29 + 2 * QUIET_ZONE);
        assert!(
            drawing
                .path
                .starts_with(&format!("M{QUIET_ZONE} {QUIET_ZONE}h7")),
            "finder pattern first: {}",
            &drawing.path[..20]
        );
        let demo = link("https://example.invalid/", &scrap_baler());
        assert!(
            qr(&demo).is_ok(),
            "the demo job's link ({} chars) fits a QR code",
            demo.len()
        );
        assert!(qr(&"x".repeat(3000)).is_err());
    }
}
