//! What the methods need from a tank's readings, gathered while the readings stream
//! past: no reading is kept.
//!
//! No method of its own: this is the bookkeeping in front of [`super::assess`]. Per
//! course and survey date it keeps the running statistics of survey.rs (count, least
//! reading, Welford moments); per monitoring point the earliest and latest readings
//! (points.rs); per suspect reading (survey.rs, common practice thresholds) its place,
//! to warn about. Memory grows with the number of courses, survey dates and points,
//! not with the number of readings.
//!
//! Readings dated after the assessment date (`--as-of`) are counted and left out, as
//! the methods use only the surveys up to that date.

use std::collections::BTreeMap;

use rustc_hash::FxHashMap;

use chrono::NaiveDate;

use super::assess::AssessOptions;
use super::extreme::Drops;
use super::points::PointSpan;
use super::survey::{ReadingStats, SuspectKind, outside_course_band, suspect_reading};
use super::units::{Length, Thickness};
use crate::model::reading::{Origin, PointKey, ReadingRef, ReadingSink};
use crate::model::tank::Tank;

/// The readings of one course at one survey date.
#[derive(Debug)]
pub struct SurveyGroup {
    /// Course number.
    pub course: u32,
    /// Survey date.
    pub date: NaiveDate,
    /// Their statistics.
    pub stats: ReadingStats,
    /// Their least reading per drop (azimuth), for the extreme-value estimate.
    pub drops: Drops,
}

/// A reading that looks wrong against its course's nominal thickness.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Suspect {
    /// File and line.
    pub origin: Origin,
    /// Course.
    pub course: u32,
    /// The reading.
    pub thickness: Thickness,
    /// The course's nominal thickness.
    pub nominal: Thickness,
    /// Which test it failed.
    pub kind: SuspectKind,
}

/// A reading whose elevation lies outside its course's band.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Misplaced {
    /// File and line.
    pub origin: Origin,
    /// Course given in the row.
    pub course: u32,
    /// Elevation given in the row.
    pub elevation: Length,
    /// Bottom of the course.
    pub bottom: Length,
    /// Top of the course.
    pub top: Length,
}

/// Marks a point key without a span yet.
const NONE: u32 = u32::MAX;

/// Everything the assessment needs from a tank's readings.
#[derive(Debug)]
pub struct Tally {
    /// What-if values and the assessment date the readings are gathered for.
    pub options: AssessOptions,
    nominal: Vec<(u32, Thickness)>,
    /// Per course: number, bottom elevation and height.
    bands: Vec<(u32, Length, Length)>,
    /// Earliest date of any reading, used or not.
    pub earliest: Option<NaiveDate>,
    /// Readings dated after `options.as_of`, left out.
    pub excluded: usize,
    groups: Vec<SurveyGroup>,
    group_index: BTreeMap<(u32, NaiveDate), usize>,
    last_group: Option<(u32, NaiveDate, usize)>,
    points: Vec<(PointKey, PointSpan)>,
    /// Span of each point key, for the course the key was first seen on.
    span_of_key: Vec<u32>,
    /// Spans of a key on another course (the same id reused on another course).
    span_of_key_elsewhere: FxHashMap<(u32, PointKey), u32>,
    /// Suspect readings, in the order read.
    pub suspects: Vec<Suspect>,
    /// Readings outside their course's band, in the order read.
    pub misplaced: Vec<Misplaced>,
}

impl Tally {
    /// An empty tally for `tank`, assessed with `options`.
    pub fn new(tank: &Tank, options: AssessOptions) -> Self {
        Tally {
            options,
            nominal: tank
                .courses
                .iter()
                .map(|c| (c.number, c.nominal_thickness))
                .collect(),
            bands: tank
                .courses
                .iter()
                .map(|c| (c.number, c.bottom_elevation, c.height))
                .collect(),
            earliest: None,
            excluded: 0,
            groups: Vec::new(),
            group_index: BTreeMap::new(),
            last_group: None,
            points: Vec::new(),
            span_of_key: Vec::new(),
            span_of_key_elsewhere: FxHashMap::default(),
            suspects: Vec::new(),
            misplaced: Vec::new(),
        }
    }

    /// Nominal thickness of course `number`.
    fn nominal_of(&self, number: u32) -> Option<Thickness> {
        match self.nominal.get((number as usize).wrapping_sub(1)) {
            Some(&(n, t)) if n == number => Some(t),
            _ => self
                .nominal
                .iter()
                .find(|(n, _)| *n == number)
                .map(|&(_, t)| t),
        }
    }

