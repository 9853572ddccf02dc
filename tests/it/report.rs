//! The report folder (`assess --out`): its files, their agreement with the JSON and CSV
//! outputs, byte-identical reruns, escaping of user text, folder names made from tank
//! ids, and the committed sample reports in `reports/` kept current.

use std::collections::{BTreeMap, BTreeSet};
use std::path::{Path, PathBuf};

use crate::support::{Run, SMALL_SI_TANK, TankFixture, json, num, root, strake, strake_at};

/// (sample folder, tank id) of the invented demo tanks.
pub const SAMPLES: [(&str, &str); 3] = [
    ("kestrel-t12", "KR-T12"),
    ("kestrel-t03", "KR-T03"),
    ("kestrel-t07", "KR-T07"),
];

/// The files of every report folder: four overview charts and the design check, the
/// page and the data files.
pub const FILES: [&str; 9] = [
    "courses.csv",
    "fill-height-outlook.png",
    "index.html",
    "points.csv",
    "reading-distribution.png",
    "required-thickness.png",
    "result.json",
    "shell-profile.png",
    "thickness-history.png",
];

/// The id of each chart's inline SVG that every report has.
pub const CHART_IDS: [&str; 5] = [
    "chart-history",
    "chart-profile",
    "chart-fill",
    "chart-spread",
    "chart-required",
];

/// The charts a sample adds to those of every report, as (SVG id, PNG file): the
/// Gumbel plot where a course has an extreme-value estimate (KR-T12 and KR-T03 have
/// drops with azimuths; KR-T07's readings have none) and a heat map per grid scan
/// (KR-T12 has one).
pub fn sample_charts(sample: &str) -> Vec<(&'static str, &'static str)> {
    match sample {
        "kestrel-t12" => vec![
            ("chart-gumbel", "gumbel-plot.png"),
            ("chart-scan-1", "scan-1-heat-map.png"),
        ],
        "kestrel-t03" => vec![("chart-gumbel", "gumbel-plot.png")],
        _ => Vec::new(),
    }
}

/// Every file of a sample's report folder, sorted.
pub fn sample_files(sample: &str) -> Vec<&'static str> {
    let mut v: Vec<&str> = FILES.to_vec();
    v.extend(sample_charts(sample).iter().map(|c| c.1));
    v.sort_unstable();
    v
}

/// Every chart id of a sample's report.
pub fn sample_chart_ids(sample: &str) -> Vec<&'static str> {
    let mut v: Vec<&str> = CHART_IDS.to_vec();
    v.extend(sample_charts(sample).iter().map(|c| c.0));
    v
}

/// Writes the report of a sample tank into `out`.
pub fn generate(sample: &str, out: &Path, extra: &[&str]) -> Run {
    let mut args = vec![
        "assess".to_string(),
        format!("sample-inspections/{sample}"),
        "--out".to_string(),
        out.display().to_string(),
    ];
    args.extend(extra.iter().map(|s| s.to_string()));
    let run = strake(&args);
    assert_eq!(run.code, 0, "{sample}: {}", run.stderr);
    run
}

/// Every file of a folder, by name.
pub fn files_in(dir: &Path) -> BTreeMap<String, Vec<u8>> {
    std::fs::read_dir(dir)
        .unwrap_or_else(|e| panic!("{}: {e}", dir.display()))
        .map(|e| {
            let e = e.expect("entry");
            (
                e.file_name().to_string_lossy().into_owned(),
                std::fs::read(e.path()).expect("read"),
            )
        })
        .collect()
}

fn text(files: &BTreeMap<String, Vec<u8>>, name: &str) -> String {
    String::from_utf8(files[name].clone()).expect("UTF-8")
}

/// Distinct (course, point) pairs in a sample's survey files, read with the csv crate
/// (an independent reading of the inputs, for the row count of points.csv).
fn distinct_points(sample: &str) -> usize {
    let dir = root()
        .join("sample-inspections")
        .join(sample)
        .join("surveys");
    let mut seen = BTreeSet::new();
    for entry in std::fs::read_dir(dir).expect("surveys") {
        let path = entry.expect("entry").path();
        let raw = std::fs::read_to_string(&path).expect("survey");
        let delimiter = if raw.lines().next().is_some_and(|l| l.contains(';')) {
            b';'
        } else {
            b','
        };
        let mut r = csv::ReaderBuilder::new()
            .delimiter(delimiter)
            .from_reader(raw.as_bytes());
        let headers: Vec<String> = r
            .headers()
            .expect("header")
            .iter()
            .map(str::to_ascii_lowercase)
            .collect();
        let col = |n: &str| headers.iter().position(|h| h == n).expect(n);
        let (course, point) = (col("course"), col("point"));
        for rec in r.records() {
            let rec = rec.expect("record");
            seen.insert((rec[course].to_string(), rec[point].to_string()));
        }
    }
    seen.len()
}

