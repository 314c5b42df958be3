// Chart.js (global `Chart` from the webjar) with our defaults, colour-blind-safe palette (Okabe & Ito 2008) and
// three small drawing plugins: interval bars, shaded bands with guide lines, and a white background for PNGs.

export const COLORS = {
  blue: '#0072B2', orange: '#E69F00', sky: '#56B4E9', green: '#009E73', vermillion: '#D55E00',
  purple: '#CC79A7', ink: '#22303a', muted: '#6b7780', grid: '#e4e2dc', paper: '#ffffff',
};

export function alpha(hex, a) {
  const n = parseInt(hex.slice(1), 16);
  return `rgba(${n >> 16},${(n >> 8) & 255},${n & 255},${a})`;
}

const background = {
  id: 'flBackground',
  beforeDraw(chart) {
    const { ctx, width, height } = chart;
    ctx.save();
    ctx.globalCompositeOperation = 'destination-over';
    ctx.fillStyle = COLORS.paper;
    ctx.fillRect(0, 0, width, height);
    ctx.restore();
  },
};

/** dataset.intervals: [{lower, upper}] per data point, drawn as a line with caps along the value axis. */
const intervals = {
  id: 'flIntervals',
  afterDatasetsDraw(chart) {
    const { ctx } = chart;
    const horizontal = chart.options.indexAxis === 'y';
    chart.data.datasets.forEach((ds, i) => {
      if (!ds.intervals || !chart.isDatasetVisible(i)) return;
      const meta = chart.getDatasetMeta(i);
      const scale = chart.scales[horizontal ? meta.xAxisID : meta.yAxisID];
      ctx.save();
      ctx.strokeStyle = ds.intervalColor ?? COLORS.ink;
      ctx.lineWidth = 1.5;
      meta.data.forEach((el, j) => {
        const iv = ds.intervals[j];
        if (!iv || iv.lower === null || iv.upper === null) return;
        const a = scale.getPixelForValue(iv.lower);
        const b = scale.getPixelForValue(iv.upper);
        ctx.beginPath();
        if (horizontal) {
          ctx.moveTo(a, el.y); ctx.lineTo(b, el.y);
          ctx.moveTo(a, el.y - 4); ctx.lineTo(a, el.y + 4); ctx.moveTo(b, el.y - 4); ctx.lineTo(b, el.y + 4);
        } else {
          ctx.moveTo(el.x, a); ctx.lineTo(el.x, b);
          ctx.moveTo(el.x - 4, a); ctx.lineTo(el.x + 4, a); ctx.moveTo(el.x - 4, b); ctx.lineTo(el.x + 4, b);
        }
        ctx.stroke();
      });
      ctx.restore();
    });
  },
};

/**
 * options.plugins.flGuides: {bands: [{from, to, color, label}], lines: [{x | y, color, label, dash}]}, in the
 * values of the x (bands, x lines) or y scale. Labels are drawn on the canvas as text.
 */
