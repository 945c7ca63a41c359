//! The bar that offers to undo the last change that threw something away (a design removed, a
//! proposed design overwritten by the advice or the staging search), while nothing else has
//! changed since.

use super::state::use_job;
use leptos::prelude::*;

/// The undo bar for changes made at `place` (see [`super::state::Undo::place`]).
#[component]
pub fn UndoChange(place: &'static str) -> impl IntoView {
    let state = use_job();
    // Offered only while the job is as the change left it: undoing later would lose edits.
    let offered = Memo::new(move |_| {
        state.undo.with(|u| {
            u.as_ref()
                .filter(|u| u.place == place && state.job.with(|j| *j == u.after))
                .map(|u| u.what.clone())
        })
    });
    let undo = move |_: leptos::ev::MouseEvent| {
        if let Some(u) = state.undo.get_untracked() {
            state.undo.set(None);
            state.job.set(u.before);
            state.design.set(u.design);
        }
    };
    move || {
        offered.get().map(|what| {
            view! {
                <div class="undo-bar" role="status" data-undo="true">
                    <span>{format!("{what}.")}</span>
                    <button type="button" class="button" data-action="undo" on:click=undo>"Undo"</button>
                </div>
            }
        })
    }
}
