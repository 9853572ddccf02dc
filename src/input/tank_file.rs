//! Reads `tank.toml` (formats.md) into a validated [`Tank`].
//!
//! The toml crate parses the document into a tree with byte spans; this module walks
//! that tree against the schema below, so that every problem is reported at its line
//! and column with the key, the value as written, and what was expected. Unknown keys
//! are refused with the nearest known key suggested.

use std::borrow::Cow;
use std::ops::Range;

use chrono::NaiveDate;
use serde::Deserialize;
use toml::Spanned;
use toml::de::{DeTable, DeValue, ValueDeserializer};

use super::error::{InputError, InputErrorKind, Location, echo, nearest, number_text};
use super::limits::{self, MIN_JOINT_EFFICIENCY, Plausible};
use crate::calc::constants::MAX_SPECIFIC_GRAVITY;
use crate::calc::materials::{find_grade, grade_names};
use crate::calc::units::{Length, Stress, Thickness, UnitSystem};
use crate::model::tank::{Construction, Course, Material, RateBasis, Tank, ThicknessBasis};

/// Keys of the top level.
pub const TANK_KEYS: &[&str] = &[
    "id",
    "name",
    "units",
    "diameter",
    "max_fill_height",
    "specific_gravity",
    "construction",
    "joint_efficiency",
    "in_service_since",
    "assessment",
    "course",
];
/// What the `course` key holds.
const COURSES_EXPECTED: &str = "[[course]] tables, one per course, bottom course first";

/// Keys of `[assessment]`.
pub const ASSESSMENT_KEYS: &[&str] = &["thickness_basis", "rate_basis"];
/// Keys of each `[[course]]`.
pub const COURSE_KEYS: &[&str] = &[
    "height",
    "nominal_thickness",
    "material",
    "yield_strength",
    "tensile_strength",
    "joint_efficiency",
    "corrosion_allowance",
    "design_stress",
    "test_stress",
];

