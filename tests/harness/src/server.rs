//! A static file server for the release build, on loopback only.
//!
//! Small on purpose: GET and HEAD of files under one folder, the content types a web app
//! needs (wasm must be `application/wasm` for streaming compilation), no caching (a test
//! always sees the current build), one thread per connection, `Connection: close`.
//! It can be stopped from the test, which is how the offline tests take the network away.
//!
//! Text and wasm go out gzip'd (best level) to a browser that accepts it, as any real static
//! host sends them, so what the browser tests and Lighthouse see over the wire is what a user
//! would download. Each file is compressed once per version of its bytes and kept in memory.

use std::io::{self, BufRead, BufReader, Write};
use std::net::{Shutdown, SocketAddr, TcpListener, TcpStream, ToSocketAddrs};
use std::path::{Component, Path, PathBuf};
use std::collections::HashMap;
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::{Arc, Mutex};
use std::thread::JoinHandle;
use std::time::Duration;

/// A running server. Dropping it stops it.
pub struct StaticServer {
    addr: SocketAddr,
    stopping: Arc<AtomicBool>,
    acceptor: Option<JoinHandle<()>>,
}

impl StaticServer {
    /// Serves `root` at `addr` (port 0 picks a free port).
    pub fn start(root: impl Into<PathBuf>, addr: impl ToSocketAddrs) -> io::Result<StaticServer> {
        let root: PathBuf = root.into();
        if !root.join("index.html").is_file() {
            return Err(io::Error::new(
                io::ErrorKind::NotFound,
                format!("{} has no index.html to serve", root.display()),
            ));
        }
        let listener = TcpListener::bind(addr)?;
        let addr = listener.local_addr()?;
        let stopping = Arc::new(AtomicBool::new(false));
        let flag = Arc::clone(&stopping);
        let compressed = GzipCache::default();
        let acceptor = std::thread::Builder::new()
            .name(format!("static-server-{}", addr.port()))
            .spawn(move || {
                for stream in listener.incoming() {
                    if flag.load(Ordering::SeqCst) {
                        break;
                    }
                    let Ok(stream) = stream else { continue };
                    let root = root.clone();
                    let compressed = compressed.clone();
                    std::thread::spawn(move || {
                        let _ = serve_one(stream, &root, &compressed);
                    });
                }
                // The listener drops here: from now on connections are refused.
            })?;
        Ok(StaticServer {
            addr,
            stopping,
            acceptor: Some(acceptor),
        })
    }

    /// The address the server listens on.
    pub fn addr(&self) -> SocketAddr {
        self.addr
    }

    /// The app's address, with a trailing slash.
    pub fn url(&self) -> String {
        format!("http://{}/", self.addr)
    }

    /// Stops accepting connections and waits until the port is closed.
    pub fn stop(&mut self) {
        if let Some(acceptor) = self.acceptor.take() {
            self.stopping.store(true, Ordering::SeqCst);
            // Wake the blocking accept so it sees the flag.
            let _ = TcpStream::connect_timeout(&self.addr, Duration::from_secs(1));
            let _ = acceptor.join();
        }
    }

    /// Blocks until the server stops (for `cargo xtask serve`, which runs until Ctrl-C).
    pub fn wait(mut self) {
        if let Some(acceptor) = self.acceptor.take() {
            let _ = acceptor.join();
        }
    }
}

impl Drop for StaticServer {
    fn drop(&mut self) {
        self.stop();
    }
}

/// The response to one request, before it is written.
#[derive(Debug, PartialEq, Eq)]
pub struct Response {
    pub status: u16,
    pub content_type: &'static str,
    /// `Some("gzip")` when the body is the file gzip'd.
    pub content_encoding: Option<&'static str>,
    pub body: Vec<u8>,
}

/// Gzip'd bodies by file, each with the bytes' hash it was made from, shared by the threads.
#[derive(Clone, Default)]
struct GzipCache(Arc<Mutex<HashMap<PathBuf, (u64, Arc<Vec<u8>>)>>>);

