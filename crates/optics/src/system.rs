//! Paraxial lens systems: thin lenses, refracting surfaces and gaps.
//!
//! Two independent routes are provided:
//!
//! - **Step-along vergence** ([`trace`]): `L' = L + F` at each refracting
//!   element, `L₂ = L₁' / (1 − (d/n)·L₁')` across a gap; per-element lateral
//!   magnification `m = L / L'`, total `m = Π m`.
//! - **Ray-transfer matrices** ([`system_matrix`]) acting on `(y, n·u)`:
//!   refraction `[[1, 0], [−F, 1]]`, transfer `[[1, d/n], [0, 1]]`. A system
//!   `[[A, B], [C, D]]` has determinant 1, equivalent power `−C`, back vertex
//!   power `−C/A` and front vertex power `−C/D`.
//!
//! # Media
//!
//! The running refractive index starts at the object-space index (1.0 for
//! [`system_matrix`]). A [`Element::Gap`] is filled with its own `index` and
//! makes it the running index; a [`Element::Surface`] refracts from the running
//! index to `index_after` with power `(n' − n)/r`. A [`Element::ThinLens`]
//! leaves the running index unchanged; its image space is the medium of the
//! gap that follows it, if any. The image-space index of a whole system is
//! the running index after its last element.
//!
//! Lengths in metres, powers and vergences in dioptres; distances positive to
//! the right.

use serde::Serialize;

/// Vergences or matrix elements with magnitude below this are treated as
/// zero (image or focus at infinity).
pub const ZERO_EPS: f64 = 1e-12;

/// One element of a paraxial system, in order from left to right.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum Element {
    /// A thin lens of the given power (dioptres).
    ThinLens {
        /// Power, dioptres.
        power: f64,
    },
    /// A gap between elements.
    Gap {
        /// Axial length, metres.
        length_m: f64,
        /// Refractive index of the medium filling the gap.
        index: f64,
    },
    /// A spherical refracting surface from the running index to `index_after`.
    Surface {
        /// Radius of curvature, metres (positive: centre to the right;
        /// infinite for a plane).
        radius_m: f64,
        /// Refractive index after the surface.
        index_after: f64,
    },
}

impl Element {
    /// Whether the element refracts (a thin lens or a surface), as opposed
    /// to a gap.
    pub fn is_refracting(&self) -> bool {
        !matches!(self, Element::Gap { .. })
    }
}

/// Where the object is.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum Object {
    /// An object at infinity (incident vergence 0).
    AtInfinity,
    /// A real object at a finite distance before the first element.
    Distance {
        /// Distance before (to the left of) the first element, metres;
        /// positive means to the left.
        before_first_m: f64,
    },
}

/// Where an image is.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum ImagePlace {
    /// At infinity (emergent vergence 0).
    AtInfinity,
    /// At a finite signed distance from a refracting element.
    At {
        /// Signed distance from the element, metres, positive to the right.
        after_element_m: f64,
        /// Real (converging light, `L' > 0`) or virtual (`L' < 0`).
        real: bool,
    },
}

/// The vergence record at one refracting element.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Step {
    /// Index of the element in the input slice.
    pub element_index: usize,
    /// Reduced vergence arriving at the element, dioptres.
    pub incident_vergence: f64,
    /// Reduced vergence leaving the element, dioptres.
    pub emergent_vergence: f64,
    /// Image formed by this element, measured from it.
    pub image: ImagePlace,
    /// Lateral magnification `L / L'` of this element; `None` for an object
    /// at infinity or when this image is at infinity.
    pub magnification: Option<f64>,
}

/// The result of a step-along vergence trace.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Trace {
    /// One step per refracting element, in order.
    pub steps: Vec<Step>,
    /// Final image, measured from the last refracting element.
    pub final_image: ImagePlace,
    /// Total lateral magnification; `None` for an object at infinity or a
    /// final image at infinity.
    pub total_magnification: Option<f64>,
    /// Whether the final image is erect (`m > 0`); `None` when the
    /// magnification is undefined.
    pub erect: Option<bool>,
}