/// Each sample's folder holds exactly its files (the nine of every report and its own
/// charts); the PNGs decode (png crate) at twice the SVG width; the HTML carries every
/// chart inline, each once, and no script; the
/// CSV and JSON files are byte for byte what `--format csv` and `--format json`
/// print; points.csv has a row for every monitoring point of the survey files; the
/// terminal output is unchanged but for one line on standard error.
#[test]
fn report_folder_holds_every_file() {
    for (sample, _) in SAMPLES {
        let tmp = tempfile::tempdir().expect("temp");
        let out = tmp.path().join("report");
        let run = generate(sample, &out, &[]);
        let plain = strake(["assess", &format!("sample-inspections/{sample}")]);
        assert_eq!(
            run.stdout, plain.stdout,
            "{sample}: terminal output changed"
        );
        let expected = sample_files(sample);
        let pngs = expected.iter().filter(|n| n.ends_with(".png")).count();
        assert_eq!(
            run.stderr,
            format!(
                "report: {} ({} files: index.html, {pngs} PNG charts, courses.csv, \
                 points.csv, result.json)\n",
                out.join("index.html").display(),
                expected.len()
            )
        );
        let files = files_in(&out);
        assert_eq!(
            files.keys().map(String::as_str).collect::<Vec<_>>(),
            expected
        );
        for name in expected.iter().filter(|n| n.ends_with(".png")) {
            let decoder = png::Decoder::new(std::io::Cursor::new(files[*name].clone()));
            let reader = decoder.read_info().expect("a PNG");
            let info = reader.info();
            assert_eq!(info.width, 1800, "{sample} {name}");
            assert!(
                (1000..=2600).contains(&info.height),
                "{sample} {name}: {}",
                info.height
            );
            assert_eq!(info.color_type, png::ColorType::Rgb);
            let size = files[*name].len();
            assert!(size < 600_000, "{sample} {name}: {size} bytes");
        }
        let html = text(&files, "index.html");
        let ids = sample_chart_ids(sample);
        assert_eq!(
            html.matches("<svg").count(),
            ids.len(),
            "{sample}: inline SVG charts"
        );
        for id in ids {
            assert_eq!(
                html.matches(&format!("<svg id=\"{id}\"")).count(),
                1,
                "{sample}: {id}"
            );
        }
        assert!(!html.to_ascii_lowercase().contains("<script"), "no script");
        // The only addresses are the SVG namespace names: nothing is fetched.
        assert_eq!(
            html.matches("http").count(),
            html.matches("xmlns=\"http://www.w3.org/2000/svg\"").count(),
            "{sample}: no address other than the SVG namespace"
        );
        let csv = strake([
            "assess",
            &format!("sample-inspections/{sample}"),
            "--format",
            "csv",
        ]);
        assert_eq!(text(&files, "courses.csv"), csv.stdout, "{sample}");
        let js = strake([
            "assess",
            &format!("sample-inspections/{sample}"),
            "--format",
            "json",
        ]);
        assert_eq!(text(&files, "result.json"), js.stdout, "{sample}");
        let points = text(&files, "points.csv");
        let mut lines = points.lines();
        assert_eq!(
            lines.next(),
            Some(
                "point,course,elevation,azimuth,surveys,first_date,first_thickness,last_date,\
                 last_thickness,rate,remaining_life_years"
            )
        );
        assert_eq!(lines.count(), distinct_points(sample), "{sample}");
    }
}

/// Removes tags and collapses white space: the visible text of an HTML fragment.
fn visible(fragment: &str) -> String {
    let mut out = String::new();
    let mut in_tag = false;
    for c in fragment.chars() {
        match c {
            '<' => in_tag = true,
            '>' => {
                in_tag = false;
                out.push(' ');
            }
            c if !in_tag => out.push(c),
            _ => {}
        }
    }
    out.split_whitespace().collect::<Vec<_>>().join(" ")
}