const guides = {
  id: 'flGuides',
  beforeDatasetsDraw(chart, _args, opts) {
    const { ctx, chartArea: area, scales: { x, y } } = chart;
    ctx.save();
    for (const b of opts.bands ?? []) {
      const left = Math.max(area.left, x.getPixelForValue(b.from));
      const right = Math.min(area.right, x.getPixelForValue(b.to));
      ctx.fillStyle = b.color;
      ctx.fillRect(left, area.top, Math.max(1, right - left), area.bottom - area.top);
    }
    ctx.restore();
  },
  afterDatasetsDraw(chart, _args, opts) {
    const { ctx, chartArea: area, scales } = chart;
    ctx.save();
    ctx.font = '12px system-ui, sans-serif';
    let row = 0;
    for (const l of opts.lines ?? []) {
      ctx.strokeStyle = l.color ?? COLORS.ink;
      ctx.fillStyle = l.color ?? COLORS.ink;
      ctx.lineWidth = l.width ?? 1.5;
      ctx.setLineDash(l.dash ?? [5, 4]);
      ctx.beginPath();
      if (l.x !== undefined) {
        const px = scales.x.getPixelForValue(l.x);
        if (px < area.left - 1 || px > area.right + 1) continue;
        ctx.moveTo(px, area.top); ctx.lineTo(px, area.bottom); ctx.stroke();
        if (l.label) {
          const w = ctx.measureText(l.label).width;
          const tx = px + 4 + w > area.right ? px - 4 - w : px + 4;
          ctx.fillText(l.label, tx, area.top + 12 + 14 * (row++ % 3));
        }
      } else {
        const scale = scales[l.axis ?? (chart.options.indexAxis === 'y' ? 'x' : 'y')];
        const p = scale.getPixelForValue(l.y);
        if (chart.options.indexAxis === 'y') { ctx.moveTo(p, area.top); ctx.lineTo(p, area.bottom); }
        else { ctx.moveTo(area.left, p); ctx.lineTo(area.right, p); }
        ctx.stroke();
        if (l.label) {
          const w = ctx.measureText(l.label).width;
          if (chart.options.indexAxis === 'y') {
            ctx.fillText(l.label, p + 4 + w > area.right ? p - 4 - w : p + 4, area.bottom - 6 - 14 * (row++ % 3));
          } else ctx.fillText(l.label, area.right - w - 2, p - 5);
        }
      }
    }
    ctx.restore();
  },
};

let firstDrawn = false;
/** Marks the first chart drawn after navigation in the Performance timeline (docs/benchmarks.md). */
const timing = {
  id: 'flTiming',
  afterRender() {
    if (!firstDrawn) {
      firstDrawn = true;
      performance.mark('foldline:first-chart');
    }
  },
};

let registered = false;
function register() {
  if (registered) return;
  registered = true;
  const C = window.Chart;
  C.register(background, intervals, guides, timing);
  C.defaults.animation = false;
  C.defaults.font.family = 'system-ui, -apple-system, "Segoe UI", Roboto, sans-serif';
  C.defaults.color = COLORS.ink;
  C.defaults.borderColor = COLORS.grid;
  C.defaults.maintainAspectRatio = false;
  C.defaults.plugins.legend.position = 'bottom';
  C.defaults.plugins.legend.labels.boxWidth = 14;
  C.defaults.plugins.tooltip.backgroundColor = 'rgba(34,48,58,0.92)';
}

/** A new chart on the canvas (any previous chart on it is destroyed first). */
export function makeChart(canvas, config) {
  if (!window.Chart) throw new Error('the chart library did not load');
  register();
  window.Chart.getChart(canvas)?.destroy();
  return new window.Chart(canvas, config);
}

/** A small trend line drawn straight on a canvas (no axes); null values leave gaps. */
export function sparkline(canvas, values, color = COLORS.blue) {
  const ratio = window.devicePixelRatio || 1;
  const w = canvas.clientWidth || 120;
  const hgt = canvas.clientHeight || 28;
  canvas.width = w * ratio;
  canvas.height = hgt * ratio;
  const ctx = canvas.getContext('2d');
  ctx.scale(ratio, ratio);
  const finite = values.filter((v) => Number.isFinite(v));
  canvas.dataset.points = String(values.length);
  if (finite.length < 2) return;
  const min = Math.min(...finite);
  const span = Math.max(...finite) - min || 1;
  ctx.strokeStyle = color;
  ctx.lineWidth = 1.5;
  ctx.beginPath();
  let pen = false;
  values.forEach((v, i) => {
    if (!Number.isFinite(v)) { pen = false; return; }
    const px = 2 + (i / Math.max(1, values.length - 1)) * (w - 4);
    const py = hgt - 3 - ((v - min) / span) * (hgt - 6);
    if (pen) ctx.lineTo(px, py); else ctx.moveTo(px, py);
    pen = true;
  });
  ctx.stroke();
}
