//! A power unit's drive: the motor at its full-load speed, or on a variable-speed drive with
//! its speed range, converter, and how it holds and idles. The engine chooses each phase's
//! speed; this only edits the drive.

use super::field::{ChoiceField, NumberField};
use super::state::use_job;
use crate::engine::drive::{
    ConverterClass, ConverterLoss, DriveKind, HoldSpeed, IdleSpeed, MotorCooling, VariableSpeed,
};
use crate::engine::fields;
use crate::engine::Job;
use leptos::prelude::*;

fn drive(j: &Job, d: usize) -> Option<&VariableSpeed> {
    j.designs.get(d)?.drive.as_ref()
}

fn drive_mut(j: &mut Job, d: usize) -> Option<&mut VariableSpeed> {
    j.designs.get_mut(d)?.drive.as_mut()
}

/// The drive's section of the power-unit editor.
#[component]
pub fn DriveFields(d: usize) -> impl IntoView {
    let state = use_job();
    // Memos, so typing in a field does not redraw the section under it.
    let driven = Memo::new(move |_| state.job.with(|j| drive(j, d).is_some()));
    let stated = Memo::new(move |_| {
        state.job.with(|j| {
            matches!(
                drive(j, d).map(|x| x.converter_loss),
                Some(ConverterLoss::Stated { .. })
            )
        })
    });
    let eight = Memo::new(move |_| {
        state.job.with(|j| {
            matches!(
                drive(j, d).map(|x| x.converter_loss),
                Some(ConverterLoss::Points { .. })
            )
        })
    });
    view! {
        <h2>"Drive"</h2>
        <div class="field-grid">
            <ChoiceField field=&fields::DRIVE at=[d]
                options=vec![
                    ("fixed", "Motor at its full-load speed".into()),
                    ("variable", "Variable-speed drive".into()),
                ]
                get=move |j: &Job| if drive(j, d).is_some() { "variable" } else { "fixed" }
                set=move |j: &mut Job, key| if let Some(x) = j.designs.get_mut(d) {
                    x.drive = (key == "variable").then(|| x.drive.unwrap_or_else(|| VariableSpeed::first_for(&x.motor)));
                } />
        </div>
        {move || driven.get().then(|| view! {
            <p class="hint" data-hint="drive">"The engine turns the pumps as slowly as each phase allows: its flow plus the pumps' leakage, never below the slowest speed; moves on all pump flow at the fastest. The motor's figures above are at its full-load speed."</p>
            <div class="field-grid" data-drive=d>
                <ChoiceField field=&fields::DRIVE_KIND at=[d]
                    options=vec![
                        ("induction_on_inverter", "Induction motor on an inverter".into()),
                        ("servo", "Servo motor and drive".into()),
                    ]
                    get=move |j: &Job| match drive(j, d).map(|x| x.kind) { Some(DriveKind::Servo) => "servo", _ => "induction_on_inverter" }
                    set=move |j: &mut Job, key| if let Some(x) = drive_mut(j, d) {
                        x.kind = if key == "servo" { DriveKind::Servo } else { DriveKind::InductionOnInverter };
                    } />
                <NumberField field=&fields::DRIVE_MIN_SPEED at=[d]
                    get=move |j: &Job| drive(j, d).map_or(f64::NAN, |x| x.min_speed.value)
                    set=move |j: &mut Job, v| if let Some(x) = drive_mut(j, d) { x.min_speed.value = v } />
                <NumberField field=&fields::DRIVE_MAX_SPEED at=[d]
                    get=move |j: &Job| drive(j, d).map_or(f64::NAN, |x| x.max_speed.value)
                    set=move |j: &mut Job, v| if let Some(x) = drive_mut(j, d) { x.max_speed.value = v } />
                <NumberField field=&fields::CONVERTER_RATING at=[d]
                    get=move |j: &Job| drive(j, d).map_or(f64::NAN, |x| x.converter_rating.value)
                    set=move |j: &mut Job, v| if let Some(x) = drive_mut(j, d) { x.converter_rating.value = v } />
                <ChoiceField field=&fields::CONVERTER_LOSS_FROM at=[d]
                    options=vec![
                        ("ie2", "IE2 class (at its limit)".into()),
                        ("ie1", "IE1 class (the reference)".into()),
                        ("stated", "The maker's figure at 90 % speed".into()),
                        ("points", "The maker's eight figures".into()),
                    ]
                    get=move |j: &Job| match drive(j, d).map(|x| x.converter_loss) {
                        Some(ConverterLoss::Stated { .. }) => "stated",
                        Some(ConverterLoss::Points { .. }) => "points",
                        Some(ConverterLoss::Class { class: ConverterClass::IE1 | ConverterClass::IE0 }) => "ie1",
                        _ => "ie2",
                    }
                    set=move |j: &mut Job, key| if let Some(x) = drive_mut(j, d) {
                        let class = |class| ConverterLoss::Class { class };
                        x.converter_loss = match key {
                            // The maker's figure starts at what the class gave, for them to type over.
                            "stated" => ConverterLoss::Stated { share: x.stated_converter_loss() / x.converter_rating.value },
                            // Each figure starts where the model puts that point, for them to type over.
                            "points" => ConverterLoss::Points { shares: crate::engine::drive::STANDARD_POINTS.map(|(f, i)| {
                                x.converter_loss_at_point(f / 100.0, i / 100.0) / x.converter_rating.value
                            }) },
                            "ie1" => class(ConverterClass::IE1),
                            _ => class(ConverterClass::IE2),
                        };
                    } />
                {move || eight.get().then(|| crate::engine::drive::STANDARD_POINTS.iter().enumerate().map(|(k, (f, i))| view! {
                    <NumberField field=&fields::CONVERTER_LOSS_POINTS at=[d, k] label=format!("Converter loss at {f:.0} % speed, {i:.0} % current")
                        get=move |j: &Job| match drive(j, d).map(|x| x.converter_loss) { Some(ConverterLoss::Points { shares }) => shares[k], _ => f64::NAN }
                        set=move |j: &mut Job, v| if let Some(x) = drive_mut(j, d) { if let ConverterLoss::Points { shares } = &mut x.converter_loss { shares[k] = v } } />
                }).collect_view())}
                {move || stated.get().then(|| view! {
                    <NumberField field=&fields::CONVERTER_LOSS at=[d]
                        get=move |j: &Job| match drive(j, d).map(|x| x.converter_loss) { Some(ConverterLoss::Stated { share }) => share, _ => f64::NAN }
                        set=move |j: &mut Job, v| if let Some(x) = drive_mut(j, d) { x.converter_loss = ConverterLoss::Stated { share: v } } />
                })}
                <ChoiceField field=&fields::DRIVE_HOLD at=[d]
                    options=vec![
                        ("make_up_leakage", "Making up the leakage".into()),
                        ("minimum_against_relief", "Slowest speed, over the relief".into()),
                    ]
                    get=move |j: &Job| match drive(j, d).map(|x| x.hold) { Some(HoldSpeed::MinimumAgainstRelief) => "minimum_against_relief", _ => "make_up_leakage" }
                    set=move |j: &mut Job, key| if let Some(x) = drive_mut(j, d) {
                        x.hold = if key == "minimum_against_relief" { HoldSpeed::MinimumAgainstRelief } else { HoldSpeed::MakeUpLeakage };
                    } />
                <ChoiceField field=&fields::DRIVE_IDLE at=[d]
                    options=vec![
                        ("minimum", "At the slowest speed".into()),
                        ("stopped", "Pump stopped".into()),
                    ]
                    get=move |j: &Job| match drive(j, d).map(|x| x.idle) { Some(IdleSpeed::Stopped) => "stopped", _ => "minimum" }
                    set=move |j: &mut Job, key| if let Some(x) = drive_mut(j, d) {
                        x.idle = if key == "stopped" { IdleSpeed::Stopped } else { IdleSpeed::Minimum };
                    } />
                <ChoiceField field=&fields::MOTOR_COOLING at=[d]
                    options=vec![
                        ("self_cooled", "Its own shaft fan".into()),
                        ("separate_fan", "A separate fan".into()),
                    ]
                    get=move |j: &Job| match drive(j, d).map(|x| x.cooling) { Some(MotorCooling::SeparateFan) => "separate_fan", _ => "self_cooled" }
                    set=move |j: &mut Job, key| if let Some(x) = drive_mut(j, d) {
                        x.cooling = if key == "separate_fan" { MotorCooling::SeparateFan } else { MotorCooling::SelfCooled };
                    } />
            </div>
            <p class="inline-caution" data-caution="drive">
                <super::icons::CautionIcon />
                <span>
                    "A motor on a drive must be rated for inverter duty, and its maker's speed range and cooling decide how slowly it may turn under load; the pump's maker states its own slowest speed. The relief stays as the safety valve above every working pressure. Drives are wired and set up by a qualified electrician. "
                    <a href="#/safety">"Safety"</a>
                </span>
            </p>
        })}
    }
}
