//! `strake required [TANK_DIR | --diameter ...]`.

use super::Global;
use crate::calc::required::required_shell;
use crate::calc::units::{Length, Stress, Thickness, UnitSystem};
use crate::cli::{Format, RequiredArgs, SystemArg};
use crate::input::tank_dir::load_tank_file;
use crate::model::tank::{Construction, Course, Material, RateBasis, Tank, ThicknessBasis};
use crate::report::view::View;
use crate::report::{required, write};
use crate::{Error, Outcome};

/// Runs the command.
pub fn run(args: &RequiredArgs, g: Global) -> Result<Outcome, Error> {
    let (tank, nominal_known) = match &args.dir {
        Some(dir) => (load_tank_file(dir)?, true),
        None => (ad_hoc(args)?, false),
    };
    let shell = required_shell(&tank, nominal_known);
    let v = View::new(shell.units, g.units);
    let out = match g.format {
        Format::Text => required::render_text(&shell, &v),
        Format::Json => required::render_json(&shell, &v),
        Format::Csv => required::render_csv(&shell, &v).map_err(Error::Render)?,
    };
    write::print(&out, g.color).map_err(Error::Output)?;
    if g.format == Format::Csv {
        write::warnings_to_stderr(&shell.warnings).map_err(Error::Output)?;
        write::caution_to_stderr().map_err(Error::Output)?;
    }
    Ok(Outcome::Done)
}

/// A tank built from the command line (no folder yet).
fn ad_hoc(args: &RequiredArgs) -> Result<Tank, Error> {
    let units = match args.system {
        SystemArg::Si => UnitSystem::Si,
        SystemArg::Usc => UnitSystem::Usc,
    };
    let (Some(d), Some(h), Some(sg)) = (args.diameter, args.fill_height, args.sg) else {
        return Err(Error::Usage(
            "give a TANK_DIR, or --diameter, --fill-height, --sg and --course-heights".into(),
        ));
    };
    if args.course_heights.is_empty() {
        return Err(Error::Usage(
            "--course-heights: give at least one course height".into(),
        ));
    }
    let material = match (args.material, args.design_stress, args.test_stress) {
        (Some(grade), _, _) => Material::Grade(grade),
        (None, Some(_), Some(_)) => Material::NotGiven,
        _ => {
            return Err(Error::Usage(
                "give --material, or both --design-stress and --test-stress".into(),
            ));
        }
    };
    let shell: f64 = args.course_heights.iter().sum();
    let lu = units.length_unit();
    if h > shell + 1e-9 {
        return Err(Error::Usage(format!(
            "--fill-height {h} {lu} is above the shell height {shell} {lu} (the sum of --course-heights)"
        )));
    }
    let mut bottom = 0.0;
    let courses = args
        .course_heights
        .iter()
        .enumerate()
        .map(|(i, &height)| {
            let c = Course {
                number: i as u32 + 1,
                height: Length(height),
                bottom_elevation: Length(bottom),
                nominal_thickness: Thickness(0.0),
                material: material.clone(),
                joint_efficiency: None,
                corrosion_allowance: Thickness(args.corrosion_allowance),
                design_stress: args.design_stress.map(Stress),
                test_stress: args.test_stress.map(Stress),
            };
            bottom += height;
            c
        })
        .collect();
    Ok(Tank {
        id: String::new(),
        name: None,
        units,
        diameter: Length(d),
        max_fill_height: Length(h),
        specific_gravity: sg,
        construction: Construction::Welded,
        joint_efficiency: 1.0,
        in_service_since: None,
        thickness_basis: ThicknessBasis::Minimum,
        rate_basis: RateBasis::Conservative,
        courses,
    })
}