/// The cells of the body rows of the first table after `marker`.
fn table_rows(html: &str, marker: &str) -> Vec<Vec<String>> {
    let start = html.find(marker).expect("marker");
    let body = &html[start..];
    let body = &body[body.find("<tbody>").expect("tbody")..];
    let body = &body[..body.find("</tbody>").expect("end")];
    body.split("<tr")
        .skip(1)
        .map(|row| {
            row.split("<td")
                .skip(1)
                .map(|cell| visible(&format!("<td{cell}")))
                .collect()
        })
        .collect()
}

/// The per-course table of the HTML shows the JSON's numbers, rounded as printed
/// (thickness to the gauge's 0.01 mm / 0.001 in, rates to 0.001 mm/y / 0.0001 in/y,
/// life to 0.1 y, levels to 0.01), and the verdict names the JSON's due dates.
#[test]
fn html_numbers_equal_the_json() {
    for (sample, _) in SAMPLES {
        let tmp = tempfile::tempdir().expect("temp");
        let out = tmp.path().join("r");
        generate(sample, &out, &[]);
        let files = files_in(&out);
        let html = text(&files, "index.html");
        let v: serde_json::Value =
            serde_json::from_slice(&files["result.json"]).expect("result.json");
        let (td, rd) = if v["units"]["thickness"] == "mm" {
            (2, 3)
        } else {
            (3, 4)
        };
        let rows = table_rows(&html, "<section id=\"results\">");
        let courses = v["courses"].as_array().expect("courses");
        assert_eq!(rows.len(), courses.len(), "{sample}");
        for (i, row) in rows.iter().enumerate() {
            let p = |k: &str| num(&v, &format!("/courses/{i}/{k}"));
            let course = p("course") as u32;
            assert!(row[0].starts_with(&course.to_string()), "{sample}: {row:?}");
            assert_eq!(row[1], format!("{:.td$}", p("nominal_thickness")));
            assert_eq!(row[2], format!("{:.td$}", p("t_actual")));
            assert_eq!(row[3], format!("{:.td$}", p("t_min")));
            assert_eq!(row[4], format!("{:.rd$}", p("rate")));
            assert_eq!(row[6], format!("{:.1}", p("remaining_life_years")));
            assert_eq!(row[8], format!("{:.2}", p("max_fill_height")));
            assert_eq!(row[9], format!("{:.2}", p("max_fill_height_next")));
            assert_eq!(
                row[12],
                v["courses"][i]["status"]
                    .as_str()
                    .expect("status")
                    .replace("below-minimum", "below t_min")
            );
            let retire = v["courses"][i]["retirement_date"].as_str().expect("date");
            assert_eq!(row[7], retire[..7]);
        }
        let verdict = &html[html.find("<section id=\"verdict\"").expect("verdict")
            ..html.find("<section id=\"inputs\"").expect("inputs")];
        for key in ["next_ut_inspection", "next_external_inspection"] {
            let due = v["tank"][key].as_str().expect("date");
            assert!(verdict.contains(due), "{sample}: {key} {due}");
        }
        let gov = v["tank"]["governing_course"].as_u64().expect("governing");
        assert!(
            verdict.contains(&format!("course {gov}")),
            "{sample}: governing course"
        );
    }
}

/// The same input gives the same bytes in every file, run after run.
#[test]
fn reports_are_byte_identical_run_to_run() {
    let tmp = tempfile::tempdir().expect("temp");
    let (a, b) = (tmp.path().join("a"), tmp.path().join("b"));
    generate("kestrel-t12", &a, &[]);
    generate("kestrel-t12", &b, &[]);
    assert_eq!(files_in(&a), files_in(&b));
    // Writing over an existing report gives the same bytes again and leaves no
    // temporary file behind.
    generate("kestrel-t12", &a, &[]);
    assert_eq!(files_in(&a), files_in(&b));
}

