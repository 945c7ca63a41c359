//! The smallest Leptos app worth measuring: a counter, as in Leptos's own examples.

use leptos::prelude::*;

#[component]
fn Counter() -> impl IntoView {
    let count = RwSignal::new(0);
    view! {
        <button on:click=move |_| *count.write() += 1>"Clicked " {count} " times"</button>
    }
}

fn main() {
    console_error_panic_hook::set_once();
    leptos::mount::mount_to_body(Counter);
}
