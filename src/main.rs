//! The browser entry point: mount the app and nothing else.

fn main() {
    // A panic in the wasm module shows its message in the console instead of `unreachable`.
    console_error_panic_hook::set_once();
    leptos::mount::mount_to_body(phasewise::App);
}