/// `--stamp` adds the generation time to index.html and changes nothing else;
/// without `--out` it is a usage error.
#[test]
fn stamp_adds_the_time_to_the_page_only() {
    let tmp = tempfile::tempdir().expect("temp");
    let (plain, stamped) = (tmp.path().join("plain"), tmp.path().join("stamped"));
    generate("kestrel-t07", &plain, &[]);
    generate("kestrel-t07", &stamped, &["--stamp"]);
    let (p, s) = (files_in(&plain), files_in(&stamped));
    for name in sample_files("kestrel-t07") {
        if name == "index.html" {
            assert_ne!(p[name], s[name]);
        } else {
            assert_eq!(p[name], s[name], "{name}");
        }
    }
    let html = text(&s, "index.html");
    assert!(html.contains(" · generated 20"), "stamp shown");
    assert!(html.contains(" UTC"), "stamp in UTC");
    assert!(!text(&p, "index.html").contains("generated"));
    let run = strake(["assess", "sample-inspections/kestrel-t07", "--stamp"]);
    assert_eq!(run.code, 2, "{}", run.stderr);
}

/// A small tank whose name and id are markup.
fn hostile(id: &str, name: &str) -> TankFixture {
    let toml = SMALL_SI_TANK
        .replace("id = \"FX-1\"", &format!("id = {}", toml_string(id)))
        .replace(
            "name = \"fixture tank\"",
            &format!("name = {}", toml_string(name)),
        );
    TankFixture::new(&toml).survey(
        "s.csv",
        "date,course,point,thickness,note\n\
         2014-06-01,1,<i>A</i>,9.60,\n2014-06-01,2,D,7.80,\n2014-06-01,3,F,5.90,\n\
         2024-06-01,1,<i>A</i>,9.10,<b>pit</b>\n2024-06-01,2,D,7.75,\n2024-06-01,3,F,5.40,\n",
    )
}

/// A TOML basic string (quotes and backslashes escaped).
fn toml_string(s: &str) -> String {
    format!("\"{}\"", s.replace('\\', "\\\\").replace('"', "\\\""))
}

/// Text from the user's files appears as text: a tank named
/// `<script>alert(1)</script>` and ids with markup are escaped in the page and in the
/// SVG charts, and the page has no script element at all.
#[test]
fn user_text_is_escaped() {
    let fx = hostile("T<1>&'\"", "<script>alert(1)</script>");
    let tmp = tempfile::tempdir().expect("temp");
    let out = tmp.path().join("r");
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8"),
        "--out",
        out.to_str().expect("utf-8"),
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let html = std::fs::read_to_string(out.join("index.html")).expect("html");
    assert!(html.contains("&lt;script&gt;alert(1)&lt;/script&gt;"));
    assert!(!html.to_ascii_lowercase().contains("<script"));
    assert!(
        html.contains("Tank T&lt;1&gt;&amp;&#39;&quot;"),
        "id escaped in the page"
    );
    assert!(
        html.contains("Tank T&lt;1&gt;&amp;&apos;&quot; ·"),
        "id escaped in the SVG text"
    );
    assert!(html.contains("&lt;i&gt;A&lt;/i&gt;"), "point id escaped");
    assert!(!html.contains("<i>A</i>") && !html.contains("<b>pit</b>"));
}

/// `--out` without a value writes to reports/<id>/ under the working folder, with the
/// id made safe as one folder name: `../x`, `a/b` and `../../y` stay inside reports/.
#[test]
fn tank_id_cannot_leave_the_reports_folder() {
    for (id, folder) in [("../x", "___x"), ("a/b", "a_b"), ("../../y", "___.._y")] {
        let fx = hostile(id, "path test");
        let outer = tempfile::tempdir().expect("temp");
        let work = outer.path().join("work");
        std::fs::create_dir(&work).expect("work");
        let run = strake_at(
            &work,
            ["assess", fx.path().to_str().expect("utf-8"), "--out"],
        );
        assert_eq!(run.code, 0, "{id}: {}", run.stderr);
        let report = work.join("reports").join(folder);
        assert!(
            report.join("index.html").is_file(),
            "{id}: {}",
            report.display()
        );
        let names = |d: &Path| -> Vec<String> {
            let mut v: Vec<String> = std::fs::read_dir(d)
                .expect("dir")
                .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
                .collect();
            v.sort();
            v
        };
        assert_eq!(names(outer.path()), ["work"], "{id}: nothing beside work/");
        assert_eq!(names(&work), ["reports"], "{id}");
        assert_eq!(names(&work.join("reports")), [folder], "{id}");
        assert_eq!(names(&report), FILES, "{id}: no temporary file left");
    }
}