/// Parses and validates the text of a tank file; `path` is used in messages.
pub fn parse_tank(path: &str, text: &str) -> Result<Tank, InputError> {
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    if text.trim().is_empty() {
        return Err(InputError::new(
            Location::line(path, 1),
            InputErrorKind::EmptyTankFile,
        ));
    }
    let doc = Doc { path, text };
    let root = DeTable::parse(text).map_err(|e| doc.syntax(&e))?;
    let top = Table::new(&doc, root.get_ref(), root.span(), None, TANK_KEYS)?;

    let id = top.required_string("id", "a short tag, e.g. \"T-101\"")?;
    if id.get_ref().trim().is_empty() {
        return Err(top.invalid(&id, "id", "is empty, expected a short tag"));
    }
    if id.get_ref().chars().count() > limits::MAX_ID_CHARS
        || id.get_ref().contains(char::is_control)
    {
        return Err(top.invalid(
            &id,
            "id",
            "is not a short tag, expected at most 40 characters on one line, e.g. \"T-101\" \
             (the full name goes in \"name\")",
        ));
    }
    let name = top.optional_string("name", "a text")?;
    if let Some(n) = &name
        && (n.get_ref().chars().count() > limits::MAX_NAME_CHARS
            || n.get_ref().contains(char::is_control))
    {
        return Err(top.invalid(
            n,
            "name",
            "is too long for a name, expected at most 200 characters on one line",
        ));
    }
    let name = name.map(Spanned::into_inner);
    let units_v = top.required_string("units", "\"SI\" or \"USC\"")?;
    let units = match units_v.get_ref().to_ascii_uppercase().as_str() {
        "SI" => UnitSystem::Si,
        "USC" => UnitSystem::Usc,
        _ => {
            return Err(top.invalid(
                &units_v,
                "units",
                "is not a unit system, expected \"SI\" (m, mm, MPa) or \"USC\" (ft, in, psi)",
            ));
        }
    };
    let lu = units.length_unit();
    let tu = units.thickness_unit();
    let su = units.stress_unit();

    let diameter = top.required_number("diameter", format_args!("a number in {lu}"))?;
    top.positive(&diameter, "diameter", lu)?;
    top.plausible(&diameter, "diameter", limits::diameter(units))?;
    let fill = top.required_number("max_fill_height", format_args!("a number in {lu}"))?;
    top.positive(&fill, "max_fill_height", lu)?;
    let sg = top.required_number("specific_gravity", "a number, e.g. 0.85")?;
    if !(*sg.get_ref() > 0.0 && *sg.get_ref() <= MAX_SPECIFIC_GRAVITY) {
        return Err(top.invalid(
            &sg,
            "specific_gravity",
            "is out of range, expected more than 0 and at most 3 (water = 1.0)",
        ));
    }
    top.plausible(&sg, "specific_gravity", limits::specific_gravity())?;
    let construction = match top.optional_string("construction", "\"welded\" or \"riveted\"")? {
        None => Construction::Welded,
        Some(c) => match c.get_ref().to_ascii_lowercase().as_str() {
            "welded" => Construction::Welded,
            "riveted" => Construction::Riveted,
            _ => {
                return Err(top.invalid(
                    &c,
                    "construction",
                    "is not known, expected \"welded\" or \"riveted\"",
                ));
            }
        },
    };
    let joint_efficiency = match top.optional_number("joint_efficiency", "a number in (0, 1]")? {
        None => 1.0,
        Some(e) => top.efficiency(&e)?,
    };
    let in_service_since = top.optional_date("in_service_since")?;

    let (thickness_basis, rate_basis) = match top.optional_table("assessment", ASSESSMENT_KEYS)? {
        None => (ThicknessBasis::Minimum, RateBasis::Conservative),
        Some(a) => {
            let tb = match a.optional_string("thickness_basis", "\"minimum\" or \"average\"")? {
                None => ThicknessBasis::Minimum,
                Some(v) => match v.get_ref().to_ascii_lowercase().as_str() {
                    "minimum" => ThicknessBasis::Minimum,
                    "average" => ThicknessBasis::Average,
                    _ => {
                        return Err(a.invalid(
                            &v,
                            "thickness_basis",
                            "is not known, expected \"minimum\" or \"average\"",
                        ));
                    }
                },
            };
            let rb = match a.optional_string("rate_basis", "a rate basis name")? {
                None => RateBasis::Conservative,
                Some(v) => {
                    let lower = v.get_ref().to_ascii_lowercase();
                    match RateBasis::ALL.iter().find(|b| b.name() == lower) {
                        Some(b) => *b,
                        None => {
                            let names: Vec<&str> =
                                RateBasis::ALL.iter().map(|b| b.name()).collect();
                            let hint = nearest(&lower, names.iter().copied())
                                .map(|s| format!(" (did you mean \"{s}\"?)"))
                                .unwrap_or_default();
                            return Err(a.invalid(
                                &v,
                                "rate_basis",
                                &format!(
                                    "is not known{hint}, expected one of: {}",
                                    names.join(", ")
                                ),
                            ));
                        }
                    }
                }
            };
            (tb, rb)
        }
    };

    let course_tables = top.array_of_tables("course", COURSE_KEYS)?;
    if course_tables.is_empty() {
        return Err(InputError::new(
            Location::file(path),
            InputErrorKind::MissingKey {
                key: "course",
                table: None,
                expected: COURSES_EXPECTED.into(),
            },
        ));
    }
    let mut courses = Vec::with_capacity(course_tables.len());
    let mut bottom = 0.0;
    for (i, c) in course_tables.iter().enumerate() {
        let number = i as u32 + 1;
        let height = c.required_number("height", format_args!("a number in {lu}"))?;
        c.positive(&height, "height", lu)?;
        c.plausible(&height, "height", limits::course_height(units))?;
        let nominal = c.required_number("nominal_thickness", format_args!("a number in {tu}"))?;
        c.positive(&nominal, "nominal_thickness", tu)?;
        c.plausible(
            &nominal,
            "nominal_thickness",
            limits::nominal_thickness(units),
        )?;
        let material = course_material(c, units)?;
        let e = match c.optional_number("joint_efficiency", "a number in (0, 1]")? {
            None => None,
            Some(e) => Some(c.efficiency(&e)?),
        };
        let ca = match c.optional_number("corrosion_allowance", format_args!("a number in {tu}"))? {
            None => 0.0,
            Some(v) if *v.get_ref() >= 0.0 => *v.get_ref(),
            Some(v) => {
                return Err(c.invalid(
                    &v,
                    "corrosion_allowance",
                    &format!("is negative, expected 0 or more {tu}"),
                ));
            }
        };
        let stress = |key: &str| -> Result<Option<Stress>, InputError> {
            match c.optional_number(key, format_args!("a number in {su}"))? {
                None => Ok(None),
                Some(v) => {
                    c.positive(&v, key, su)?;
                    Ok(Some(Stress(*v.get_ref())))
                }
            }
        };
        let design_stress = stress("design_stress")?;
        let test_stress = stress("test_stress")?;
        courses.push(Course {
            number,
            height: Length(*height.get_ref()),
            bottom_elevation: Length(bottom),
            nominal_thickness: Thickness(*nominal.get_ref()),
            material,
            joint_efficiency: e,
            corrosion_allowance: Thickness(ca),
            design_stress,
            test_stress,
        });
        bottom += *height.get_ref();
    }
    let shell = number_text(bottom);
    if *fill.get_ref() > bottom + 1e-9 {
        return Err(top.invalid(
            &fill,
            "max_fill_height",
            &format!(
                "{lu} is above the shell height {shell} {lu} (the sum of the course heights), \
                 expected at most {shell}"
            ),
        ));
    }

    Ok(Tank {
        id: id.into_inner(),
        name,
        units,
        diameter: Length(*diameter.get_ref()),
        max_fill_height: Length(*fill.get_ref()),
        specific_gravity: *sg.get_ref(),
        construction,
        joint_efficiency,
        in_service_since,
        thickness_basis,
        rate_basis,
        courses,
    })
}

