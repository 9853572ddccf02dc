//! Writes a synthetic fleet of tank folders for the benchmark (benches/run.sh).
//!
//! INVENTED DATA: every tank, date and reading is made up by a seeded pseudo-random
//! generator (fastrand), so the same arguments always write the same bytes. The tanks
//! are plausible, not real: nominal thicknesses from the one-foot design relation plus
//! a corrosion allowance, steady thinning with gauge scatter, a few faster points.
//!
//! Usage: cargo bench --bench fleetgen -- OUT_DIR [--tanks 2000] [--surveys 5]
//!        [--readings 400]
//! Layout: OUT_DIR/site-NN/tank-NNNN/{tank.toml, surveys/YYYY-ut.csv}, one file per
//! survey, `readings` rows per file. One tank in four is in USC units.

use std::path::{Path, PathBuf};

use clap::Parser;
use serde::Serialize;

/// Writes a synthetic fleet.
#[derive(Debug, Parser)]
struct Args {
    /// Folder to write (created; must not hold a fleet already).
    out: PathBuf,
    /// Number of tanks.
    #[arg(long, default_value_t = 2000)]
    tanks: usize,
    /// Surveys per tank (one file each, 2 to 5 years apart).
    #[arg(long, default_value_t = 5)]
    surveys: usize,
    /// Readings per survey (one per monitoring point).
    #[arg(long, default_value_t = 400)]
    readings: usize,
    /// Seed of the generator.
    #[arg(long, default_value_t = 7)]
    seed: u64,
    /// Added by `cargo bench`; ignored.
    #[arg(long, hide = true)]
    bench: bool,
}

#[derive(Serialize)]
struct TankToml {
    id: String,
    name: String,
    units: &'static str,
    diameter: f64,
    max_fill_height: f64,
    specific_gravity: f64,
    construction: &'static str,
    in_service_since: toml::value::Datetime,
    course: Vec<CourseToml>,
}

#[derive(Serialize)]
struct CourseToml {
    height: f64,
    nominal_thickness: f64,
    yield_strength: f64,
    tensile_strength: f64,
}

/// `v` rounded to `decimals` decimals, as it would be written by hand.
fn dec(v: f64, decimals: usize) -> f64 {
    format!("{v:.decimals$}").parse().unwrap_or(v)
}

/// Approximately normal noise (sum of four uniforms), mean 0, standard deviation `sd`.
fn noise(rng: &mut fastrand::Rng, sd: f64) -> f64 {
    let s: f64 = (0..4).map(|_| rng.f64() - 0.5).sum();
    s * sd * (3.0f64).sqrt()
}

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let args = Args::parse();
    std::fs::create_dir_all(&args.out)?;
    let start = std::time::Instant::now();
    let mut rows = 0usize;
    for t in 0..args.tanks {
        rows += write_tank(&args, t)?;
    }
    eprintln!(
        "wrote {} tanks, {} rows in {:.1} s to {}",
        args.tanks,
        rows,
        start.elapsed().as_secs_f64(),
        args.out.display()
    );
    Ok(())
}