impl GzipCache {
    fn gzip(&self, path: &Path, bytes: &[u8]) -> io::Result<Arc<Vec<u8>>> {
        use std::hash::{Hash, Hasher};
        let mut hasher = std::collections::hash_map::DefaultHasher::new();
        bytes.hash(&mut hasher);
        let key = hasher.finish();
        if let Some((seen, body)) = self.0.lock().map_err(poisoned)?.get(path) {
            if *seen == key {
                return Ok(Arc::clone(body));
            }
        }
        let body = Arc::new(gzip(bytes)?);
        self.0
            .lock()
            .map_err(poisoned)?
            .insert(path.to_path_buf(), (key, Arc::clone(&body)));
        Ok(body)
    }
}

fn poisoned<T>(_: T) -> io::Error {
    io::Error::other("the compression cache was poisoned by a panicking thread")
}

/// `bytes` gzip'd at the best level (what the size report measures, too).
pub fn gzip(bytes: &[u8]) -> io::Result<Vec<u8>> {
    let mut encoder = flate2::write::GzEncoder::new(Vec::new(), flate2::Compression::best());
    encoder.write_all(bytes)?;
    encoder.finish()
}

/// Whether a file of this content type shrinks under gzip (images are compressed already).
pub fn compressible(content_type: &str) -> bool {
    content_type.starts_with("text/")
        || matches!(
            content_type,
            "application/wasm" | "application/json" | "application/manifest+json" | "image/svg+xml"
        )
}

/// Whether an `Accept-Encoding` value allows gzip (`gzip`, or `*`, with a q-value above 0).
pub fn accepts_gzip(accept_encoding: &str) -> bool {
    accept_encoding.split(',').any(|coding| {
        let mut parts = coding.split(';').map(str::trim);
        let name = parts.next().unwrap_or("");
        let refused = parts.any(|p| {
            p.strip_prefix("q=")
                .and_then(|q| q.parse::<f64>().ok())
                .is_some_and(|q| q <= 0.0)
        });
        (name.eq_ignore_ascii_case("gzip") || name == "*") && !refused
    })
}

fn serve_one(stream: TcpStream, root: &Path, compressed: &GzipCache) -> io::Result<()> {
    stream.set_read_timeout(Some(Duration::from_secs(10)))?;
    let mut reader = BufReader::new(stream.try_clone()?);
    let mut request_line = String::new();
    reader.read_line(&mut request_line)?;
    // Read the headers up to the blank line (only Accept-Encoding matters); refuse absurd ones.
    let mut header_bytes = 0;
    let mut gzip_ok = false;
    loop {
        let mut line = String::new();
        let n = reader.read_line(&mut line)?;
        header_bytes += n;
        if n == 0 || line == "\r\n" || line == "\n" || header_bytes > 64 * 1024 {
            break;
        }
        if let Some((name, value)) = line.split_once(':') {
            if name.trim().eq_ignore_ascii_case("accept-encoding") {
                gzip_ok = accepts_gzip(value.trim());
            }
        }
    }
    let mut parts = request_line.split_whitespace();
    let method = parts.next().unwrap_or("");
    let target = parts.next().unwrap_or("");
    let mut response = respond(root, method, target);
    if gzip_ok && response.status == 200 && compressible(response.content_type) {
        let path = file_path(target).unwrap_or_default();
        response.body = (*compressed.gzip(&path, &response.body)?).clone();
        response.content_encoding = Some("gzip");
    }
    let encoding = response
        .content_encoding
        .map(|e| format!("Content-Encoding: {e}\r\n"))
        .unwrap_or_default();
    let mut stream = stream;
    write!(
        stream,
        "HTTP/1.1 {} {}\r\nContent-Type: {}\r\n{encoding}Content-Length: {}\r\nVary: Accept-Encoding\r\n\
         Cache-Control: no-cache\r\nX-Content-Type-Options: nosniff\r\nConnection: close\r\n\r\n",
        response.status,
        reason(response.status),
        response.content_type,
        response.body.len()
    )?;
    if method != "HEAD" {
        stream.write_all(&response.body)?;
    }
    stream.flush()?;
    let _ = stream.shutdown(Shutdown::Both);
    Ok(())
}