fn course_material(c: &Table<'_, '_>, units: UnitSystem) -> Result<Material, InputError> {
    let su = units.stress_unit();
    let grade = c.optional_string("material", "a grade name, e.g. \"A36\"")?;
    let ys = c.optional_number("yield_strength", format_args!("a number in {su}"))?;
    let ts = c.optional_number("tensile_strength", format_args!("a number in {su}"))?;
    match (grade, ys, ts) {
        (Some(g), None, None) => match find_grade(g.get_ref()) {
            Some(grade) => Ok(Material::Grade(grade)),
            None => {
                let names: Vec<&str> = grade_names().collect();
                let hint = nearest(g.get_ref(), names.iter().copied())
                    .map(|s| format!(" (did you mean \"{s}\"?)"))
                    .unwrap_or_default();
                Err(c.invalid(
                    &g,
                    "material",
                    &format!(
                        "is not in the built-in table{hint}; use one of {} or give \
                         yield_strength and tensile_strength instead",
                        names.join(", ")
                    ),
                ))
            }
        },
        (Some(g), _, _) => Err(c.invalid(
            &g,
            "material",
            "is given together with yield_strength/tensile_strength: give the grade or the \
             two strengths, not both",
        )),
        (None, Some(y), Some(t)) => {
            c.positive(&y, "yield_strength", su)?;
            c.positive(&t, "tensile_strength", su)?;
            if y.get_ref() > t.get_ref() {
                return Err(c.invalid(
                    &y,
                    "yield_strength",
                    &format!(
                        "{su} is above tensile_strength {} {su}: expected yield below tensile \
                         (are the two swapped?)",
                        number_text(*t.get_ref())
                    ),
                ));
            }
            c.plausible(&y, "yield_strength", limits::strength(units))?;
            c.plausible(&t, "tensile_strength", limits::strength(units))?;
            Ok(Material::Explicit {
                yield_strength: Stress(*y.get_ref()),
                tensile_strength: Stress(*t.get_ref()),
            })
        }
        (None, Some(_), None) => Err(c.missing(
            "tensile_strength",
            &format!("a number in {su} beside yield_strength"),
        )),
        (None, None, Some(_)) => Err(c.missing(
            "yield_strength",
            &format!("a number in {su} beside tensile_strength"),
        )),
        (None, None, None) => Ok(Material::NotGiven),
    }
}

