//! The pressure-settings area: for the design shown, what each phase needs against its limit,
//! and the engine's advice (`engine::settings`), each with one action that changes a proposed
//! design, never the baseline. The margins the advice uses are edited here too.

use super::field::NumberField;
use super::shared::{DesignTabs, SettingsCaution};
use super::state::use_job;
use crate::engine::fields;
use crate::engine::settings::{self, Severity};
use crate::engine::units::Measure;
use crate::engine::Job;
use leptos::prelude::*;

#[component]
pub fn SettingsArea() -> impl IntoView {
    let state = use_job();
    let applied = RwSignal::new(None::<String>);
    // Advice for a job the engine accepts; none while it has errors (the results area says
    // what to fix).
    let advice = Memo::new(move |_| {
        let d = state.design_index();
        if state.result.with(|r| r.is_err()) {
            return None;
        }
        state.job.with(|job| {
            let design = job.designs.get(d)?;
            let advice = settings::advise(job, d).ok()?;
            Some((settings::phase_needs(job, design), advice))
        })
    });
    let apply = move |action: settings::Action| {
        let shown = state.design_index();
        let (job, target) = state
            .job
            .with_untracked(|j| settings::apply_to_proposed(j, shown, &action));
        let Some(name) = job.designs.get(target).map(|x| x.name.clone()) else {
            return;
        };
        state.change_with_undo(
            "advice",
            format!("Changed “{name}” by the advice"),
            |j| *j = job,
        );
        state.design.set(target);
        applied.set(Some(format!(
            "Applied to “{name}”, now shown. The baseline is unchanged."
        )));
    };
    view! {
        <section class="area settings" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Valve settings"</h1>
            </div>
            <p class="purpose">"What each phase needs, the limit it works against, and the settings that would serve it with the least heat."</p>
            <SettingsCaution />
            <DesignTabs />
            {move || applied.get().map(|t| view! { <p class="save-note" role="status" data-applied="true">{t}</p> })}
            <super::undo::UndoChange place="advice" />
            <super::shared::OlderBaselineNotice place="advice" />
            {move || match advice.get() {
                None => view! { <p class="empty-note">"Advice appears once every figure of the job is valid."</p> }.into_any(),
                Some((needs, list)) => {
                    let job = state.job.get();
                    // Advice for the baseline is applied only where the baseline is all there
                    // is (a proposed copy is made); with a proposed design, its own advice is.
                    let can_apply = state.design_index() > 0 || job.designs.len() == 1;
                    // The machine the advice is for, so it is never applied to one unseen.
                    let machine = job.designs.get(state.design_index()).map(|x| {
                        format!("For “{}”: {}.", x.name, super::shared::machine_words(x, job.units))
                    });
                    view! {
                        <PhaseNeeds job=job.clone() needs=needs />
                        <h2>"Advice"</h2>
                        <p class="hint" data-advice-machine="true">{machine}</p>
                        {if list.is_empty() {
                            view! { <p class="empty-note" data-advice-count="0">"Nothing to change: every setting of this power unit is within the rules below."</p> }.into_any()
                        } else {
                            let count = list.len();
                            view! {
                                <ol class="advice-list" data-advice-count=count>
                                    {list.into_iter().map(|a| view! { <AdviceCard advice=a job=job.clone() apply=apply can_apply=can_apply /> }).collect_view()}
                                </ol>
                            }.into_any()
                        }}
                    }.into_any()
                }
            }}
            <Margins />
            <super::staging_panel::StagingPanel />
        </section>
    }
}

/// Each phase: what it needs, its limit now, the lowest limit that serves it. The unit sits
/// in the headings so the four columns fit a phone held upright.
#[component]
fn PhaseNeeds(job: Job, needs: Vec<settings::PhaseNeed>) -> impl IntoView {
    let u = job.units;
    let p =
        move |pa: Option<f64>| pa.map_or("none".to_string(), |pa| Measure::Pressure.format(u, pa));
    let unit = Measure::Pressure.label(u);
    let head = move |text: &'static str| view! { <th scope="col">{text}<span class="unit-head">{unit}</span></th> };
    view! {
        <h2>"Phase by phase"</h2>
        <div class="table-wrap">
            <table class="needs">
                <thead><tr><th scope="col">"Phase"</th>{head("Needs")}{head("Limit now")}{head("Lowest that serves")}</tr></thead>
                <tbody>
                    {needs.iter().zip(&job.cycle).map(|(n, phase)| view! {
                        <tr>
                            <th scope="row">{phase.name.clone()}</th>
                            <td>{p(n.need.map(|q| q.value))}</td>
                            <td>{p(Some(n.limit.value))}</td>
                            <td>{p(n.lowest.map(|q| q.value))}</td>
                        </tr>
                    }).collect_view()}
                </tbody>
            </table>
        </div>
    }
}

#[component]
fn AdviceCard(
    advice: settings::Advice,
    job: Job,
    apply: impl Fn(settings::Action) + Copy + Send + Sync + 'static,
    can_apply: bool,
) -> impl IntoView {
    let text = advice.describe(&job);
    let (class, label) = match advice.severity {
        Severity::Caution => ("advice caution", "Caution"),
        Severity::Saving => ("advice saving", "Saving"),
        Severity::Note => ("advice note", "Note"),
    };
    // Solved, not estimated: the engine ran the design again with the change, and words it.
    let saving = text.effect.clone();
    let action = advice.action;
    view! {
        <li class=class>
            <p class="advice-kind">{label}</p>
            <h3>{text.title}</h3>
            <p>{text.explanation}</p>
            {saving.map(|s| view! { <p class="advice-saving">{s}</p> })}
            {action.zip(text.action).map(|(a, what)| view! {
                {if can_apply {
                    view! {
                        <button type="button" class="button" data-action="apply-advice" on:click=move |_| apply(a)>
                            {format!("{what}, in the proposed power unit")}
                        </button>
                    }.into_any()
                } else {
                    view! { <p class="hint">{format!("To do: {what}. Show a proposed power unit to apply it there; the baseline stays as it is.")}</p> }.into_any()
                }}
                <p class="setting-caution">
                    "Before setting it on the machine: lock out, release the pressure (accumulators too), check it against every component's rating on that line."
                </p>
            })}
        </li>
    }
}

/// The margins and thresholds the advice uses.
#[component]
fn Margins() -> impl IntoView {
    view! {
        <details class="card margins">
            <summary>"Margins the advice uses"</summary>
            <p class="hint">"Defaults are common practice, not a standard: use the component makers' figures and your site's rules where they differ."</p>
            <NumberField field=&fields::MARGIN_SHARE
                get=|j: &Job| j.advice.margin_fraction set=|j: &mut Job, v| j.advice.margin_fraction = v />
            <NumberField field=&fields::MARGIN_MIN
                get=|j: &Job| j.advice.margin_min.value set=|j: &mut Job, v| j.advice.margin_min.value = v />
            <NumberField field=&fields::FLOW_CONTROL_DROP
                get=|j: &Job| j.advice.flow_control_drop.value set=|j: &mut Job, v| j.advice.flow_control_drop.value = v />
            <NumberField field=&fields::COMPENSATOR_MARGIN_MIN
                get=|j: &Job| j.advice.compensator_margin_min.value set=|j: &mut Job, v| j.advice.compensator_margin_min.value = v />
            <NumberField field=&fields::LEAST_SAVING
                get=|j: &Job| j.advice.least_saving_w set=|j: &mut Job, v| j.advice.least_saving_w = v />
        </details>
    }
}
