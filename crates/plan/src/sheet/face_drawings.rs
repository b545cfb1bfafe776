//! Each face that carries gauges drawn to scale, with its gauges.

use gw_mechanics::Face;

use super::layout::{MARGIN, Op};
use super::mm;
use super::writer::Writer;
use crate::document::Part;

/// Draws each face that carries gauges, to scale (round faces unrolled: axial position across,
/// arc length up), with the gauges, their ids and grid directions.
pub(crate) fn draw(w: &mut Writer, part: &Part, placed: &[gw_bridge::PlacedGauge]) {
    let faces = part.member.faces();
    for extent in faces {
        let gauges: Vec<_> = placed
            .iter()
            .filter(|g| g.position.face == extent.face)
            .collect();
        if gauges.is_empty() {
            continue;
        }
        let (x0, x1) = extent.x_range_m;
        let (s0, s1) = extent.s_range_m;
        let avail_w = w.width - 2.0 * MARGIN;
        let scale = (avail_w as f64 / (x1 - x0)).min(160.0 / (s1 - s0));
        let h = ((s1 - s0) * scale) as f32;
        w.room(h + 40.0);
        let y0 = w.y;
        let title = if extent.face == Face::Round {
            format!(
                "{} (unrolled: axial position across, arc length up), scale 1:{:.1}",
                extent.face.name(),
                1.0 / (scale / 2834.6)
            )
        } else {
            format!(
                "{}, scale 1:{:.1}",
                extent.face.name(),
                1.0 / (scale / 2834.6)
            )
        };
        w.text_at(MARGIN, y0, 9.0, true, title);
        let top = y0 + 6.0;
        let to = |x: f64, s: f64| -> (f32, f32) {
            (
                MARGIN + ((x - x0) * scale) as f32,
                top + ((s1 - s) * scale) as f32,
            )
        };
        w.ops().push(Op::Rect {
            x: MARGIN,
            y: top,
            w: ((x1 - x0) * scale) as f32,
            h,
            fill: Some(245),
            stroke: 0.8,
        });
        if let Some(a) = extent.hole_radius_m {
            let (cx, cy) = to(0.0, 0.0);
            let r = (a * scale) as f32;
            w.ops().push(Op::Rect {
                x: cx - r,
                y: cy - r,
                w: 2.0 * r,
                h: 2.0 * r,
                fill: Some(255),
                stroke: 0.8,
            });
        }
        let (dx, ds) = part.datum_m;
        let (ux, uy) = to(dx, ds);
        w.ops().push(Op::Line {
            x1: ux - 5.0,
            y1: uy,
            x2: ux + 5.0,
            y2: uy,
            width: 0.8,
            grey: 0,
        });
        w.ops().push(Op::Line {
            x1: ux,
            y1: uy - 5.0,
            x2: ux,
            y2: uy + 5.0,
            width: 0.8,
            grey: 0,
        });
        for g in &gauges {
            for e in 0..g.element_count() {
                let fp = g.footprint(e);
                let c = fp.corners();
                for k in 0..4 {
                    let (ax, ay) = to(c[k].x_m, c[k].s_m);
                    let (bx, by) = to(c[(k + 1) % 4].x_m, c[(k + 1) % 4].s_m);
                    w.ops().push(Op::Line {
                        x1: ax,
                        y1: ay,
                        x2: bx,
                        y2: by,
                        width: 0.9,
                        grey: 0,
                    });
                }
                let (sin, cos) = fp.angle_rad.sin_cos();
                let half = fp.length_m;
                let (ax, ay) = to(fp.center.x_m - half * cos, fp.center.s_m - half * sin);
                let (bx, by) = to(fp.center.x_m + half * cos, fp.center.s_m + half * sin);
                w.ops().push(Op::Line {
                    x1: ax,
                    y1: ay,
                    x2: bx,
                    y2: by,
                    width: 0.4,
                    grey: 80,
                });
            }
            let (gx, gy) = to(g.position.x_m, g.position.s_m);
            w.text_at(gx + 4.0, gy - 4.0, 8.0, true, g.id.clone());
            // Dimensions from the datum beside each gauge.
            w.text_at(
                gx + 4.0,
                gy + 6.0,
                6.5,
                false,
                format!(
                    "{:.1} / {:.1} mm",
                    (g.position.x_m - dx) * 1e3,
                    (g.position.s_m - ds) * 1e3
                ),
            );
        }
        w.y = top + h + 14.0;
        w.para(
            8.0,
            false,
            &format!(
                "Datum (+) at x = {}, s = {}. Positions below are measured from the datum.",
                mm(dx),
                mm(ds)
            ),
        );
    }
}