/// The document being read.
struct Doc<'a> {
    path: &'a str,
    text: &'a str,
}

impl Doc<'_> {
    fn at(&self, span: &Range<usize>) -> Location {
        Location::at_offset(self.path, self.text, span.start)
    }
    fn syntax(&self, e: &toml::de::Error) -> InputError {
        let location = match e.span() {
            Some(span) => self.at(&span),
            None => Location::file(self.path),
        };
        let mut message = e.message().trim().replace('\n', " ");
        // The toml crate names the problem and points at it; the text it points at
        // (the repeated key, the unclosed string) is added so the message names it.
        if let Some(span) = e.span() {
            let at = self.text.get(span.clone()).unwrap_or("").trim();
            let at = at.lines().next().unwrap_or("");
            if !at.is_empty() {
                message = format!("{message} at \"{}\"", echo(at));
                // Courses written as single tables: the second [course] repeats the first.
                if at == "course" && message.starts_with("duplicate key") {
                    message.push_str(
                        ": write each course as a [[course]] table (double brackets), \
                         bottom course first",
                    );
                }
            } else if let Some(line) = self.line_at(span.start).filter(|l| !l.is_empty()) {
                message = format!("{message}, in \"{}\"", echo(line));
            }
        }
        InputError::new(location, InputErrorKind::TomlSyntax(message))
    }
    /// The text of the line holding byte `offset`, trimmed.
    fn line_at(&self, offset: usize) -> Option<&str> {
        let head = self.text.get(..offset)?;
        let start = head.rfind('\n').map_or(0, |i| i + 1);
        let rest = self.text.get(start..)?;
        Some(rest.lines().next().unwrap_or("").trim())
    }

    fn source(&self, span: &Range<usize>) -> String {
        let raw = self.text.get(span.clone()).unwrap_or("").trim();
        // A long quoted string keeps its quotes around the shortened text.
        for q in ['"', '\''] {
            if let Some(inner) = raw
                .strip_prefix(q)
                .and_then(|r| r.strip_suffix(q))
                .filter(|i| !i.starts_with(q))
            {
                return format!("{q}{}{q}", echo(inner));
            }
        }
        echo(raw)
    }
}

/// One table of the document, with the name used in messages.
struct Table<'d, 'i> {
    doc: &'d Doc<'i>,
    table: &'d DeTable<'i>,
    span: Range<usize>,
    name: Option<String>,
}

impl<'d, 'i> Table<'d, 'i> {
    fn new(
        doc: &'d Doc<'i>,
        table: &'d DeTable<'i>,
        span: Range<usize>,
        name: Option<String>,
        known: &[&str],
    ) -> Result<Self, InputError> {
        let mut keys: Vec<&Spanned<Cow<'i, str>>> = table.keys().collect();
        keys.sort_by_key(|k| k.span().start);
        for key in keys {
            if !known.contains(&key.get_ref().as_ref()) {
                return Err(InputError::new(
                    doc.at(&key.span()),
                    InputErrorKind::UnknownKey {
                        key: echo(key.get_ref()),
                        table: name.clone(),
                        suggestion: nearest(key.get_ref(), known.iter().copied()),
                        known: known.join(", "),
                    },
                ));
            }
        }
        Ok(Table {
            doc,
            table,
            span,
            name,
        })
    }

    fn get(&self, key: &str) -> Option<&'d Spanned<DeValue<'i>>> {
        self.table.get(key)
    }

    fn key_name(&self, key: &str) -> String {
        match &self.name {
            Some(t) => format!("{t}, key \"{key}\""),
            None => format!("key \"{key}\""),
        }
    }

    fn missing(&self, key: &'static str, expected: &str) -> InputError {
        if self.name.is_none()
            && let Some((table, span)) = find_nested(self.table, key, "", 0)
        {
            // A tank key written below a [table] header belongs to that table.
            return InputError::new(
                self.doc.at(&span),
                InputErrorKind::MisplacedKey {
                    key,
                    table,
                    expected: expected.to_string(),
                },
            );
        }
        // A key missing from the top level is reported at the top of the file, where
        // the tank's keys go.
        let location = match self.name {
            Some(_) => self.doc.at(&self.span),
            None => Location::at_offset(self.doc.path, self.doc.text, 0),
        };
        InputError::new(
            location,
            InputErrorKind::MissingKey {
                key,
                table: self.name.clone(),
                expected: expected.to_string(),
            },
        )
    }

