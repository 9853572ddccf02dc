//! `strake required`: one-foot (API 650 5.6.3) and variable-design-point (API 650
//! 5.6.4) thicknesses side by side. The method's steps are unit-tested by hand in
//! src/calc/vdp.rs; here the command is checked end to end.

use crate::support::{close, json, num, strake};

fn large_si() -> Vec<String> {
    "required --diameter 80 --fill-height 19.2 --sg 0.9 --course-heights 2.4,2.4,2.4,2.4,2.4,2.4,2.4,2.4 \
     --material A36 --corrosion-allowance 1.5 --format json"
        .split_whitespace()
        .map(String::from)
        .collect()
}

/// Bottom course of an 80 m tank, by hand (API 650 5.6.4.4 and 5.6.3.2, SI):
/// S_d = 160 MPa, S_t = 3/7 x 400 = 171.4286 MPa (A36, 5.6.2 basis, from memory).
/// VDP design: (1.06 - 0.0696 x 80/19.2 x sqrt(19.2 x 0.9/160)) x 4.9 x 19.2 x 80 x
///   0.9 / 160 + 1.5 = 0.9646961 x 42.336 + 1.5 = 40.8414 + 1.5 = 42.3414 mm
/// VDP test: 0.9629474 x 43.9040 = 42.2773 mm
/// one-foot design: 4.9 x 80 x 18.9 x 0.9 / 160 + 1.5 = 41.6745 + 1.5 = 43.1745 mm
/// one-foot test: 4.9 x 80 x 18.9 / 171.4286 = 43.2180 mm
/// minimum nominal for D > 60 m: 10 mm (API 650 5.6.1.1, from memory)
#[test]
fn large_tank_bottom_course_by_hand() {
    let run = strake(large_si());
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    let tol = 0.0005;
    assert!(close(num(&v, "/courses/0/vdp_design"), 42.3414, tol));
    assert!(close(num(&v, "/courses/0/vdp_test"), 42.2773, tol));
    assert!(close(num(&v, "/courses/0/onefoot_design"), 43.1745, tol));
    assert!(close(num(&v, "/courses/0/onefoot_test"), 43.2180, tol));
    assert_eq!(num(&v, "/courses/0/minimum_nominal"), 10.0);
    assert!(close(num(&v, "/courses/0/required_onefoot"), 43.2180, tol));
    assert!(close(num(&v, "/courses/0/required_vdp"), 42.3414, tol));
    assert_eq!(v["onefoot_applies"], false);
    assert_eq!(v["variable_design_point"]["applies"], true);
    let w = v["warnings"].to_string();
    assert!(
        w.contains("over the one-foot method's limit of 61 m"),
        "{w}"
    );
    // The top course is governed by the minimum nominal thickness.
    assert_eq!(num(&v, "/courses/7/required_vdp"), 10.0);
    assert!(
        v["caution"]
            .as_str()
            .is_some_and(|c| c.contains("Screening aid"))
    );
}

/// The same shell in USC (every input converted exactly: 1 ft = 0.3048 m, 1 in =
/// 25.4 mm; A36 as the specifications print it in psi) gives the same design and test
/// thicknesses by both methods within 1 % (the printed forms differ by rounding: 4.9
/// vs 2.6, 0.0696 vs 0.463, 0.3 m vs 1 ft, 320 vs 3.84).
#[test]
fn si_and_usc_forms_agree() {
    let si = json(&strake(large_si()));
    let ft = |m: f64| format!("{}", m / 0.3048);
    let heights = vec![ft(2.4); 8].join(",");
    let args = format!(
        "required --diameter {} --fill-height {} --sg 0.9 --course-heights {heights} --material A36 \
         --corrosion-allowance {} --system usc --format json",
        ft(80.0),
        ft(19.2),
        1.5 / 25.4
    );
    let us = json(&strake(args.split_whitespace()));
    for i in 0..8 {
        for key in ["onefoot_design", "onefoot_test", "vdp_design", "vdp_test"] {
            let a = num(&si, &format!("/courses/{i}/{key}"));
            let b = num(&us, &format!("/courses/{i}/{key}")) * 25.4;
            assert!(
                close(b, a, 0.01),
                "course {} {key}: SI {a} mm, USC {b} mm",
                i + 1
            );
        }
    }
}