fn write_tank(args: &Args, t: usize) -> Result<usize, Box<dyn std::error::Error>> {
    let mut rng = fastrand::Rng::with_seed(args.seed.wrapping_mul(1_000_003) + t as u64);
    let usc = t % 4 == 3;
    let dir: PathBuf = args
        .out
        .join(format!("site-{:02}", t / 100))
        .join(format!("tank-{t:04}"));
    std::fs::create_dir_all(dir.join("surveys"))?;

    // Shape in SI, converted at the end for USC tanks.
    let n_courses = 5 + rng.usize(0..4);
    let course_h = 2.4;
    let shell = n_courses as f64 * course_h;
    let diameter = dec((8.0 + rng.f64() * 52.0) * 2.0, 0) / 2.0;
    let fill = dec(shell - 0.3 - rng.f64() * 0.9, 1);
    let sg = dec(0.7 + rng.f64() * 0.3, 2);
    let (y_mpa, t_mpa) = [(250.0, 400.0), (260.0, 450.0), (290.0, 485.0)][rng.usize(0..3)];
    // Survey dates: the last between 2020 and 2025, earlier ones 2 to 5 years apart
    // (1 to 2 with more than 8 surveys); in service 2 to 21 years before the first.
    let mut survey_years = Vec::new();
    let mut y = 2020 + rng.i32(0..6);
    let (m, d) = (1 + rng.u32(0..12), 1 + rng.u32(0..28));
    for _ in 0..args.surveys {
        survey_years.push(y);
        y -= if args.surveys > 8 {
            1 + rng.i32(0..2)
        } else {
            2 + rng.i32(0..4)
        };
    }
    survey_years.reverse();
    let in_service = survey_years[0] - 2 - rng.i32(0..20);
    let mut courses = Vec::new();
    let mut nominal_mm = Vec::new();
    for c in 0..n_courses {
        let h = fill - c as f64 * course_h;
        // One-foot design thickness (API 650 5.6.3.2, SI form) with S_d = 2/3 Y,
        // plus 3 mm corrosion allowance, at least 5 mm, rounded up to 0.5 mm.
        let design = 4.9 * diameter * (h - 0.3).max(0.0) * sg / (2.0 / 3.0 * y_mpa) + 3.0;
        let nominal = ((design.max(5.0)) / 0.5).ceil() * 0.5;
        nominal_mm.push(nominal);
        courses.push(if usc {
            CourseToml {
                height: dec(course_h / 0.3048, 2),
                nominal_thickness: dec(nominal / 25.4, 4),
                yield_strength: dec(y_mpa * 145.037_738 / 100.0, 0) * 100.0,
                tensile_strength: dec(t_mpa * 145.037_738 / 100.0, 0) * 100.0,
            }
        } else {
            CourseToml {
                height: course_h,
                nominal_thickness: nominal,
                yield_strength: y_mpa,
                tensile_strength: t_mpa,
            }
        });
    }
    let tank = TankToml {
        id: format!("SY-{t:04}"),
        name: format!("synthetic tank {t} (invented benchmark data)"),
        units: if usc { "USC" } else { "SI" },
        diameter: if usc {
            dec(diameter / 0.3048, 1)
        } else {
            diameter
        },
        max_fill_height: if usc { dec(fill / 0.3048, 1) } else { fill },
        specific_gravity: sg,
        construction: "welded",
        in_service_since: format!("{in_service}-0{}-15", 1 + rng.u8(0..9)).parse()?,
        course: courses,
    };
    let text = format!(
        "# INVENTED BENCHMARK DATA (benches/fleetgen.rs): not a real tank.\n{}",
        toml::to_string(&tank)?
    );
    std::fs::write(dir.join("tank.toml"), text)?;

    // Monitoring points: course blocks, drops round the tank.
    struct Point {
        id: String,
        course: usize,
        elevation_m: f64,
        azimuth: f64,
        initial_mm: f64,
        rate_mm_y: f64,
    }
    let per_course = args.readings.div_ceil(n_courses);
    let course_rate: Vec<f64> = (0..n_courses)
        .map(|c| {
            let base = 0.003 + rng.f64() * 0.02;
            if c == 0 || c + 1 == n_courses {
                base * 1.8
            } else {
                base
            }
        })
        .collect();
    let points: Vec<Point> = (0..args.readings)
        .map(|j| {
            let course = (j / per_course).min(n_courses - 1);
            let k = j % per_course;
            let drops = 8;
            let drop = k % drops;
            let level = k / drops;
            let levels = per_course.div_ceil(drops);
            let fast = rng.f64() < 0.01;
            Point {
                id: format!("D{}-C{}-{}", drop + 1, course + 1, level + 1),
                course,
                elevation_m: dec(
                    course as f64 * course_h + (level as f64 + 0.5) / levels as f64 * course_h,
                    2,
                ),
                azimuth: drop as f64 * 45.0,
                initial_mm: nominal_mm[course] + 0.1 + noise(&mut rng, 0.08),
                rate_mm_y: course_rate[course]
                    * (0.6 + rng.f64() * 0.8)
                    * if fast { 1.6 } else { 1.0 },
            }
        })
        .collect();

    let dates = survey_years
        .iter()
        .map(|&y| chrono::NaiveDate::from_ymd_opt(y, m, d).ok_or("date"))
        .collect::<Result<Vec<_>, _>>()?;
    let mut rows = 0;
    for date in &dates {
        let years = (*date - chrono::NaiveDate::from_ymd_opt(in_service, 1, 1).ok_or("date")?)
            .num_days() as f64
            / 365.25;
        rows += write_survey(&dir, *date, years, &points, usc, &mut rng, |p| {
            (
                p.id.as_str(),
                p.course,
                p.elevation_m,
                p.azimuth,
                p.initial_mm,
                p.rate_mm_y,
            )
        })?;
    }
    Ok(rows)
}

type PointView<'a> = (&'a str, usize, f64, f64, f64, f64);

fn write_survey<P>(
    dir: &Path,
    date: chrono::NaiveDate,
    years_in_service: f64,
    points: &[P],
    usc: bool,
    rng: &mut fastrand::Rng,
    view: impl Fn(&P) -> PointView<'_>,
) -> Result<usize, Box<dyn std::error::Error>> {
    let path = dir
        .join("surveys")
        .join(format!("{}-ut.csv", date.format("%Y")));
    let mut w = csv::Writer::from_path(path)?;
    if usc {
        w.write_record([
            "date",
            "course",
            "point",
            "elevation_ft",
            "azimuth",
            "thickness_in",
            "note",
        ])?;
    } else {
        w.write_record([
            "date",
            "course",
            "point",
            "elevation_m",
            "azimuth",
            "thickness_mm",
            "note",
        ])?;
    }
    let date_text = date.to_string();
    for p in points {
        let (id, course, elevation_m, azimuth, initial, rate) = view(p);
        let t_mm = (initial - rate * years_in_service + noise(rng, 0.05)).max(1.0);
        let note = if rng.f64() < 0.01 {
            "re-read, coating removed"
        } else {
            ""
        };
        let (elevation, thickness) = if usc {
            (
                format!("{:.2}", elevation_m / 0.3048),
                format!("{:.3}", t_mm / 25.4),
            )
        } else {
            (format!("{elevation_m:.2}"), format!("{t_mm:.2}"))
        };
        w.write_record([
            date_text.as_str(),
            &(course + 1).to_string(),
            id,
            &elevation,
            &format!("{azimuth:.0}"),
            &thickness,
            note,
        ])?;
    }
    w.flush()?;
    Ok(points.len())
}