    fn invalid<T>(&self, v: &Spanned<T>, key: &str, problem: &str) -> InputError {
        InputError::new(
            self.doc.at(&v.span()),
            InputErrorKind::InvalidValue {
                key: self.key_name(key),
                value: self.doc.source(&v.span()),
                problem: problem.to_string(),
            },
        )
    }

    fn wrong_type(&self, key: &str, v: &Spanned<DeValue<'i>>, expected: &str) -> InputError {
        InputError::new(
            self.doc.at(&v.span()),
            InputErrorKind::WrongType {
                key: self.key_name(key),
                found: type_name(v.get_ref()),
                value: self.doc.source(&v.span()),
                expected: expected.to_string(),
            },
        )
    }

    fn optional_string(
        &self,
        key: &str,
        expected: &str,
    ) -> Result<Option<Spanned<String>>, InputError> {
        let Some(v) = self.get(key) else {
            return Ok(None);
        };
        match v.get_ref() {
            DeValue::String(s) => Ok(Some(Spanned::new(v.span(), s.to_string()))),
            _ => Err(self.wrong_type(key, v, expected)),
        }
    }

    fn required_string(
        &self,
        key: &'static str,
        expected: &str,
    ) -> Result<Spanned<String>, InputError> {
        self.optional_string(key, expected)?
            .ok_or_else(|| self.missing(key, expected))
    }

    /// A number under `key`, if there is one. `expected` describes it for messages
    /// (written out only when one is needed).
    fn optional_number(
        &self,
        key: &str,
        expected: impl std::fmt::Display + Copy,
    ) -> Result<Option<Spanned<f64>>, InputError> {
        let Some(v) = self.get(key) else {
            return Ok(None);
        };
        match v.get_ref() {
            DeValue::Integer(_) | DeValue::Float(_) => {
                let n = f64::deserialize(ValueDeserializer::from(v.clone()))
                    .map_err(|_| self.wrong_type(key, v, &expected.to_string()))?;
                if !n.is_finite() {
                    return Err(self.invalid(
                        v,
                        key,
                        &format!("is not finite, expected {expected}"),
                    ));
                }
                Ok(Some(Spanned::new(v.span(), n)))
            }
            _ => Err(self.wrong_type(key, v, &expected.to_string())),
        }
    }

    /// [`Self::optional_number`], missing when absent.
    fn required_number(
        &self,
        key: &'static str,
        expected: impl std::fmt::Display + Copy,
    ) -> Result<Spanned<f64>, InputError> {
        self.optional_number(key, expected)?
            .ok_or_else(|| self.missing(key, &expected.to_string()))
    }

    fn positive(&self, v: &Spanned<f64>, key: &str, unit: &str) -> Result<(), InputError> {
        if *v.get_ref() > 0.0 {
            Ok(())
        } else {
            Err(self.invalid(
                v,
                key,
                &format!("is not positive, expected a number of {unit} above 0"),
            ))
        }
    }

    /// Refuses a value outside its plausible range (a typing or unit mistake).
    fn plausible(&self, v: &Spanned<f64>, key: &str, range: Plausible) -> Result<(), InputError> {
        let x = *v.get_ref();
        if x >= range.min && x <= range.max {
            Ok(())
        } else {
            Err(self.invalid(v, key, range.why))
        }
    }

    fn efficiency(&self, v: &Spanned<f64>) -> Result<f64, InputError> {
        let e = *v.get_ref();
        if !(e > 0.0 && e <= 1.0) {
            Err(self.invalid(
                v,
                "joint_efficiency",
                "is out of range, expected more than 0 and at most 1 (e.g. 0.85)",
            ))
        } else if e < MIN_JOINT_EFFICIENCY {
            Err(self.invalid(
                v,
                "joint_efficiency",
                "is below 0.3, lower than any joint the tank codes rate (single-lap welds are \
                 about 0.35): a typing slip?",
            ))
        } else {
            Ok(e)
        }
    }

