//! From the syntax tree to the case model: each block's statements are matched
//! against the schema and read with [`Reader`]; whatever does not fit becomes a
//! diagnostic and the rest of the block is still read.

use crate::codes;
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::*;
use crate::read::Reader;
use crate::schema;
use crate::units::{self as u};
use parax_optics::keratometry::{keratometric_radius, KERATOMETRIC_INDEX};
use parax_syntax::{Block, BlockKind, LineKind, Parsed, Span, Symbol, Value, ValueKind};

/// Read every block of `p` into a [`Case`], appending diagnostics to `diags`.
pub fn lower(p: &Parsed, diags: &mut Vec<Diagnostic>) -> Case {
    let mut case = Case::default();
    // One entry per block at most: size each list once (a long history holds
    // tens of thousands of eye blocks; a growing vector keeps up to half spare).
    let count = |k: BlockKind| p.blocks.iter().filter(|b| b.kind == k).count();
    case.eyes.reserve_exact(count(BlockKind::Eye));
    case.frames.reserve_exact(count(BlockKind::Frame));
    case.systems.reserve_exact(count(BlockKind::System));
    case.spectacle_lenses
        .reserve_exact(count(BlockKind::SpectacleLens));
    case.contact_lenses
        .reserve_exact(count(BlockKind::ContactLens));
    case.model_eyes.reserve_exact(count(BlockKind::ModelEye));
    for block in &p.blocks {
        lower_block(p, block, &mut case, diags);
    }
    case
}

fn statement_span(p: &Parsed, line: usize) -> Span {
    let l = &p.lines[line];
    let end = l.comment.map_or(l.span.end(), |c| c.start());
    let text = &p.source[l.span.start()..end];
    let start = l.span.start() + (text.len() - text.trim_start().len());
    Span::new(start, start + text.trim().len())
}

