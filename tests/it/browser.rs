//! A real browser renders each sample report: headless Chromium takes a screenshot of
//! the whole page, which must not be blank and must show the charts' colours (the
//! Okabe-Ito blue and orange appear only in the inline SVG charts). Skipped with a
//! note when Chromium is not installed, except under CI=true, where it must run.

use std::path::{Path, PathBuf};
use std::process::Command;

use crate::report::{SAMPLES, generate, sample_chart_ids};

/// The Chromium binary on PATH, if any (Debian names it `chromium`).
fn chromium() -> Option<PathBuf> {
    let path = std::env::var_os("PATH")?;
    std::env::split_paths(&path)
        .flat_map(|dir| ["chromium", "chromium-browser"].map(|name| dir.join(name)))
        .find(|p| p.is_file())
}

/// Headless Chromium with a profile of its own and nothing that reaches the network
/// (the flags the issue names, and the background services off); the caller adds
/// what to do and the page.
fn headless(bin: &Path, profile: &Path) -> Command {
    let mut c = Command::new(bin);
    c.args([
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
    ])
    .arg(format!("--user-data-dir={}", profile.display()));
    c
}

/// RGB pixels of a PNG screenshot (png crate).
fn pixels(png_file: &Path) -> (u32, u32, Vec<u8>) {
    let bytes = std::fs::read(png_file).expect("screenshot written");
    let mut decoder = png::Decoder::new(std::io::Cursor::new(bytes));
    decoder.set_transformations(png::Transformations::EXPAND | png::Transformations::STRIP_16);
    let mut reader = decoder.read_info().expect("a PNG");
    let mut buf = vec![0; reader.output_buffer_size().expect("size")];
    let info = reader.next_frame(&mut buf).expect("a frame");
    let channels = info.color_type.samples();
    let rgb = buf[..info.buffer_size()]
        .chunks(channels)
        .flat_map(|p| [p[0], p[1], p[2]])
        .collect();
    (info.width, info.height, rgb)
}

/// Pixels within `tol` of `color` in every channel.
fn count_near(rgb: &[u8], color: [u8; 3], tol: u8) -> usize {
    rgb.chunks(3)
        .filter(|p| (0..3).all(|i| p[i].abs_diff(color[i]) <= tol))
        .count()
}

#[test]
fn sample_reports_render_in_a_browser() {
    let Some(bin) = chromium() else {
        assert!(
            std::env::var("CI").as_deref() != Ok("true"),
            "chromium is not installed; under CI=true the browser test must run \
             (.ci/run installs it with apt-get install -y chromium)"
        );
        eprintln!("note: chromium not found on PATH: browser test skipped");
        return;
    };
    for (sample, _) in SAMPLES {
        let tmp = tempfile::tempdir().expect("temp");
        let out = tmp.path().join("report");
        generate(sample, &out, &[]);
        let html = std::fs::read_to_string(out.join("index.html")).expect("html");
        let ids = sample_chart_ids(sample);
        assert_eq!(html.matches("<svg").count(), ids.len(), "{sample}");
        for id in ids {
            assert!(
                html.contains(&format!("<svg id=\"{id}\"")),
                "{sample}: {id}"
            );
        }
        let shot = tmp.path().join("shot.png");
        let profile = tmp.path().join("profile");
        let status = headless(&bin, &profile)
            .arg("--hide-scrollbars")
            .arg(format!("--screenshot={}", shot.display()))
            .arg("--window-size=1100,12000")
            .arg(format!("file://{}", out.join("index.html").display()))
            .output()
            .expect("chromium runs");
        assert!(
            shot.is_file(),
            "{sample}: no screenshot; chromium said: {}",
            String::from_utf8_lossy(&status.stderr)
        );
        let (w, h, rgb) = pixels(&shot);
        assert_eq!((w, h), (1100, 12000), "{sample}");
        let total = rgb.len() / 3;
        let inked = rgb.chunks(3).filter(|p| p.iter().any(|&c| c < 200)).count();
        assert!(
            inked * 100 > total,
            "{sample}: page looks blank ({inked} of {total} pixels inked)"
        );
        // Chart colours (Okabe-Ito blue 0,114,178 and orange 230,159,0) are used by
        // the SVG charts only, never by the page's stylesheet.
        let blue = count_near(&rgb, [0, 114, 178], 12);
        let orange = count_near(&rgb, [230, 159, 0], 12);
        assert!(blue > 500, "{sample}: chart blue pixels {blue}");
        assert!(orange > 500, "{sample}: chart orange pixels {orange}");
    }
}

