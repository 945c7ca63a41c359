//! A move's pressure and return lines in the cycle editor: added when the user knows them,
//! their drop then worked out by the engine from the flow and the oil (`engine::lines`).

use super::field::NumberField;
use super::state::use_job;
use crate::engine::cycle::{MovePhase, PhaseKind};
use crate::engine::fields::{self, FieldSpec};
use crate::engine::lines::{Line, MoveLines};
use crate::engine::Job;
use leptos::prelude::*;

fn lines_of(job: &Job, i: usize) -> Option<&MoveLines> {
    match &job.cycle.get(i)?.kind {
        PhaseKind::Move(MovePhase { lines, .. }) => lines.as_ref(),
        _ => None,
    }
}

fn move_mut(job: &mut Job, i: usize) -> Option<&mut MovePhase> {
    match &mut job.cycle.get_mut(i)?.kind {
        PhaseKind::Move(m) => Some(m),
        _ => None,
    }
}

fn line_of(job: &Job, i: usize, back: bool) -> Option<&Line> {
    lines_of(job, i).map(|l| {
        if back {
            &l.return_line
        } else {
            &l.pressure_line
        }
    })
}

fn line_mut(job: &mut Job, i: usize, back: bool) -> Option<&mut Line> {
    move_mut(job, i)?.lines.as_mut().map(|l| {
        if back {
            &mut l.return_line
        } else {
            &mut l.pressure_line
        }
    })
}

/// Lines to start from: empty figures for the user to measure, and no fittings.
fn empty_lines() -> MoveLines {
    let nothing = Line {
        inner_diameter: uom::si::f64::Length::new::<uom::si::length::meter>(f64::NAN),
        length: uom::si::f64::Length::new::<uom::si::length::meter>(f64::NAN),
        fittings: vec![],
    };
    MoveLines {
        pressure_line: nothing.clone(),
        return_line: nothing,
    }
}

/// One line's three figures.
#[component]
fn LineFields(
    index: usize,
    back: bool,
    diameter: &'static FieldSpec,
    length: &'static FieldSpec,
    fittings: &'static FieldSpec,
) -> impl IntoView {
    view! {
        <NumberField field=diameter at=[index]
            get=move |j: &Job| line_of(j, index, back).map_or(f64::NAN, |l| l.inner_diameter.value)
            set=move |j: &mut Job, v| if let Some(l) = line_mut(j, index, back) { l.inner_diameter.value = v } />
        <NumberField field=length at=[index]
            get=move |j: &Job| line_of(j, index, back).map_or(f64::NAN, |l| l.length.value)
            set=move |j: &mut Job, v| if let Some(l) = line_mut(j, index, back) { l.length.value = v } />
        <NumberField field=fittings at=[index]
            get=move |j: &Job| line_of(j, index, back).map_or(f64::NAN, |l| l.fittings_coefficient())
            set=move |j: &mut Job, v| if let Some(l) = line_mut(j, index, back) { l.set_fittings_coefficient(v) } />
    }
}

/// The move's lines, or a button to describe them.
#[component]
pub fn MoveLinesFields(index: usize) -> impl IntoView {
    let state = use_job();
    let described = Memo::new(move |_| state.job.with(|j| lines_of(j, index).is_some()));
    let describe = move |_| {
        state.job.update(|j| {
            if let Some(m) = move_mut(j, index) {
                m.lines = Some(empty_lines());
            }
        })
    };
    let remove = move |_| {
        state.job.update(|j| {
            if let Some(m) = move_mut(j, index) {
                m.lines = None;
            }
        })
    };
    view! {
        <div class="move-lines" data-part="lines">
            {move || if described.get() {
                view! {
                    <p class="hint">{format!(
                        "The lines' drop follows the flow and the oil's temperature, on top of the losses above. Add up the fittings' loss coefficients; typical ones (common practice): {}. A fitting known as an equivalent length of line goes into the length.",
                        Line::typical_coefficients()
                    )}</p>
                    <div class="field-grid">
                        <LineFields index=index back=false
                            diameter=&fields::PRESSURE_LINE_DIAMETER
                            length=&fields::PRESSURE_LINE_LENGTH
                            fittings=&fields::PRESSURE_LINE_FITTINGS />
                        <LineFields index=index back=true
                            diameter=&fields::RETURN_LINE_DIAMETER
                            length=&fields::RETURN_LINE_LENGTH
                            fittings=&fields::RETURN_LINE_FITTINGS />
                    </div>
                    <button type="button" class="button quiet" data-action="remove-lines" on:click=remove>"Leave the lines out"</button>
                }.into_any()
            } else {
                view! {
                    <button type="button" class="button quiet" data-action="describe-lines" on:click=describe>"Describe the pressure and return lines"</button>
                }.into_any()
            }}
        </div>
    }
}