/// The report is never written into the tank's surveys folder, whose CSV files would
/// then be read as surveys; the inputs are untouched.
#[test]
fn report_is_not_written_into_the_surveys_folder() {
    let fx = hostile("T-1", "surveys test");
    let surveys = fx.path().join("surveys");
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8"),
        "--out",
        surveys.to_str().expect("utf-8"),
    ]);
    assert_eq!(run.code, 1);
    assert_eq!(
        run.stderr,
        format!(
            "error: {}: the report folder must not be the tank's surveys folder (its CSV \
             files would be read as surveys); choose another folder with --out DIR\n",
            surveys.display()
        )
    );
    assert_eq!(files_in(&surveys).len(), 1, "only s.csv");
}

/// The committed reports of the sample tanks (reports/<id>/) are what the current
/// code writes, byte for byte, so they cannot go stale. After a deliberate change
/// run `STRAKE_BLESS=1 cargo test committed` to rewrite them, and look at them.
#[test]
fn committed_sample_reports_are_current() {
    let tmp = tempfile::tempdir().expect("temp");
    let mut stale = Vec::new();
    for (sample, id) in SAMPLES {
        let fresh_dir = tmp.path().join(id);
        generate(sample, &fresh_dir, &[]);
        let fresh = files_in(&fresh_dir);
        let committed_dir: PathBuf = root().join("reports").join(id);
        let committed = if committed_dir.is_dir() {
            files_in(&committed_dir)
        } else {
            BTreeMap::new()
        };
        if fresh != committed {
            let names: BTreeSet<&String> = fresh.keys().chain(committed.keys()).collect();
            for n in names {
                if fresh.get(n) != committed.get(n) {
                    stale.push(format!("reports/{id}/{n}"));
                }
            }
            if std::env::var_os("STRAKE_BLESS").is_some() {
                if committed_dir.is_dir() {
                    std::fs::remove_dir_all(&committed_dir).expect("remove stale report");
                }
                std::fs::create_dir_all(&committed_dir).expect("reports dir");
                for (n, bytes) in &fresh {
                    std::fs::write(committed_dir.join(n), bytes).expect("write report");
                }
            }
        }
    }
    if std::env::var_os("STRAKE_BLESS").is_none() {
        assert!(
            stale.is_empty(),
            "committed reports differ from what the code writes: {stale:?} \
             (run STRAKE_BLESS=1 cargo test committed, then look at them)"
        );
    }
}

/// The JSON of the fixture agrees with the hand numbers of tests/it/assess.rs, so the
/// escaping fixture is a real tank (a check that the report tests run on valid data).
#[test]
fn hostile_fixture_is_a_valid_tank() {
    let fx = hostile("<x>", "<y>");
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8"),
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    assert_eq!(v["tank_id"], "<x>");
    // Course 1 t_min = 4.9 x 30 x 6.7 x 0.85 / 171.6 = 4.87858 mm (tests/it/assess.rs).
    assert!((num(&v, "/courses/0/t_min") - 4.878_58).abs() < 1e-4);
}

/// The part of the page from `<section id="{id}"` to its end.
fn section<'a>(html: &'a str, id: &str) -> &'a str {
    let start = html
        .find(&format!("<section id=\"{id}\""))
        .unwrap_or_else(|| panic!("section {id}"));
    let rest = &html[start..];
    &rest[..rest.find("</section>").expect("section end")]
}

/// RGB pixels of a PNG (png crate).
fn rgb_pixels(bytes: &[u8]) -> Vec<[u8; 3]> {
    let mut reader = png::Decoder::new(std::io::Cursor::new(bytes.to_vec()))
        .read_info()
        .expect("a PNG");
    let mut buf = vec![0; reader.output_buffer_size().expect("size")];
    let info = reader.next_frame(&mut buf).expect("a frame");
    buf[..info.buffer_size()]
        .chunks(3)
        .map(|p| [p[0], p[1], p[2]])
        .collect()
}