/// Read one block into `case`, appending diagnostics to `diags` (used alone by
/// the incremental evaluation for the blocks an edit touched).
pub(crate) fn lower_block(p: &Parsed, block: &Block, case: &mut Case, diags: &mut Vec<Diagnostic>) {
    let header = p.lines[block.header]
        .statement()
        .expect("a block starts with a header");
    let header_span = statement_span(p, block.header);
    let form = schema::header_form(block.kind);
    let first_header_diag = diags.len();
    let mut r = Reader::new(p, header, diags);
    let mut target = match block.kind {
        BlockKind::Case => {
            if !r.at_end() {
                case.info.title = r.text_value("the case title", form);
            }
            r.finish(form);
            Target::Case(Box::new(std::mem::take(&mut case.info)))
        }
        BlockKind::Eye => {
            let side = side(&mut r, form);
            let date = if r.at_end() { None } else { r.date(form) };
            r.finish(form);
            match side {
                Some(side) => Target::Eye(Box::new(Eye {
                    side,
                    date,
                    span: header_span,
                    refraction: None,
                    add: None,
                    keratometry: None,
                    keratometric_index: None,
                    posterior_radius: None,
                    corneal_thickness: None,
                    axial_length: None,
                    pd: None,
                    age: None,
                    iol_constant: None,
                    iol_target: None,
                    iol_elp: None,
                    iol_power: None,
                    refractive_surgery: None,
                    expects: Vec::new(),
                })),
                None => Target::Skip,
            }
        }
        BlockKind::Frame => {
            let name = if r.at_end() {
                None
            } else {
                r.text_value("the frame name", form)
            };
            r.finish(form);
            Target::Frame(Frame {
                name,
                span: header_span,
                ..Frame::default()
            })
        }
        BlockKind::System => {
            let name = if r.at_end() {
                r.missing::<()>("the system name", form);
                format!("system-{}", case.systems.len() + 1)
            } else {
                r.text_value("the system name", form).unwrap_or_default()
            };
            r.finish(form);
            Target::System(System {
                name,
                span: header_span,
                object: At {
                    value: ObjectAt::Infinity,
                    span: header_span,
                },
                elements: Vec::new(),
                expects: Vec::new(),
            })
        }
        BlockKind::SpectacleLens => {
            let side = side(&mut r, form);
            r.finish(form);
            match side {
                Some(side) => Target::Spectacle(Box::new(SpectacleLens {
                    side,
                    span: header_span,
                    power: None,
                    add: None,
                    prism: None,
                    index: None,
                    material: None,
                    base_curve: None,
                    centre_thickness: None,
                    edge_thickness: None,
                    blank_diameter: None,
                    measured: None,
                    measured_add: None,
                    measured_prism: None,
                    expects: Vec::new(),
                })),
                None => Target::Skip,
            }
        }
        BlockKind::ContactLens => {
            let side = side(&mut r, form);
            r.finish(form);
            match side {
                Some(side) => Target::Contact(ContactLens {
                    side,
                    span: header_span,
                    base_curve: None,
                    kind: None,
                    power: None,
                    diameter: None,
                    expects: Vec::new(),
                }),
                None => Target::Skip,
            }
        }
        BlockKind::ModelEye => {
            let name = if r.at_end() {
                r.missing::<()>("the model name", form);
                format!("model-{}", case.model_eyes.len() + 1)
            } else {
                r.text_value("the model name", form).unwrap_or_default()
            };
            r.finish(form);
            Target::Model(ModelEye {
                name,
                span: header_span,
                from: None,
                axial_length: None,
                surfaces: Vec::new(),
                expects: Vec::new(),
            })
        }
    };
    // Shape errors on the header line are header errors.
    for d in &mut diags[first_header_diag..] {
        if d.code == codes::BAD_VALUES {
            d.code = codes::BAD_HEADER;
        }
    }
    let mut seen: Vec<&str> = Vec::new();
    for line in block.body() {
        let LineKind::Statement { statement } = &p.lines[line].kind else {
            continue;
        };
        let span = statement_span(p, line);
        let kw = p.keyword(statement);
        let Some(spec) = schema::keyword(block.kind, kw) else {
            diags.push(unknown_keyword(block.kind, kw, statement.keyword));
            continue;
        };
        if !spec.repeatable {
            if seen.contains(&kw) {
                diags.push(
                    Diagnostic::new(
                        codes::DUPLICATE,
                        Severity::Warning,
                        statement.keyword,
                        format!("`{kw}` appears more than once in this block; this one is ignored"),
                    )
                    .hint("keep one, or record a later visit as a block of its own"),
                );
                continue;
            }
            seen.push(kw);
        }
        let mut r = Reader::new(p, statement, diags);
        lower_statement(&mut r, &mut target, kw, spec.form, span);
    }
    // The block's lists are complete: give back their spare room (a vector that
    // grew by pushes holds up to twice its length; on a 5 MB file the `expect`
    // lists alone left 3.6 MB empty).
    match target {
        Target::Eye(mut eye) => {
            eye.expects.shrink_to_fit();
            crate::push_growing_slowly(&mut case.eyes, *eye)
        }
        Target::Frame(mut f) => {
            f.expects.shrink_to_fit();
            crate::push_growing_slowly(&mut case.frames, f)
        }
        Target::System(mut s) => {
            s.elements.shrink_to_fit();
            s.expects.shrink_to_fit();
            crate::push_growing_slowly(&mut case.systems, s)
        }
        Target::Spectacle(mut l) => {
            l.expects.shrink_to_fit();
            case.spectacle_lenses.push(*l)
        }
        Target::Contact(mut c) => {
            c.expects.shrink_to_fit();
            case.contact_lenses.push(c)
        }
        Target::Model(mut m) => {
            m.surfaces.shrink_to_fit();
            m.expects.shrink_to_fit();
            case.model_eyes.push(m)
        }
        Target::Case(info) => case.info = *info,
        Target::Skip => {}
    }
}

enum Target {
    /// The case block's facts, put back into the case at the block's end.
    Case(Box<CaseInfo>),
    Eye(Box<Eye>),
    Frame(Frame),
    System(System),
    Spectacle(Box<SpectacleLens>),
    Contact(ContactLens),
    Model(ModelEye),
    /// A block whose header could not be read.
    Skip,
}