/// What the server answers to `method target` for files under `root`.
pub fn respond(root: &Path, method: &str, target: &str) -> Response {
    let text = |status, body: &str| Response {
        status,
        content_type: "text/plain; charset=utf-8",
        content_encoding: None,
        body: body.as_bytes().to_vec(),
    };
    if method != "GET" && method != "HEAD" {
        return text(405, "only GET and HEAD are served\n");
    }
    let Some(relative) = file_path(target) else {
        return text(400, "bad path\n");
    };
    let mut path = root.join(relative);
    if path.is_dir() {
        path.push("index.html");
    }
    match std::fs::read(&path) {
        Ok(body) => Response {
            status: 200,
            content_type: content_type(&path),
            content_encoding: None,
            body,
        },
        Err(_) => text(404, "not found\n"),
    }
}

/// The file a request target names, relative to the served folder; `None` for a target that
/// tries to leave it or is not a path.
fn file_path(target: &str) -> Option<PathBuf> {
    let path = target.split(['?', '#']).next()?;
    let path = path.strip_prefix('/')?;
    let decoded = percent_decode(path)?;
    let mut relative = PathBuf::new();
    for component in Path::new(&decoded).components() {
        match component {
            Component::Normal(part) => relative.push(part),
            Component::CurDir => {}
            _ => return None,
        }
    }
    Some(relative)
}

fn percent_decode(s: &str) -> Option<String> {
    let bytes = s.as_bytes();
    let mut out = Vec::with_capacity(bytes.len());
    let mut i = 0;
    while i < bytes.len() {
        if bytes[i] == b'%' {
            let hex = s.get(i + 1..i + 3)?;
            out.push(u8::from_str_radix(hex, 16).ok()?);
            i += 3;
        } else {
            out.push(bytes[i]);
            i += 1;
        }
    }
    let decoded = String::from_utf8(out).ok()?;
    (!decoded.contains(['\0', '\\'])).then_some(decoded)
}

/// The content type for a file of the release build.
pub fn content_type(path: &Path) -> &'static str {
    match path.extension().and_then(|e| e.to_str()).unwrap_or("") {
        "html" => "text/html; charset=utf-8",
        "js" | "mjs" => "text/javascript; charset=utf-8",
        "wasm" => "application/wasm",
        "css" => "text/css; charset=utf-8",
        "json" => "application/json",
        "webmanifest" => "application/manifest+json",
        "svg" => "image/svg+xml",
        "png" => "image/png",
        "ico" => "image/x-icon",
        "txt" => "text/plain; charset=utf-8",
        _ => "application/octet-stream",
    }
}