/// The new charts sit in their own sections, inline and linked to their PNG copy: the
/// heat map of each scan under "Local thin areas", the Gumbel plot under the
/// extreme-value section, the design check's chart under it. Where a sample has no
/// scan or no estimate, its section says so, with the reason the JSON gives. The heat
/// map colours the least and the greatest reading that is not a pit with the two
/// ends of viridis (#440154, and plotters' #fee825 for #fde725: van der Walt and
/// Smith 2015), and fills the pits with vermillion (213, 94, 0).
#[test]
fn new_charts_sit_in_their_sections() {
    for (sample, _) in SAMPLES {
        let tmp = tempfile::tempdir().expect("temp");
        let out = tmp.path().join("r");
        generate(sample, &out, &[]);
        let files = files_in(&out);
        let html = text(&files, "index.html");
        let v: serde_json::Value =
            serde_json::from_slice(&files["result.json"]).expect("result.json");
        let design = section(&html, "design-check");
        assert!(design.contains("<svg id=\"chart-required\""), "{sample}");
        assert!(
            design.contains("href=\"required-thickness.png\""),
            "{sample}"
        );
        assert!(
            design.contains("not a replacement for it"),
            "{sample}: the design check says what it is"
        );
        let areas = section(&html, "areas");
        let scans = v["areas"].as_array().expect("areas");
        for i in 1..=scans.len() {
            assert!(
                areas.contains(&format!("<svg id=\"chart-scan-{i}\"")),
                "{sample}"
            );
            assert!(areas.contains(&format!("href=\"scan-{i}-heat-map.png\"")));
        }
        if scans.is_empty() {
            assert!(areas.contains("No grid scan"), "{sample}");
            assert!(!areas.contains("<svg"), "{sample}");
        }
        let extreme = section(&html, "extreme-values");
        let courses = v["courses"].as_array().expect("courses");
        let estimated = courses.iter().filter(|c| c["extreme_value"].is_object());
        if estimated.count() > 0 {
            assert!(extreme.contains("<svg id=\"chart-gumbel\""), "{sample}");
            assert!(extreme.contains("href=\"gumbel-plot.png\""), "{sample}");
        } else {
            assert!(!extreme.contains("<svg"), "{sample}");
        }
        for c in courses {
            if let Some(why) = c["extreme_value_reason"].as_str() {
                let shown = why.replace('\'', "&#39;");
                assert!(extreme.contains(&shown), "{sample}: reason {why}");
            }
        }
        if let Some(map) = files.get("scan-1-heat-map.png") {
            let px = rgb_pixels(map);
            let count = |c: [u8; 3]| px.iter().filter(|p| **p == c).count();
            // One cell is about 60 x 60 pixels at scale 2 (less the ring on t2's cell).
            assert!(count([68, 1, 84]) > 1500, "{sample}: t2's cell");
            assert!(count([254, 232, 37]) > 1500, "{sample}: the thickest cell");
            let pits = v["areas"][0]["pits"].as_u64().expect("pits");
            assert!(count([213, 94, 0]) as u64 > pits * 2000, "{sample}: pits");
        }
    }
}