fn side(r: &mut Reader<'_>, form: &str) -> Option<Side> {
    match r.word_of(&["right", "left"], "a side", form)? {
        "right" => Some(Side::Right),
        _ => Some(Side::Left),
    }
}

fn unknown_keyword(kind: BlockKind, kw: &str, span: Span) -> Diagnostic {
    let names = schema::keywords(kind).iter().map(|k| k.name);
    let mut d = Diagnostic::new(
        codes::UNKNOWN_KEYWORD,
        Severity::Error,
        span,
        format!("`{kw}` is not a keyword of `{}` blocks", kind.keyword()),
    );
    if let Some(s) = parax_syntax::suggest::did_you_mean(kw, names) {
        d = d
            .hint(format!("did you mean `{s}`?"))
            .fix(format!("write `{s}`"), span, s);
    } else if let Some(other) = BlockKind::ALL
        .into_iter()
        .find(|k| *k != kind && schema::keyword(*k, kw).is_some())
    {
        d = d.hint(format!("`{kw}` belongs in a `{}` block", other.keyword()));
    } else {
        let all: Vec<&str> = schema::keywords(kind).iter().map(|k| k.name).collect();
        d = d.hint(format!(
            "`{}` blocks take: {}",
            kind.keyword(),
            all.join(", ")
        ));
    }
    d
}

fn at<T>(value: Option<T>, span: Span) -> Option<At<T>> {
    value.map(|value| At { value, span })
}

