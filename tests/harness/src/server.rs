//! A static file server for the release build, on loopback only.
//!
//! Small on purpose: GET and HEAD of files under one folder, the content types a web app
//! needs (wasm must be `application/wasm` for streaming compilation), no caching (a test
//! always sees the current build), one thread per connection, `Connection: close`.
//! It can be stopped from the test, which is how the offline tests take the network away.

use std::io::{self, BufRead, BufReader, Write};
use std::net::{Shutdown, SocketAddr, TcpListener, TcpStream, ToSocketAddrs};
use std::path::{Component, Path, PathBuf};
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Arc;
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
        let acceptor = std::thread::Builder::new()
            .name(format!("static-server-{}", addr.port()))
            .spawn(move || {
                for stream in listener.incoming() {
                    if flag.load(Ordering::SeqCst) {
                        break;
                    }
                    let Ok(stream) = stream else { continue };
                    let root = root.clone();
                    std::thread::spawn(move || {
                        let _ = serve_one(stream, &root);
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
    pub body: Vec<u8>,
}

fn serve_one(stream: TcpStream, root: &Path) -> io::Result<()> {
    stream.set_read_timeout(Some(Duration::from_secs(10)))?;
    let mut reader = BufReader::new(stream.try_clone()?);
    let mut request_line = String::new();
    reader.read_line(&mut request_line)?;
    // Read (and ignore) the headers up to the blank line; refuse absurd ones.
    let mut header_bytes = 0;
    loop {
        let mut line = String::new();
        let n = reader.read_line(&mut line)?;
        header_bytes += n;
        if n == 0 || line == "\r\n" || line == "\n" || header_bytes > 64 * 1024 {
            break;
        }
    }
    let mut parts = request_line.split_whitespace();
    let method = parts.next().unwrap_or("");
    let target = parts.next().unwrap_or("");
    let response = respond(root, method, target);
    let mut stream = stream;
    write!(
        stream,
        "HTTP/1.1 {} {}\r\nContent-Type: {}\r\nContent-Length: {}\r\nCache-Control: no-cache\r\n\
         X-Content-Type-Options: nosniff\r\nConnection: close\r\n\r\n",
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
    fn will_not_start_without_an_index() {
        let empty = std::env::temp_dir().join(format!("phasewise-empty-{}", std::process::id()));
        std::fs::create_dir_all(&empty).unwrap();
        assert!(StaticServer::start(&empty, "127.0.0.1:0").is_err());
    }
}