/// The fleet page of the sample tanks in a real browser: the screenshot is not blank
/// and shows both charts' colours (the Okabe-Ito blue and orange of the due-date
/// bars, the vermillion of a course to monitor: the page's stylesheet uses none of
/// them); every tank link of the page leads to a file that exists.
#[test]
fn fleet_page_renders_in_a_browser() {
    let Some(bin) = chromium() else {
        assert!(
            std::env::var("CI").as_deref() != Ok("true"),
            "chromium is not installed; under CI=true the browser test must run"
        );
        eprintln!("note: chromium not found on PATH: fleet browser test skipped");
        return;
    };
    let tmp = tempfile::tempdir().expect("temp");
    let out = tmp.path().join("fleet");
    let run = crate::support::strake([
        "fleet",
        "sample-inspections",
        "--out",
        out.to_str().expect("utf-8"),
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let html = std::fs::read_to_string(out.join("index.html")).expect("page");
    for id in ["chart-due", "chart-life"] {
        assert!(html.contains(&format!("<svg id=\"{id}\"")), "{id}");
    }
    for part in html.split("<a href=\"").skip(1) {
        let href = &part[..part.find('"').expect("end of href")];
        if let Some(anchor) = href.strip_prefix('#') {
            assert!(html.contains(&format!("id=\"{anchor}\"")), "{href}");
        } else {
            assert!(out.join(href).is_file(), "{href}");
        }
    }
    let shot = tmp.path().join("shot.png");
    let profile = tmp.path().join("profile");
    let status = headless(&bin, &profile)
        .arg("--hide-scrollbars")
        .arg(format!("--screenshot={}", shot.display()))
        .arg("--window-size=1200,2600")
        .arg(format!("file://{}", out.join("index.html").display()))
        .output()
        .expect("chromium runs");
    assert!(
        shot.is_file(),
        "no screenshot; chromium said: {}",
        String::from_utf8_lossy(&status.stderr)
    );
    let (w, h, rgb) = pixels(&shot);
    assert_eq!((w, h), (1200, 2600));
    let total = rgb.len() / 3;
    let inked = rgb.chunks(3).filter(|p| p.iter().any(|&c| c < 200)).count();
    assert!(
        inked * 100 > total,
        "page looks blank ({inked} of {total} pixels inked)"
    );
    let blue = count_near(&rgb, [0, 114, 178], 12);
    let orange = count_near(&rgb, [230, 159, 0], 12);
    let vermillion = count_near(&rgb, [213, 94, 0], 12);
    assert!(blue > 300, "due-date chart blue pixels {blue}");
    assert!(orange > 300, "due-date chart orange pixels {orange}");
    assert!(
        vermillion > 300,
        "remaining-life chart vermillion pixels {vermillion}"
    );
}

/// Every sample report and the fleet page fit the width of a browser window (800 and
/// 1,000 pixels): nothing but the content of a `.wide` box (which scrolls on its own)
/// reaches past the right edge of the main column, and the page does not scroll
/// sideways. Measured by the browser itself: a copy of each page gets a script that
/// writes what it finds into an attribute, read back from Chromium's `--dump-dom`.
#[test]
fn pages_fit_the_window_width() {
    let Some(bin) = chromium() else {
        assert!(
            std::env::var("CI").as_deref() != Ok("true"),
            "chromium is not installed; under CI=true the browser test must run"
        );
        eprintln!("note: chromium not found on PATH: width test skipped");
        return;
    };
    const PROBE: &str = "<script>const m = document.querySelector('main')\
        .getBoundingClientRect().right; const over = [...document.querySelectorAll('main *')]\
        .filter(e => e.getBoundingClientRect().right > m + 1 && !e.closest('.wide'))\
        .slice(0, 5).map(e => e.tagName + '.' + e.className); document.body.setAttribute(\
        'data-fit', over.join(' ') + '|' + (document.documentElement.scrollWidth - \
        document.documentElement.clientWidth));</script></body>";
    let tmp = tempfile::tempdir().expect("temp");
    let mut pages = Vec::new();
    for (sample, _) in SAMPLES {
        let out = tmp.path().join(sample);
        generate(sample, &out, &[]);
        pages.push((sample.to_string(), out.join("index.html")));
    }
    let fleet = tmp.path().join("fleet");
    let run = crate::support::strake([
        "fleet",
        "sample-inspections",
        "--out",
        fleet.to_str().expect("utf-8"),
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    pages.push(("fleet page".to_string(), fleet.join("index.html")));
    for (name, page) in pages {
        let html = std::fs::read_to_string(&page).expect("page");
        assert!(
            !html.contains("<script"),
            "{name}: the page itself has no script"
        );
        let probe = page.with_file_name("probe.html");
        std::fs::write(&probe, html.replace("</body>", PROBE)).expect("probe page");
        for width in [1000, 800] {
            let profile = tmp.path().join(format!("profile-{width}"));
            let output = headless(&bin, &profile)
                .arg("--dump-dom")
                .arg(format!("--window-size={width},1000"))
                .arg(format!("file://{}", probe.display()))
                .output()
                .expect("chromium runs");
            let dom = String::from_utf8_lossy(&output.stdout);
            let fit = dom
                .split("data-fit=\"")
                .nth(1)
                .and_then(|rest| rest.split('"').next())
                .unwrap_or_else(|| panic!("{name} at {width} px: no measure in the DOM"));
            let (over, sideways) = fit.split_once('|').expect("two parts");
            assert_eq!(
                over, "",
                "{name} at {width} px: past the main column: {over}"
            );
            assert_eq!(
                sideways, "0",
                "{name} at {width} px: the page scrolls sideways"
            );
        }
    }
}