fn lower_statement(r: &mut Reader<'_>, target: &mut Target, kw: &str, form: &str, span: Span) {
    if kw == "expect" {
        let e = read_expect(r, form, span);
        match target {
            Target::Eye(eye) => eye.expects.extend(e),
            Target::Frame(f) => f.expects.extend(e),
            Target::System(s) => s.expects.extend(e),
            Target::Spectacle(l) => l.expects.extend(e),
            Target::Contact(c) => c.expects.extend(e),
            Target::Model(m) => m.expects.extend(e),
            Target::Case(_) | Target::Skip => {}
        }
        return;
    }
    if kw == "note" {
        let t = r.text_value("the note", form);
        if let (Target::Case(info), Some(t)) = (&mut *target, t) {
            info.notes.push(t);
        }
        r.finish(form);
        return;
    }
    match target {
        Target::Case(info) => {
            // Case facts are kept for reports (batch rows, grouping in `stats`).
            match kw {
                "date" => {
                    info.date = r.date(form);
                }
                "age" => {
                    info.age = at(r.quantity(&u::AGE, form), span);
                }
                "tag" => {
                    if let Some((t, _)) = r.word("a tag", form) {
                        info.tags.push(t.to_owned());
                    }
                }
                _ => {}
            }
        }
        Target::Eye(eye) => match kw {
            "refraction" => {
                let rx = r.rx(form);
                let written = r.symbol_if(Symbol::At);
                let vertex = if written {
                    r.quantity(&u::VERTEX, form)
                } else {
                    None
                };
                let vertex_unreadable = written && vertex.is_none();
                if let Some(rx) = rx {
                    eye.refraction = at(
                        Some(Refraction {
                            rx,
                            vertex,
                            vertex_unreadable,
                        }),
                        span,
                    );
                }
            }
            "add" => eye.add = at(r.quantity(&u::ADD, form), span),
            "keratometry" => eye.keratometry = at(read_keratometry(r, form), span),
            "keratometric-index" => eye.keratometric_index = at(r.quantity(&u::INDEX, form), span),
            "posterior-radius" => {
                eye.posterior_radius = at(r.quantity(&u::POSTERIOR_RADIUS, form), span)
            }
            "corneal-thickness" => {
                eye.corneal_thickness = at(r.quantity(&u::CORNEAL_THICKNESS, form), span)
            }
            "axial-length" => eye.axial_length = at(r.quantity(&u::AXIAL_LENGTH, form), span),
            "pd" => eye.pd = at(r.quantity(&u::PD, form), span),
            "age" => eye.age = at(r.quantity(&u::AGE, form), span),
            "iol-constant" => eye.iol_constant = at(r.quantity(&u::IOL_CONSTANT, form), span),
            "iol-target" => eye.iol_target = at(r.quantity(&u::IOL_TARGET, form), span),
            "iol-elp" => eye.iol_elp = at(r.quantity(&u::IOL_ELP, form), span),
            "iol-power" => eye.iol_power = at(r.quantity(&u::IOL_POWER, form), span),
            "refractive-surgery" => eye.refractive_surgery = at(Some(r.rest()), span),
            _ => {}
        },
        Target::Frame(f) if kw == "boxed-lens-size" => {
            let width = r.quantity(&u::BOXED_SIZE, form);
            let height = if r.axis_sign_if() {
                r.quantity(&u::BOXED_SIZE, form)
            } else {
                r.missing("`x HEIGHT mm` (the vertical boxed lens size)", form)
            };
            if let (Some(w), Some(h)) = (width, height) {
                f.boxed_lens_size = Some(At {
                    value: (w, h),
                    span,
                });
            }
        }
        Target::Frame(f) => {
            let spec = match kw {
                "vertex" => &u::VERTEX,
                "pantoscopic-tilt" => &u::TILT,
                "face-form" => &u::FACE_FORM,
                "fitting-height" => &u::FITTING_HEIGHT,
                "reading-drop" => &u::READING_DROP,
                "near-inset" => &u::NEAR_INSET,
                "distance-between-lenses" => &u::DISTANCE_BETWEEN_LENSES,
                "effective-diameter" => &u::EFFECTIVE_DIAMETER,
                _ => &u::CENTRE_DISTANCE,
            };
            let v = at(r.quantity(spec, form), span);
            let slot = match kw {
                "vertex" => &mut f.vertex,
                "pantoscopic-tilt" => &mut f.pantoscopic_tilt,
                "face-form" => &mut f.face_form,
                "fitting-height" => &mut f.fitting_height,
                "reading-drop" => &mut f.reading_drop,
                "near-inset" => &mut f.near_inset,
                "distance-between-lenses" => &mut f.distance_between_lenses,
                "effective-diameter" => &mut f.effective_diameter,
                _ => &mut f.centre_distance,
            };
            *slot = v;
        }
        Target::System(s) => match kw {
            "object" => {
                if r.word_if("at") {
                    if r.word_if("infinity") {
                        s.object = At {
                            value: ObjectAt::Infinity,
                            span,
                        };
                    } else {
                        r.missing::<()>("`infinity`", form);
                    }
                } else if let Some(d) = r.quantity(&u::OBJECT_DISTANCE, form) {
                    if r.word_if("before") {
                        if let Some((label, label_span)) = r.word("a lens label", form) {
                            let value = ObjectAt::Before {
                                distance: d,
                                label: label.to_owned(),
                                label_span,
                            };
                            s.object = At { value, span };
                        }
                    } else {
                        r.missing::<()>("`before LABEL`", form);
                    }
                }
            }
            "lens" => {
                let label = r.word("a lens label", form);
                let power = r.quantity(&u::LENS_POWER, form);
                if let (Some((label, lspan)), Some(power)) = (label, power) {
                    check_label_unused(r, s, label, lspan);
                    s.elements.push(At {
                        value: SystemElement::Lens {
                            label: label.to_owned(),
                            power,
                        },
                        span,
                    });
                }
            }
            "surface" => {
                let label = r.word("a surface label", form);
                let radius = r.quantity(&u::SURFACE_RADIUS, form);
                let index = if r.word_if("index") {
                    r.quantity(&u::INDEX, form)
                } else {
                    r.missing("`index N` (the index after the surface)", form)
                };
                if let (Some((label, lspan)), Some(radius), Some(index_after)) =
                    (label, radius, index)
                {
                    check_label_unused(r, s, label, lspan);
                    s.elements.push(At {
                        value: SystemElement::Surface {
                            label: label.to_owned(),
                            radius,
                            index_after,
                        },
                        span,
                    });
                }
            }
            "gap" => {
                let length = r.quantity(&u::GAP, form);
                let index = if r.word_if("index") {
                    r.quantity(&u::INDEX, form)
                } else {
                    Some(1.0)
                };
                if let (Some(length), Some(index)) = (length, index) {
                    s.elements.push(At {
                        value: SystemElement::Gap { length, index },
                        span,
                    });
                }
            }
            _ => {
                r.rest();
            }
        },
        Target::Spectacle(l) => match kw {
            "power" => l.power = at(r.rx(form), span),
            "measured" => l.measured = at(r.rx(form), span),
            "add" => l.add = at(r.quantity(&u::ADD, form), span),
            "prism" => l.prism = at(read_prism(r, form), span),
            "measured-prism" => l.measured_prism = at(read_prism(r, form), span),
            "measured-add" => l.measured_add = at(r.quantity(&u::ADD, form), span),
            "index" => l.index = at(r.quantity(&u::INDEX, form), span),
            "material" => l.material = at(r.text_value("the material name", form), span),
            "base-curve" => l.base_curve = at(r.quantity(&u::BASE_CURVE_POWER, form), span),
            "centre-thickness" => {
                l.centre_thickness = at(r.quantity(&u::LENS_THICKNESS, form), span)
            }
            "edge-thickness" => l.edge_thickness = at(r.quantity(&u::LENS_THICKNESS, form), span),
            _ => l.blank_diameter = at(r.quantity(&u::DIAMETER, form), span),
        },
        Target::Contact(c) => match kw {
            "base-curve" => c.base_curve = at(r.quantity(&u::CL_BASE_CURVE, form), span),
            "kind" => {
                c.kind = at(
                    r.word_of(&["rigid", "soft"], "a lens type", form)
                        .map(str::to_owned),
                    span,
                )
            }
            "power" => c.power = at(r.rx(form), span),
            _ => c.diameter = at(r.quantity(&u::DIAMETER, form), span),
        },
        Target::Model(m) => match kw {
            "from" => {
                m.from = at(
                    r.word_of(
                        &["gullstrand", "le-grand", "emsley"],
                        "a schematic eye",
                        form,
                    )
                    .map(str::to_owned),
                    span,
                )
            }
            "axial-length" => m.axial_length = at(r.quantity(&u::AXIAL_LENGTH, form), span),
            _ => {
                if let Some(o) = read_surface_override(r, form) {
                    m.surfaces.push(At { value: o, span });
                }
            }
        },
        Target::Skip => {
            r.rest();
        }
    }
    r.finish(form);
}