    /// Bottom elevation and height of course `number`.
    fn band_of(&self, number: u32) -> Option<(Length, Length)> {
        match self.bands.get((number as usize).wrapping_sub(1)) {
            Some(&(n, bottom, height)) if n == number => Some((bottom, height)),
            _ => self
                .bands
                .iter()
                .find(|(n, _, _)| *n == number)
                .map(|&(_, bottom, height)| (bottom, height)),
        }
    }

    /// The group of (course, date): the one of the reading before nearly always.
    #[inline]
    fn group(&mut self, course: u32, date: NaiveDate) -> &mut SurveyGroup {
        let i = match self.last_group {
            Some((c, d, i)) if c == course && d == date => i,
            _ => self.find_group(course, date),
        };
        &mut self.groups[i]
    }

    /// Where the group of (course, date) is, made when new.
    #[inline(never)]
    fn find_group(&mut self, course: u32, date: NaiveDate) -> usize {
        let next = self.groups.len();
        let i = *self.group_index.entry((course, date)).or_insert(next);
        if i == next {
            self.groups.push(SurveyGroup {
                course,
                date,
                stats: ReadingStats::default(),
                drops: Drops::default(),
            });
        }
        self.last_group = Some((course, date, i));
        i
    }

    /// Survey groups ordered by course, then date.
    pub fn groups(&self) -> impl Iterator<Item = &SurveyGroup> {
        self.group_index.values().map(|&i| &self.groups[i])
    }

    /// The survey groups of one course, oldest first.
    pub fn course_groups(&self, course: u32) -> impl Iterator<Item = &SurveyGroup> {
        self.group_index
            .range((course, NaiveDate::MIN)..=(course, NaiveDate::MAX))
            .map(|(_, &i)| &self.groups[i])
    }

    /// The drops of one course at one date.
    pub fn drops(&self, course: u32, date: NaiveDate) -> Option<&Drops> {
        self.group_index
            .get(&(course, date))
            .map(|&i| &self.groups[i].drops)
    }

    /// Every point with its key, in no particular order.
    pub fn points(&self) -> &[(PointKey, PointSpan)] {
        &self.points
    }

    /// Number of readings used.
    pub fn used(&self) -> usize {
        self.groups.iter().map(|g| g.stats.count()).sum()
    }
}

impl ReadingSink for Tally {
    fn accept(&mut self, r: &ReadingRef<'_>) {
        if self.earliest.is_none_or(|e| r.date < e) {
            self.earliest = Some(r.date);
        }
        if self.options.as_of.is_some_and(|d| r.date > d) {
            self.excluded += 1;
            return;
        }
        let group = self.group(r.course, r.date);
        group.stats.push(r.thickness.0);
        group.drops.push(r.azimuth, r.thickness);
        if let Some(p) = r.point.filter(|_| !self.options.skip_points) {
            let slot = p.key.0 as usize;
            if self.span_of_key.len() <= slot {
                self.span_of_key.resize(slot + 1, NONE);
            }
            let i = match self.span_of_key[slot] {
                NONE => None,
                i if self.points[i as usize].1.course == r.course => Some(i),
                _ => self.span_of_key_elsewhere.get(&(r.course, p.key)).copied(),
            };
            let reading = (r.date, r.thickness);
            match i {
                Some(i) => self.points[i as usize]
                    .1
                    .add(reading, r.elevation, r.azimuth),
                None => {
                    let i = self.points.len() as u32;
                    self.points.push((
                        p.key,
                        PointSpan::new(r.course, reading, r.elevation, r.azimuth),
                    ));
                    if self.span_of_key[slot] == NONE {
                        self.span_of_key[slot] = i;
                    } else {
                        self.span_of_key_elsewhere.insert((r.course, p.key), i);
                    }
                }
            }
        }
        if let Some(elevation) = r.elevation
            && let Some((bottom, height)) = self.band_of(r.course)
            && outside_course_band(elevation, bottom, height)
        {
            self.misplaced.push(Misplaced {
                origin: r.origin,
                course: r.course,
                elevation,
                bottom,
                top: Length(bottom.0 + height.0),
            });
        }
        if let Some(nominal) = self.nominal_of(r.course)
            && let Some(kind) = suspect_reading(r.thickness, nominal)
        {
            self.suspects.push(Suspect {
                origin: r.origin,
                course: r.course,
                thickness: r.thickness,
                nominal,
                kind,
            });
        }
    }
}
