//! Required thickness of every course of a shell by the one-foot method (API 650
//! 5.6.3) and by the variable-design-point method (API 650 5.6.4), side by side.
//!
//! Per course: required = max(design, hydrotest, minimum nominal) by each method
//! (methods.md s.2 and s.7). The variable-design-point method is applied only where
//! L / H is within its limit; the one-foot method is always computed and flagged above
//! D = 61 m (200 ft). The L of the applicability check uses the bottom-course
//! thickness the method itself requires (the larger of design less CA and test).

use super::design::{design_stresses, minimum_nominal, one_foot_applies, one_foot_design};
use super::units::{Thickness, UnitSystem};
use super::vdp::{Condition, VdpCourse, VdpShell, applicability, size_shell};
use crate::model::required::{RequiredCourse, RequiredShell};
use crate::model::tank::{Material, Tank};
use crate::model::warning::{Shown, Warning};

/// Sizes the shell of `tank` for its design liquid level (`max_fill_height`) and
/// specific gravity. `nominal_known` says whether the tank's nominal thicknesses are
/// real (a tank folder) or placeholders (an ad-hoc shell).
pub fn required_shell(tank: &Tank, nominal_known: bool) -> RequiredShell {
    let units = tank.units;
    let d = tank.diameter;
    let g = tank.specific_gravity;
    let mut warnings = Vec::new();
    let mut stresses = Vec::with_capacity(tank.courses.len());
    for c in &tank.courses {
        if c.material == Material::NotGiven
            && (c.design_stress.is_none() || c.test_stress.is_none())
        {
            warnings.push(Warning::MaterialNotGiven { course: c.number });
        }
        stresses.push(design_stresses(
            units,
            &c.material,
            c.design_stress,
            c.test_stress,
        ));
    }
    let one_foot: Vec<_> = tank
        .courses
        .iter()
        .zip(&stresses)
        .map(|(c, (sd, st))| {
            one_foot_design(
                units,
                d,
                tank.max_fill_height,
                c.bottom_elevation,
                g,
                sd.value,
                st.value,
                c.corrosion_allowance,
            )
        })
        .collect();
    let min_nominal = minimum_nominal(units, d);

    // The variable design point: size both conditions, then check L / H with the
    // bottom-course thickness the method itself requires (the larger of design less CA
    // and test), the same whether the shell comes from a folder or the command line.
    let shell = |condition: Condition| VdpShell {
        units,
        diameter: d,
        fill_height: tank.max_fill_height,
        specific_gravity: g,
        courses: tank
            .courses
            .iter()
            .zip(&stresses)
            .map(|(c, (sd, st))| VdpCourse {
                height: c.height,
                bottom_elevation: c.bottom_elevation,
                stress: match condition {
                    Condition::Design => sd.value,
                    Condition::Test => st.value,
                },
            })
            .collect(),
        condition,
    };
    let design = size_shell(&shell(Condition::Design));
    let test = size_shell(&shell(Condition::Test));
    let bottom_t = match (design.first(), test.first()) {
        (Some(a), Some(b)) => Thickness(a.value().0.max(b.value().0)),
        _ => Thickness(0.0),
    };
    let appl = applicability(units, d, tank.max_fill_height, bottom_t);
    for (c, (a, b)) in tank.courses.iter().zip(design.iter().zip(&test)) {
        let weak = [a, b]
            .iter()
            .any(|k| k.design_point().is_some_and(|x| x < 0.0));
        if appl.holds && weak {
            warnings.push(Warning::VariablePointBelowJoint { course: c.number });
        }
        let stalled = [a, b].iter().any(|k| !k.converged());
        if appl.holds && stalled {
            warnings.push(Warning::VariablePointNotSettled { course: c.number });
        }
    }
    let (vdp_design, vdp_test): (Vec<_>, Vec<_>) = if appl.holds {
        (
            design.into_iter().map(Some).collect(),
            test.into_iter().map(Some).collect(),
        )
    } else {
        (
            vec![None; tank.courses.len()],
            vec![None; tank.courses.len()],
        )
    };

    let one_foot_ok = one_foot_applies(units, d);
    if !one_foot_ok {
        let limit = match units {
            UnitSystem::Si => "61 m",
            UnitSystem::Usc => "200 ft",
        };
        warnings.push(Warning::OneFootBeyondLimit {
            diameter: format!("{:.2} {}", d.0, units.length_unit()),
            limit: limit.to_string(),
        });
    }
    if !appl.holds {
        warnings.push(Warning::VariablePointNotApplicable {
            ratio: appl.ratio,
            limit: appl.limit,
            one_foot_applies: one_foot_ok,
        });
    }

    let mut courses = Vec::with_capacity(tank.courses.len());
    for (((c, (sd, st)), of), (vd, vt)) in tank
        .courses
        .iter()
        .zip(&stresses)
        .zip(&one_foot)
        .zip(vdp_design.into_iter().zip(vdp_test))
    {
        let required_one_foot = Thickness(of.design.0.max(of.test.0).max(min_nominal.0));
        let mut course = RequiredCourse {
            number: c.number,
            height: c.height,
            bottom_elevation: c.bottom_elevation,
            nominal: nominal_known.then_some(c.nominal_thickness),
            corrosion_allowance: c.corrosion_allowance,
            design_stress: *sd,
            test_stress: *st,
            one_foot: *of,
            vdp_design: vd,
            vdp_test: vt,
            minimum_nominal: min_nominal,
            required_one_foot,
            required_vdp: None,
        };
        course.required_vdp = match (course.vdp_design_thickness(), course.vdp_test_thickness()) {
            (Some(a), Some(b)) => Some(Thickness(a.0.max(b.0).max(min_nominal.0))),
            _ => None,
        };
        if let Some(nominal) = course.nominal {
            let governing = if one_foot_ok || course.required_vdp.is_none() {
                ("one-foot", required_one_foot)
            } else {
                (
                    "variable-design-point",
                    course.required_vdp.unwrap_or(required_one_foot),
                )
            };
            if nominal.0 < governing.1.0 {
                warnings.push(Warning::NominalBelowRequired {
                    course: c.number,
                    nominal: Shown::thickness(nominal, units).finer(),
                    required: Shown::thickness(governing.1, units).finer(),
                    method: governing.0,
                });
            }
        }
        courses.push(course);
    }
    RequiredShell {
        tank_id: nominal_known.then(|| tank.id.clone()),
        tank_name: tank.name.clone(),
        units,
        diameter: d,
        fill_height: tank.max_fill_height,
        specific_gravity: g,
        one_foot_applies: one_foot_ok,
        vdp_applicability: appl,
        courses,
        warnings,
    }
}