/// Reduced vergence `vergence` after travelling `distance_m` through index
/// `index`: `L / (1 − (d/n)·L)`.
pub fn transfer_vergence(vergence: f64, distance_m: f64, index: f64) -> f64 {
    vergence / (1.0 - (distance_m / index) * vergence)
}

fn image_place(vergence: f64, n_image: f64) -> ImagePlace {
    if vergence.abs() < ZERO_EPS {
        ImagePlace::AtInfinity
    } else {
        ImagePlace::At {
            after_element_m: n_image / vergence,
            real: vergence > 0.0,
        }
    }
}

/// Traces an object through `elements` by step-along vergence, the object
/// being in a medium of index `object_index`.
///
/// The total magnification is the product of the per-element
/// magnifications; when an intermediate image lies at infinity that product
/// is undefined and the matrix value ([`matrix_image`]) is used instead.
/// Without any refracting element the "image" is the object itself, located
/// relative to the end of the element list.
pub fn trace(object: Object, elements: &[Element], object_index: f64) -> Trace {
    let mut n = object_index;
    let mut vergence = match object {
        Object::AtInfinity => 0.0,
        Object::Distance { before_first_m } => -object_index / before_first_m,
    };
    let finite_object = matches!(object, Object::Distance { .. });
    let mut steps = Vec::new();
    for (i, el) in elements.iter().enumerate() {
        let (power, n_after) = match *el {
            Element::Gap { length_m, index } => {
                vergence = transfer_vergence(vergence, length_m, index);
                n = index;
                continue;
            }
            Element::ThinLens { power } => (power, n),
            Element::Surface {
                radius_m,
                index_after,
            } => ((index_after - n) / radius_m, index_after),
        };
        let n_image = match elements.get(i + 1) {
            Some(Element::Gap { index, .. }) => *index,
            _ => n_after,
        };
        let incident = vergence;
        let emergent = incident + power;
        let magnification = if finite_object && emergent.abs() >= ZERO_EPS {
            Some(incident / emergent)
        } else {
            None
        };
        steps.push(Step {
            element_index: i,
            incident_vergence: incident,
            emergent_vergence: emergent,
            image: image_place(emergent, n_image),
            magnification,
        });
        vergence = emergent;
        n = n_after;
    }

    let Some(last) = steps.last() else {
        let total_gap: f64 = elements
            .iter()
            .map(|e| match e {
                Element::Gap { length_m, .. } => *length_m,
                _ => 0.0,
            })
            .sum();
        let (final_image, m) = match object {
            Object::AtInfinity => (ImagePlace::AtInfinity, None),
            Object::Distance { before_first_m } => (
                ImagePlace::At {
                    after_element_m: -(before_first_m + total_gap),
                    real: false,
                },
                Some(1.0),
            ),
        };
        return Trace {
            steps,
            final_image,
            total_magnification: m,
            erect: m.map(|m| m > 0.0),
        };
    };
    let final_image = last.image;
    let product: Option<f64> = steps
        .iter()
        .map(|s| s.magnification)
        .try_fold(1.0, |acc, m| m.map(|m| acc * m));
    let total_magnification = match (object, final_image) {
        (Object::AtInfinity, _) | (_, ImagePlace::AtInfinity) => None,
        _ => product
            .filter(|p| p.is_finite())
            .or_else(|| matrix_image(object, elements, object_index).1),
    };
    Trace {
        steps,
        final_image,
        total_magnification,
        erect: total_magnification.map(|m| m > 0.0),
    }
}