fn read_prism(r: &mut Reader<'_>, form: &str) -> Option<PrismRx> {
    let amount = r.quantity(&u::PRISM, form);
    let base = r.word_of(&["BU", "BD", "BI", "BO"], "a base direction", form);
    Some(PrismRx {
        amount: amount?,
        base: base?.to_owned(),
    })
}

/// Report a lens or surface label that an earlier element of the system already uses.
fn check_label_unused(r: &mut Reader<'_>, s: &System, label: &str, span: Span) {
    if s.elements
        .iter()
        .any(|e| element_label(&e.value) == Some(label))
    {
        r.diags.push(Diagnostic::new(
            codes::SYSTEM_LAYOUT,
            Severity::Error,
            span,
            format!("the label `{label}` is already used in this system"),
        ));
    }
}

fn element_label(e: &SystemElement) -> Option<&str> {
    match e {
        SystemElement::Lens { label, .. } | SystemElement::Surface { label, .. } => Some(label),
        SystemElement::Gap { .. } => None,
    }
}

fn read_surface_override(r: &mut Reader<'_>, form: &str) -> Option<SurfaceOverride> {
    let n = r.quantity(&u::LEVEL, form)?;
    if n < 1.0 || n.fract() != 0.0 {
        return r.missing("a surface number 1, 2, 3, …", form);
    }
    if !r.word_if("radius") {
        return r.missing("`radius RADIUS mm`", form);
    }
    let radius = r.quantity(&u::SURFACE_RADIUS, form)?;
    let mut o = SurfaceOverride {
        number: n as usize,
        radius,
        index: None,
        distance: None,
    };
    if r.word_if("index") {
        o.index = Some(r.quantity(&u::INDEX, form)?);
    }
    if r.word_if("distance") {
        o.distance = Some(r.quantity(&u::MODEL_DISTANCE, form)?);
    }
    Some(o)
}