/// The design-check tables of each sample's page show the numbers of `strake required
/// --format json` for the same tank, rounded as printed (thickness to 0.01 mm / 0.001
/// in, stress to 0.1 MPa / 1 psi, design points to 0.1 mm / 0.01 in, levels to 0.01),
/// and the applicability of both methods.
#[test]
fn design_check_table_equals_required_json() {
    for (sample, _) in SAMPLES {
        let tmp = tempfile::tempdir().expect("temp");
        let out = tmp.path().join("r");
        generate(sample, &out, &[]);
        let html = text(&files_in(&out), "index.html");
        let run = strake([
            "required",
            &format!("sample-inspections/{sample}"),
            "--format",
            "json",
        ]);
        assert_eq!(run.code, 0, "{}", run.stderr);
        let v = json(&run);
        let (td, sd) = if v["units"]["thickness"] == "mm" {
            (2, 1)
        } else {
            (3, 0)
        };
        let design = section(&html, "design-check");
        let rows = table_rows(design, "<table class=\"num design\">");
        let courses = v["courses"].as_array().expect("courses");
        assert_eq!(rows.len(), courses.len(), "{sample}");
        let cell = |i: usize, key: &str, d: usize| -> String {
            v["courses"][i][key]
                .as_f64()
                .map_or("-".to_string(), |x| format!("{x:.d$}"))
        };
        for (i, row) in rows.iter().enumerate() {
            let expected = [
                format!("{}", v["courses"][i]["course"]),
                cell(i, "corrosion_allowance", td),
                cell(i, "design_stress", sd),
                cell(i, "test_stress", sd),
                cell(i, "onefoot_design", td),
                cell(i, "onefoot_test", td),
                cell(i, "vdp_design", td),
                cell(i, "vdp_test", td),
                cell(i, "minimum_nominal", td),
                cell(i, "required_onefoot", td),
                cell(i, "required_vdp", td),
                cell(i, "nominal_thickness", td),
                cell(i, "difference", td),
            ];
            assert_eq!(row, &expected, "{sample}: course {}", i + 1);
        }
        if v["variable_design_point"]["applies"] == true {
            let xd = if td == 2 { 1 } else { 2 };
            let rows = table_rows(design, "<table class=\"num design-points\">");
            assert_eq!(rows.len(), courses.len(), "{sample}");
            let count = |i: usize, key: &str| {
                v["courses"][i][key]
                    .as_u64()
                    .map_or("-".to_string(), |k| k.to_string())
            };
            for (i, row) in rows.iter().enumerate() {
                let expected = [
                    format!("{}", v["courses"][i]["course"]),
                    cell(i, "bottom_elevation", 2),
                    cell(i, "height", 2),
                    cell(i, "vdp_design_point_design", xd),
                    count(i, "vdp_iterations_design"),
                    cell(i, "vdp_design_point_test", xd),
                    count(i, "vdp_iterations_test"),
                ];
                assert_eq!(row, &expected, "{sample}: course {}", i + 1);
            }
        }
        let vdp = &v["variable_design_point"];
        let ratio = format!("{:.2}", num(vdp, "/ratio"));
        assert!(design.contains(&ratio), "{sample}: L/H {ratio}");
        let check = &design[design.find("Variable-design-point method").expect("row")..];
        let check = &check[..check.find("</tr>").expect("row end")];
        let applies = vdp["applies"].as_bool().expect("applies");
        assert_eq!(check.contains("<b>applies</b>"), applies, "{sample}");
        let one_foot = v["onefoot_applies"].as_bool().expect("one-foot");
        let row = &design[design.find("One-foot method").expect("row")..];
        let row = &row[..row.find("</tr>").expect("row end")];
        assert_eq!(row.contains("<b>applies</b>"), one_foot, "{sample}");
    }
}

/// A one-column grid whose t1 window is not its critical window (API 653 4.3.2.1 with
/// the local t_min of 4.3.3.1, from memory), on the SI scan fixture of scans.rs
/// (D 20 m, level 8 m, G 1.0, S 171.6 MPa, N I = 0.749898 mm). Rows 100 mm apart from
/// z = 0.5 m: 5.40, 5.30, 5.28, 5.30, 5.32 mm. t2 = 5.28; L = 1.068 x sqrt(20,000 x
/// 5.28) = 347.06 mm, k = 4. Windows: rows 1-4 mean 21.28 / 4 = 5.32 at z 0.5;
/// rows 2-5 mean 21.20 / 4 = 5.30 at z 0.6 (t1). t_min(z) = 4.9 x 20 x (8 - z) /
/// 171.6: 4.283217 at z 0.5, 4.226107 at z 0.6. Margins: 5.32 - 5.033115 = 0.286885;
/// 5.30 - 4.976005 = 0.323995: the lower window (rows 1-4) is critical.
fn critical_fixture() -> TankFixture {
    let scan = "# invented grid\n# course = 1\n# date = 2024-06-01\n# bottom_elevation = 0.5\n\
                # row_pitch = 100\n# column_pitch = 100\n5.40\n5.30\n5.28\n5.30\n5.32\n";
    TankFixture::new(crate::scans::SI_TANK)
        .survey("s.csv", crate::scans::SI_SURVEY)
        .scan("critical.csv", scan)
}