/// A paraxial ray through `elements`: given its height `y` (metres) and reduced
/// angle `nu` (n·u, radians) just before the first element, returns its height
/// at every refracting element, in order, and its height and reduced angle just
/// after the last element, by the ray-transfer matrices of [`Matrix2`]
/// (refraction `n'u' = nu − y·F`, transfer `y' = y + (d/n)·nu`).
pub fn ray_heights(
    elements: &[Element],
    y: f64,
    nu: f64,
    object_index: f64,
) -> (Vec<f64>, f64, f64) {
    let (mut y, mut nu, mut n) = (y, nu, object_index);
    let mut heights = Vec::new();
    for el in elements {
        let m = match *el {
            Element::Gap { length_m, index } => {
                n = index;
                Matrix2::transfer(length_m, index)
            }
            Element::ThinLens { power } => {
                heights.push(y);
                Matrix2::refraction(power)
            }
            Element::Surface {
                radius_m,
                index_after,
            } => {
                heights.push(y);
                let p = (index_after - n) / radius_m;
                n = index_after;
                Matrix2::refraction(p)
            }
        };
        (y, nu) = (m.a * y + m.b * nu, m.c * y + m.d * nu);
    }
    (heights, y, nu)
}

/// The image one refracting element forms, placed along the axis.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PlacedImage {
    /// Axial position, metres from the first element; `None` at infinity.
    pub at_m: Option<f64>,
    /// Real (converging light) or virtual; `false` at infinity.
    pub real: bool,
    /// Height relative to the object's (the product of the magnifications so
    /// far); `None` when undefined (object or an earlier image at infinity).
    pub height: Option<f64>,
}

/// The chief ray of a finite object: from the object's tip (height 1 at the
/// object) through the centre of the first element.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ChiefRay {
    /// Height at each refracting element, in order (object height = 1).
    pub heights: Vec<f64>,
    /// Height just after the last element (at [`Layout::end_m`]).
    pub exit_height: f64,
    /// Slope after the last element, `u = n'u' / n'` (height per metre).
    pub exit_slope: f64,
}

/// A system laid out along its axis: where each refracting element stands,
/// its power, the image each forms and the chief ray, for a drawing of it.
/// Heights are relative to the object's.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Layout {
    /// Axial position of each refracting element, metres from the first
    /// (the sum of the gap lengths before it).
    pub positions: Vec<f64>,
    /// Power of each refracting element, dioptres (a surface's `(n' − n)/r`
    /// in the running index).
    pub powers: Vec<f64>,
    /// Axial position of the end of the element list (after its last gap).
    pub end_m: f64,
    /// The image formed by each refracting element ([`trace`]).
    pub images: Vec<PlacedImage>,
    /// The chief ray ([`ray_heights`]); `None` for an object at infinity.
    pub chief_ray: Option<ChiefRay>,
}

/// Lay `elements` out along the axis for an object in air (index 1.0): positions
/// by adding up gap lengths, images by [`trace`] (heights as the running
/// product of the magnifications), the chief ray by [`ray_heights`] from the
/// object's tip through the centre of the first element.
pub fn layout(object: Object, elements: &[Element]) -> Layout {
    let (mut z, mut n) = (0.0, 1.0);
    let (mut positions, mut powers) = (Vec::new(), Vec::new());
    for e in elements {
        match *e {
            Element::ThinLens { power } => {
                positions.push(z);
                powers.push(power);
            }
            Element::Surface {
                radius_m,
                index_after,
            } => {
                positions.push(z);
                powers.push((index_after - n) / radius_m);
                n = index_after;
            }
            Element::Gap { length_m, index } => {
                z += length_m;
                n = index;
            }
        }
    }
    let t = trace(object, elements, 1.0);
    let mut height = Some(1.0);
    let images = t
        .steps
        .iter()
        .zip(&positions)
        .map(|(step, x)| {
            height = height.zip(step.magnification).map(|(h, m)| h * m);
            match step.image {
                ImagePlace::AtInfinity => PlacedImage {
                    at_m: None,
                    real: false,
                    height,
                },
                ImagePlace::At {
                    after_element_m,
                    real,
                } => PlacedImage {
                    at_m: Some(x + after_element_m),
                    real,
                    height,
                },
            }
        })
        .collect();
    let chief_ray = match object {
        Object::Distance { before_first_m } if !positions.is_empty() => {
            let (heights, y, nu) = ray_heights(elements, 0.0, -1.0 / before_first_m, 1.0);
            Some(ChiefRay {
                heights,
                exit_height: y,
                exit_slope: nu / n,
            })
        }
        _ => None,
    };
    Layout {
        positions,
        powers,
        end_m: z,
        images,
        chief_ray,
    }
}