fn reason(status: u16) -> &'static str {
    match status {
        200 => "OK",
        400 => "Bad Request",
        404 => "Not Found",
        405 => "Method Not Allowed",
        _ => "",
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::io::Read;

    /// A small site in a folder of the test's own, so tests running in parallel never share one.
    fn site(test: &str) -> PathBuf {
        let dir = std::env::temp_dir().join(format!("phasewise-{test}-{}", std::process::id()));
        std::fs::create_dir_all(dir.join("public")).unwrap();
        std::fs::write(dir.join("index.html"), "<!doctype html><title>t</title>").unwrap();
        std::fs::write(dir.join("app_bg.wasm"), b"\0asm\x01\0\0\0").unwrap();
        std::fs::write(dir.join("public/icon.svg"), "<svg/>").unwrap();
        dir
    }

    fn get(server: &StaticServer, request: &str) -> String {
        let mut stream = TcpStream::connect(server.addr()).unwrap();
        stream.write_all(request.as_bytes()).unwrap();
        let mut answer = String::new();
        stream.read_to_string(&mut answer).unwrap();
        answer
    }

    #[test]
    fn serves_index_for_the_root_and_files_with_their_types() {
        let root = site("serves");
        assert_eq!(
            respond(&root, "GET", "/").content_type,
            "text/html; charset=utf-8"
        );
        let wasm = respond(&root, "GET", "/app_bg.wasm?v=1");
        assert_eq!((wasm.status, wasm.content_type), (200, "application/wasm"));
        assert_eq!(
            respond(&root, "GET", "/public/icon%2Esvg").content_type,
            "image/svg+xml"
        );
        assert_eq!(respond(&root, "GET", "/public/").status, 404);
    }

    #[test]
    fn refuses_paths_outside_the_folder_and_other_methods() {
        let root = site("refuses");
        for target in [
            "/../etc/passwd",
            "/public/../../x",
            "/%2e%2e/x",
            "relative",
            "/a%5Cb",
            "/%zz",
        ] {
            assert_eq!(respond(&root, "GET", target).status, 400, "{target}");
        }
        assert_eq!(respond(&root, "GET", "/missing.js").status, 404);
        assert_eq!(respond(&root, "POST", "/").status, 405);
    }

    #[test]
    fn answers_over_tcp_and_refuses_connections_once_stopped() {
        let mut server = StaticServer::start(site("tcp"), "127.0.0.1:0").unwrap();
        let answer = get(&server, "GET /app_bg.wasm HTTP/1.1\r\nHost: x\r\n\r\n");
        assert!(answer.starts_with("HTTP/1.1 200 OK\r\n"), "{answer}");
        assert!(answer.contains("Content-Type: application/wasm\r\n"));
        assert!(answer.contains("Content-Length: 8\r\n"));
        let head = get(&server, "HEAD / HTTP/1.1\r\n\r\n");
        assert!(head.ends_with("\r\n\r\n"), "HEAD carries no body: {head}");
        server.stop();
        assert!(TcpStream::connect(server.addr()).is_err());
    }

    #[test]
    fn sends_text_and_wasm_gzipd_to_a_browser_that_accepts_it() {
        let root = site("gzip");
        std::fs::write(root.join("app.js"), "const phase = 1;\n".repeat(200)).unwrap();
        std::fs::write(root.join("public/icon.png"), b"\x89PNG....").unwrap();
        let server = StaticServer::start(&root, "127.0.0.1:0").unwrap();
        let ask = |path: &str, accept: &str| {
            let mut stream = TcpStream::connect(server.addr()).unwrap();
            write!(stream, "GET {path} HTTP/1.1\r\nAccept-Encoding: {accept}\r\n\r\n").unwrap();
            let mut answer = Vec::new();
            stream.read_to_end(&mut answer).unwrap();
            let split = answer.windows(4).position(|w| w == b"\r\n\r\n").unwrap();
            let head = String::from_utf8_lossy(&answer[..split]).to_string();
            (head, answer[split + 4..].to_vec())
        };
        let (head, body) = ask("/app.js", "gzip, deflate, br, zstd");
        assert!(head.contains("Content-Encoding: gzip"), "{head}");
        assert!(head.contains("Vary: Accept-Encoding"), "{head}");
        let mut text = String::new();
        flate2::read::GzDecoder::new(&body[..]).read_to_string(&mut text).unwrap();
        assert_eq!(text, "const phase = 1;\n".repeat(200));
        assert!(body.len() < 100, "{} bytes", body.len());
        // Asked twice, the same bytes (from the cache).
        assert_eq!(ask("/app.js", "gzip").1, body);
        // Not asked for, or refused: the file as it is.
        for accept in ["identity", "gzip;q=0", "br"] {
            let (head, body) = ask("/app.js", accept);
            assert!(!head.contains("Content-Encoding"), "{accept}: {head}");
            assert_eq!(body.len(), 17 * 200, "{accept}");
        }
        // Images are compressed already; errors are not worth it.
        assert!(!ask("/public/icon.png", "gzip").0.contains("Content-Encoding"));
        assert!(!ask("/missing.js", "gzip").0.contains("Content-Encoding"));
    }

    #[test]
    fn reads_accept_encoding_as_browsers_write_it() {
        assert!(accepts_gzip("gzip, deflate, br, zstd"));
        assert!(accepts_gzip("GZIP;q=0.5"));
        assert!(accepts_gzip("*"));
        assert!(!accepts_gzip("identity"));
        assert!(!accepts_gzip("gzip;q=0, br"));
        assert!(!accepts_gzip(""));
    }

    #[test]
    fn will_not_start_without_an_index() {
        let empty = std::env::temp_dir().join(format!("phasewise-empty-{}", std::process::id()));
        std::fs::create_dir_all(&empty).unwrap();
        assert!(StaticServer::start(&empty, "127.0.0.1:0").is_err());
    }
}