/// Each scan's rule table in the page equals the JSON `areas` record of the same run
/// (z, H, local t_min, fraction, N I, required, measured, pass per rule; the pit
/// spacing's worst length, limit and span), for the sample scan, the hand-worked grid
/// of tests/it/scans.rs (whose pit rules fail) and a grid whose critical window is not
/// its t1 window; the working names the allowable levels of the JSON.
#[test]
fn scan_rule_tables_equal_the_json_areas() {
    let tmp = tempfile::tempdir().expect("temp");
    let fixtures = [crate::scans::si_fixture(), critical_fixture()];
    let mut dirs: Vec<(PathBuf, PathBuf)> = vec![(
        root().join("sample-inspections/kestrel-t12"),
        tmp.path().join("t12"),
    )];
    for (i, fx) in fixtures.iter().enumerate() {
        dirs.push((fx.path().to_path_buf(), tmp.path().join(format!("fx{i}"))));
    }
    let mut critical_seen = false;
    for (tank, out) in &dirs {
        let run = strake([
            "assess",
            tank.to_str().expect("utf-8"),
            "--out",
            out.to_str().expect("utf-8"),
        ]);
        assert_eq!(run.code, 0, "{}", run.stderr);
        let files = files_in(out);
        let html = text(&files, "index.html");
        let v: serde_json::Value =
            serde_json::from_slice(&files["result.json"]).expect("result.json");
        let td = if v["units"]["thickness"] == "mm" {
            2
        } else {
            3
        };
        let areas = v["areas"].as_array().expect("areas");
        assert!(!areas.is_empty(), "{}", tank.display());
        for (i, x) in areas.iter().enumerate() {
            let article = &html[html
                .find(&format!("<article class=\"area\" id=\"area-{}\">", i + 1))
                .expect("article")..];
            let article = &article[..article.find("</article>").expect("end")];
            assert!(files.contains_key(&format!("scan-{}-heat-map.png", i + 1)));
            let rows = table_rows(article, "<table class=\"num rules\">");
            let t = |p: &str| format!("{:.td$}", num(x, p));
            let l = |p: &str| format!("{:.2}", num(x, p));
            let verdict = |p: &str| {
                if x.pointer(p).and_then(serde_json::Value::as_bool) == Some(true) {
                    "pass"
                } else {
                    "fail"
                }
            };
            let rule_row = |row: &Vec<String>, key: &str| {
                let expected = [
                    l(&format!("/{key}/elevation")),
                    l(&format!("/{key}/liquid_height")),
                    t(&format!("/{key}/t_min")),
                    format!("{}", num(x, &format!("/{key}/fraction"))),
                    t(&format!("/{key}/future_loss")),
                    t(&format!("/{key}/required")),
                    t(&format!("/{key}/measured")),
                    verdict(&format!("/{key}/pass")).to_string(),
                ];
                assert_eq!(&row[2..], &expected, "{key}");
            };
            let mut r = rows.iter();
            let t1 = r.next().expect("t1 row");
            assert_eq!(t1[0], "t1");
            rule_row(t1, "t1_rule");
            let (first, last) = (&x["t1_rule"]["first_row"], &x["t1_rule"]["last_row"]);
            assert!(
                t1[1].contains(&format!(
                    "column {}, rows {first}–{last}",
                    x["t1_rule"]["column"]
                )),
                "{:?}",
                t1[1]
            );
            if x["t1_first_row"] != *first {
                critical_seen = true;
                assert!(t1[1].contains("(critical window)"), "{:?}", t1[1]);
                assert!(html.contains("critical window of the t1 rule"));
            } else {
                assert!(t1[1].contains("(t1 window)"), "{:?}", t1[1]);
            }
            let t2 = r.next().expect("t2 row");
            assert_eq!(t2[0], "t2");
            rule_row(t2, "t2_rule");
            assert_eq!(
                t2[1],
                format!("row {}, column {}", x["t2_row"], x["t2_column"])
            );
            if x["pit_depth_rule"].is_object() {
                let p = r.next().expect("pit depth row");
                assert_eq!(p[0], "pit depth");
                rule_row(p, "pit_depth_rule");
            }
            let sp = r.next().expect("pit spacing row");
            assert_eq!(sp[0], "pit spacing");
            assert_eq!(
                sp[7],
                format!(
                    "≤ {} in {}",
                    t("/pit_spacing_rule/limit"),
                    t("/pit_spacing_rule/span")
                )
            );
            assert_eq!(sp[8], t("/pit_spacing_rule/worst_length"));
            assert_eq!(sp[9], verdict("/pit_spacing_rule/pass"));
            assert!(r.next().is_none(), "no other rule");
            let now = format!("<b>{} ", l("/max_fill_height"));
            assert!(article.contains(&now), "allowable level now {now}");
            if x["max_fill_height_next"].is_number() {
                let next = format!("<b>{} ", l("/max_fill_height_next"));
                assert!(article.contains(&next), "next {next}");
            }
        }
    }
    assert!(
        critical_seen,
        "the critical fixture has its own critical window"
    );
}