/// A shallow liquid on a wide tank: L / H over 1000/6, the method is not applied
/// (API 650 5.6.4.1). D = 80 m, H = 2.5 m; the t of L is the method's own bottom
/// course (the larger of design less CA and test):
/// test factor 1.06 - 0.0696 x 80 / 2.5 x sqrt(2.5 / 171.4286) = 1.06 - 2.2272 x
/// 0.120761 = 0.791041; x 4.9 x 2.5 x 80 / 171.4286 = 5.71667 -> t1t = 4.52211 mm
/// (design: 0.795882 x 5.5125 = 4.38730 mm). L = sqrt(500 x 80 x 4.52211) = 425.30 mm;
/// L/H = 170.12 > 166.67.
#[test]
fn variable_point_not_applied_when_l_over_h_is_too_large() {
    let run = strake(
        "required --diameter 80 --fill-height 2.5 --sg 0.9 --course-heights 2.5 --material A36 --format json"
            .split_whitespace(),
    );
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    assert_eq!(v["variable_design_point"]["applies"], false);
    assert!(close(
        num(&v, "/variable_design_point/ratio"),
        170.12,
        0.0005
    ));
    assert!(v["courses"][0]["vdp_design"].is_null());
    assert!(v["courses"][0]["required_vdp"].is_null());
    assert!(
        v["warnings"]
            .to_string()
            .contains("variable-design-point method not applied")
    );
}

/// A tank folder: the sample tank, with its nominal thickness beside each method.
#[test]
fn tank_folder_text() {
    let run = strake(["required", "sample-inspections/kestrel-t12"]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    insta::assert_snapshot!("required-kestrel-t12", run.stdout);
}

/// Ad-hoc shells need a material or both stresses: a usage error (exit 2).
#[test]
fn usage_errors() {
    let run = strake(
        "required --diameter 30 --fill-height 10 --sg 1 --course-heights 6,6".split_whitespace(),
    );
    assert_eq!(run.code, 2);
    assert_eq!(
        run.stderr.trim_end(),
        "error: give --material, or both --design-stress and --test-stress"
    );
    let run = strake(
        "required --diameter 30 --fill-height 13 --sg 1 --course-heights 6,6 --material A36"
            .split_whitespace(),
    );
    assert_eq!(run.code, 2);
    assert_eq!(
        run.stderr.trim_end(),
        "error: --fill-height 13 m is above the shell height 12 m (the sum of --course-heights)"
    );
    let run = strake(
        "required --diameter 30 --fill-height 10 --sg 1 --course-heights 6,6 --material A99"
            .split_whitespace(),
    );
    assert_eq!(run.code, 2);
}

/// An upper course of a weaker grade than the course below (A36 over A537-2): K < 1
/// gives a negative design point. The printed formulas are applied as they are, and
/// the output warns (API 650 5.6.1.3, from memory: a lower course no thinner than the
/// course above it).
#[test]
fn weaker_upper_course_is_flagged() {
    let mut toml = String::from(
        "id = \"VT6\"\nunits = \"SI\"\ndiameter = 100\nmax_fill_height = 19.2\nspecific_gravity = 0.9\n",
    );
    for i in 0..8 {
        let grade = if i < 3 { "A537-2" } else { "A36" };
        toml.push_str(&format!(
            "[[course]]\nheight = 2.4\nnominal_thickness = 30\nmaterial = \"{grade}\"\n"
        ));
    }
    let fx = crate::support::TankFixture::new(&toml);
    let v = json(&strake([
        "required",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
    ]));
    assert!(num(&v, "/courses/3/vdp_design_point_design") < 0.0);
    let w = v["warnings"].to_string();
    assert!(
        w.contains("course 4: the variable design point falls below the course's bottom joint"),
        "{w}"
    );
}