/// A 2×2 ray-transfer matrix acting on the column `(y, n·u)`:
/// `y' = a·y + b·(n u)`, `(n'u') = c·y + d·(n u)`.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Matrix2 {
    /// Top-left element A.
    pub a: f64,
    /// Top-right element B (metres).
    pub b: f64,
    /// Bottom-left element C (dioptres; `−C` is the equivalent power).
    pub c: f64,
    /// Bottom-right element D.
    pub d: f64,
}

impl Matrix2 {
    /// The identity matrix.
    pub const IDENTITY: Matrix2 = Matrix2 {
        a: 1.0,
        b: 0.0,
        c: 0.0,
        d: 1.0,
    };

    /// Refraction by power `power` (D): `[[1, 0], [−F, 1]]`.
    pub fn refraction(power: f64) -> Self {
        Matrix2 {
            a: 1.0,
            b: 0.0,
            c: -power,
            d: 1.0,
        }
    }

    /// Transfer across `d_m` metres of index `n`: `[[1, d/n], [0, 1]]`.
    pub fn transfer(d_m: f64, n: f64) -> Self {
        Matrix2 {
            a: 1.0,
            b: d_m / n,
            c: 0.0,
            d: 1.0,
        }
    }

    /// `self` followed by `next`: the product `next · self`.
    pub fn then(&self, next: &Matrix2) -> Matrix2 {
        Matrix2 {
            a: next.a * self.a + next.b * self.c,
            b: next.a * self.b + next.b * self.d,
            c: next.c * self.a + next.d * self.c,
            d: next.c * self.b + next.d * self.d,
        }
    }

    /// Determinant `AD − BC` (1 for any system on `(y, n·u)`).
    pub fn det(&self) -> f64 {
        self.a * self.d - self.b * self.c
    }
}

/// The system matrix of `elements`, object space of index 1.0 (air).
/// Equivalent to [`system_matrix_in`] with `object_index = 1.0`.
pub fn system_matrix(elements: &[Element]) -> Matrix2 {
    system_matrix_in(elements, 1.0)
}

/// The system matrix of `elements`, from the first to the last element,
/// with object-space index `object_index` (used by the first
/// [`Element::Surface`]).
pub fn system_matrix_in(elements: &[Element], object_index: f64) -> Matrix2 {
    let mut n = object_index;
    elements.iter().fold(Matrix2::IDENTITY, |m, el| match *el {
        Element::ThinLens { power } => m.then(&Matrix2::refraction(power)),
        Element::Gap { length_m, index } => {
            n = index;
            m.then(&Matrix2::transfer(length_m, index))
        }
        Element::Surface {
            radius_m,
            index_after,
        } => {
            let power = (index_after - n) / radius_m;
            n = index_after;
            m.then(&Matrix2::refraction(power))
        }
    })
}

/// The refractive index after the last element of `elements`, starting
/// from `object_index` (the image-space index of the system).
pub fn image_space_index(elements: &[Element], object_index: f64) -> f64 {
    elements.iter().fold(object_index, |n, el| match *el {
        Element::ThinLens { .. } => n,
        Element::Gap { index, .. } => index,
        Element::Surface { index_after, .. } => index_after,
    })
}