fn read_keratometry(r: &mut Reader<'_>, form: &str) -> Option<[KMeridian; 2]> {
    let index = KERATOMETRIC_INDEX;
    let mut out = Vec::with_capacity(2);
    for i in 0..2 {
        if i == 1 && !r.symbol_if(Symbol::Comma) {
            return match r.peek() {
                Some(v) => {
                    let t = r.text(v.span);
                    r.fail(
                        v.span,
                        format!("expected `,` and the second meridian, found `{t}`"),
                        form,
                    )
                }
                None => r.missing("the second meridian (`, RADIUS mm x MERIDIAN`)", form),
            };
        }
        let is_power = matches!(
            r.peek(),
            Some(Value { kind: ValueKind::Number { unit: Some(us), .. }, .. }) if matches!(r.text(*us), "D")
        );
        let (radius, as_power) = if is_power {
            (
                keratometric_radius(r.quantity(&u::K_POWER, form)?, index),
                true,
            )
        } else {
            (r.quantity(&u::CORNEAL_RADIUS, form)?, false)
        };
        if !(r.axis_sign_if() || r.symbol_if(Symbol::At)) {
            return r.missing("`x` and the meridian", form);
        }
        let meridian = r.axis(&u::MERIDIAN, form)?;
        out.push(KMeridian {
            radius,
            meridian,
            as_power,
        });
    }
    Some([out[0], out[1]])
}

fn read_expect(r: &mut Reader<'_>, form: &str, span: Span) -> Option<Expect> {
    let (name, name_span) = r.word("the name of a computed value", form)?;
    let mut tokens = Vec::new();
    let mut tolerance = None;
    let mut value_span: Option<Span> = None;
    while let Some(v) = r.next_value() {
        if !matches!(
            v.kind,
            ValueKind::Symbol {
                symbol: Symbol::PlusMinus
            }
        ) && tolerance.is_none()
        {
            value_span = Some(value_span.map_or(v.span, |s| s.cover(v.span)));
        }
        match &v.kind {
            ValueKind::Number {
                number,
                value,
                unit,
                decimals,
                ..
            } => {
                let unit = unit.and_then(|us| u::unit_of(r.text(us)));
                let half = 0.5 * 10f64.powi(-(*decimals as i32));
                let (value, half_step) = match unit {
                    Some(un) => (un.to_base(*value), un.to_base(half)),
                    None => (*value, half),
                };
                tokens.push(ExpectToken::Number {
                    value,
                    unit,
                    half_step,
                    span: *number,
                });
            }
            ValueKind::Symbol {
                symbol: Symbol::PlusMinus,
            } => {
                let tv = r.next_value();
                match tv.map(|t| &t.kind) {
                    Some(ValueKind::Number { value, unit, .. }) => {
                        let unit = unit.and_then(|us| u::unit_of(r.text(us)));
                        tolerance = Some(unit.map_or(*value, |un| un.to_base(*value)));
                    }
                    _ => {
                        return r.missing("the tolerance after `±`", form);
                    }
                }
            }
            ValueKind::Word | ValueKind::Text { .. } => {
                let t = r.text(v.span);
                tokens.push(ExpectToken::Word {
                    word: t.trim_matches('"').to_owned(),
                })
            }
            ValueKind::AxisSign | ValueKind::Symbol { .. } | ValueKind::Date { .. } => {
                tokens.push(ExpectToken::Mark {
                    mark: r.text(v.span).to_owned(),
                })
            }
        }
    }
    // Exact length: most `expect` lines hold one to three values, and a pushed
    // vector starts with room for four (5.6 MB of empty room on a 5 MB file).
    tokens.shrink_to_fit();
    Some(Expect {
        name: name.to_owned(),
        name_span,
        tokens,
        tolerance,
        value_span,
        span,
    })
}