    fn optional_date(&self, key: &str) -> Result<Option<NaiveDate>, InputError> {
        let Some(v) = self.get(key) else {
            return Ok(None);
        };
        let expected = "a date, e.g. 1991-05-01";
        let date = match v.get_ref() {
            DeValue::Datetime(dt) => match (dt.date, dt.time) {
                (Some(d), None) => {
                    NaiveDate::from_ymd_opt(i32::from(d.year), u32::from(d.month), u32::from(d.day))
                }
                _ => None,
            },
            DeValue::String(s) => NaiveDate::parse_from_str(s, "%Y-%m-%d").ok(),
            _ => return Err(self.wrong_type(key, v, expected)),
        };
        match date {
            Some(d) => Ok(Some(d)),
            None => Err(self.invalid(
                v,
                key,
                &format!("is not a calendar date, expected {expected}"),
            )),
        }
    }

    fn optional_table(
        &self,
        key: &str,
        known: &[&str],
    ) -> Result<Option<Table<'d, 'i>>, InputError> {
        let Some(v) = self.get(key) else {
            return Ok(None);
        };
        match v.get_ref() {
            DeValue::Table(t) => {
                Table::new(self.doc, t, v.span(), Some(format!("[{key}]")), known).map(Some)
            }
            _ => Err(self.wrong_type(key, v, &format!("a table [{key}]"))),
        }
    }

    fn array_of_tables(
        &self,
        key: &'static str,
        known: &[&str],
    ) -> Result<Vec<Table<'d, 'i>>, InputError> {
        let expected = COURSES_EXPECTED;
        let Some(v) = self.get(key) else {
            return Err(self.missing(key, expected));
        };
        let DeValue::Array(items) = v.get_ref() else {
            return Err(self.wrong_type(key, v, expected));
        };
        let mut out = Vec::new();
        for (i, item) in items.iter().enumerate() {
            match item.get_ref() {
                DeValue::Table(t) => out.push(Table::new(
                    self.doc,
                    t,
                    item.span(),
                    Some(format!("{key} {}", i + 1)),
                    known,
                )?),
                _ => return Err(self.wrong_type(key, item, expected)),
            }
        }
        Ok(out)
    }
}

/// Where `key` sits inside a table below `table` (not at its own level): the table's
/// name as a message gives it, and the key's span. Searches a few levels deep.
fn find_nested(
    table: &DeTable<'_>,
    key: &str,
    prefix: &str,
    depth: usize,
) -> Option<(String, Range<usize>)> {
    if depth > 4 {
        return None;
    }
    let mut entries: Vec<_> = table.iter().collect();
    entries.sort_by_key(|(k, _)| k.span().start);
    for (k, v) in entries {
        let name = if prefix.is_empty() {
            k.get_ref().to_string()
        } else {
            format!("{prefix}.{}", k.get_ref())
        };
        match v.get_ref() {
            DeValue::Table(t) => {
                if let Some((found, _)) = t.get_key_value(key) {
                    return Some((format!("[{}]", echo(&name)), found.span()));
                }
                if let Some(hit) = find_nested(t, key, &name, depth + 1) {
                    return Some(hit);
                }
            }
            DeValue::Array(items) => {
                for (i, item) in items.iter().enumerate() {
                    if let DeValue::Table(t) = item.get_ref() {
                        if let Some((found, _)) = t.get_key_value(key) {
                            return Some((format!("{} {}", echo(&name), i + 1), found.span()));
                        }
                        let inner = format!("{name} {}", i + 1);
                        if let Some(hit) = find_nested(t, key, &inner, depth + 1) {
                            return Some(hit);
                        }
                    }
                }
            }
            _ => {}
        }
    }
    None
}

fn type_name(v: &DeValue<'_>) -> &'static str {
    match v {
        DeValue::String(_) => "text",
        DeValue::Integer(_) => "integer",
        DeValue::Float(_) => "number",
        DeValue::Boolean(_) => "boolean",
        DeValue::Datetime(_) => "date",
        DeValue::Array(_) => "array",
        DeValue::Table(_) => "table",
    }
}