/// Image position and total magnification by the matrix route: the second,
/// independent route to [`trace`]'s final image.
///
/// Trailing gaps are excluded so that the image is measured from the last
/// refracting element, as in [`trace`]; their index sets the image space.
/// For an object at `u` metres before the first element, with system
/// `[[A, B], [C, D]]`: `B₁ = A·u/n + B`, `D₁ = C·u/n + D`, image at
/// `l' = −n'·B₁/D₁`, magnification `1/D₁`. For an object at infinity the image
/// is the back focal point `−n'·A/C` and the magnification is `None`.
pub fn matrix_image(
    object: Object,
    elements: &[Element],
    object_index: f64,
) -> (ImagePlace, Option<f64>) {
    let n_image = image_space_index(elements, object_index);
    let end = elements
        .iter()
        .rposition(Element::is_refracting)
        .map_or(0, |i| i + 1);
    let m = system_matrix_in(&elements[..end], object_index);
    match object {
        Object::AtInfinity => {
            if m.c.abs() < ZERO_EPS {
                (ImagePlace::AtInfinity, None)
            } else {
                let l = -n_image * m.a / m.c;
                (
                    ImagePlace::At {
                        after_element_m: l,
                        real: l > 0.0,
                    },
                    None,
                )
            }
        }
        Object::Distance { before_first_m } => {
            let reduced = before_first_m / object_index;
            let b1 = m.a * reduced + m.b;
            let d1 = m.c * reduced + m.d;
            if d1.abs() < ZERO_EPS {
                (ImagePlace::AtInfinity, None)
            } else {
                let l = -n_image * b1 / d1;
                // The final reduced vergence is n'/l' = −D₁/B₁; its sign decides reality.
                (
                    ImagePlace::At {
                        after_element_m: l,
                        real: -d1 / b1 > 0.0,
                    },
                    Some(1.0 / d1),
                )
            }
        }
    }
}

/// Powers of a system, dioptres.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SystemPowers {
    /// Equivalent power `−C`.
    pub equivalent: f64,
    /// Back vertex power `−C/A` (reduced vergence of the back focal point
    /// from the last element).
    pub back_vertex: f64,
    /// Front vertex power `−C/D` (neutralising power measured at the first
    /// element).
    pub front_vertex: f64,
}

/// Equivalent, back vertex and front vertex powers of a system matrix.
/// Infinite vertex powers arise when a focal point lies on a vertex.
pub fn system_powers(m: &Matrix2) -> SystemPowers {
    SystemPowers {
        equivalent: -m.c,
        back_vertex: -m.c / m.a,
        front_vertex: -m.c / m.d,
    }
}

/// Cardinal points of a system, metres, positive to the right.
///
/// `front_*` positions are measured from the **first** element, `back_*`
/// positions from the **last** element (the ends of the matrix).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct CardinalPoints {
    /// First (front) focal point, from the first element: `n·D/C`.
    pub front_focal: f64,
    /// Second (back) focal point, from the last element: `−n'·A/C`.
    pub back_focal: f64,
    /// First principal point, from the first element: `n·(D − 1)/C`.
    pub front_principal: f64,
    /// Second principal point, from the last element: `n'·(1 − A)/C`.
    pub back_principal: f64,
    /// First nodal point, from the first element: principal + `(n' − n)/F`.
    pub front_nodal: f64,
    /// Second nodal point, from the last element: principal + `(n' − n)/F`.
    pub back_nodal: f64,
}

/// Cardinal points of system matrix `m` with object-space index `n_object`
/// and image-space index `n_image`. `None` for an afocal system (`|C| < 1e-12`).
pub fn cardinal_points(m: &Matrix2, n_object: f64, n_image: f64) -> Option<CardinalPoints> {
    if m.c.abs() < ZERO_EPS {
        return None;
    }
    let power = -m.c;
    let front_principal = n_object * (m.d - 1.0) / m.c;
    let back_principal = n_image * (1.0 - m.a) / m.c;
    let nodal_shift = (n_image - n_object) / power;
    Some(CardinalPoints {
        front_focal: n_object * m.d / m.c,
        back_focal: -n_image * m.a / m.c,
        front_principal,
        back_principal,
        front_nodal: front_principal + nodal_shift,
        back_nodal: back_principal + nodal_shift,
    })
}
