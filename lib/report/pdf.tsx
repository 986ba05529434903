/**
 * The PDF form of the report, made on the server with @react-pdf/renderer from the report model.
 * Fonts: DejaVu Sans and Sans Mono (static TTF from the dejavu-fonts-ttf package, copied into
 * public/fonts with their licence): Latin, Greek and the mathematical signs the formulas use.
 * Figures are vector drawings (Svg primitives) from the same geometry as the report page.
 */
import path from 'node:path';
import { Document, Font, G, Line, Page, Polyline, Rect, StyleSheet, Svg, Text, View, renderToBuffer } from '@react-pdf/renderer';
import type { FigureModel } from './figure';
import type { ReportBlock, ReportModel } from './types';
import { reportTime } from './time';
import { PdfMarkdown } from './pdf-markdown';

const FONT_DIR = path.join(process.cwd(), 'public', 'fonts');
export const PDF_FONT_FILES = {
  sans: path.join(FONT_DIR, 'DejaVuSans.ttf'),
  sansBold: path.join(FONT_DIR, 'DejaVuSans-Bold.ttf'),
  sansOblique: path.join(FONT_DIR, 'DejaVuSans-Oblique.ttf'),
  sansBoldOblique: path.join(FONT_DIR, 'DejaVuSans-BoldOblique.ttf'),
  mono: path.join(FONT_DIR, 'DejaVuSansMono.ttf'),
};

let fontsRegistered = false;
function registerFonts(): void {
  if (fontsRegistered) return;
  Font.register({
    family: 'DejaVu Sans',
    fonts: [
      { src: PDF_FONT_FILES.sans, fontWeight: 'normal' },
      { src: PDF_FONT_FILES.sansBold, fontWeight: 'bold' },
      { src: PDF_FONT_FILES.sansOblique, fontStyle: 'italic' },
      { src: PDF_FONT_FILES.sansBoldOblique, fontWeight: 'bold', fontStyle: 'italic' },
    ],
  });
  Font.register({ family: 'DejaVu Sans Mono', src: PDF_FONT_FILES.mono });
  // Hashes, expressions and units must never be hyphenated.
  Font.registerHyphenationCallback((word) => [word]);
  fontsRegistered = true;
}

const INK = '#1d2327';
const SLATE = '#5b6670';
const RULE = '#c9ced2';
const OXIDE = '#9c3b25';
const CLAY = '#8a5a1e';
const RIVER = '#2f5f8a';

const styles = StyleSheet.create({
  page: { fontFamily: 'DejaVu Sans', fontSize: 9, color: INK, paddingTop: 54, paddingBottom: 50, paddingHorizontal: 42 },
  // lineHeight lives here, not on the page: on the page it hides the page-number text (react-pdf 4.9).
  body: { lineHeight: 1.35 },
  header: { position: 'absolute', top: 20, left: 42, right: 42, flexDirection: 'row', justifyContent: 'space-between', fontSize: 7.5, color: SLATE, borderBottomWidth: 0.5, borderBottomColor: RULE, paddingBottom: 4 },
  footerRule: { position: 'absolute', bottom: 34, left: 42, right: 42, borderTopWidth: 0.5, borderTopColor: RULE },
  footerLeft: { position: 'absolute', bottom: 22, left: 42, fontSize: 7.5, color: SLATE },
  footerRight: { position: 'absolute', bottom: 22, left: 300, right: 42, fontSize: 7.5, color: SLATE, textAlign: 'right' },
  banner: { borderWidth: 1, borderColor: OXIDE, color: OXIDE, fontWeight: 'bold', fontSize: 10, textAlign: 'center', paddingVertical: 3, marginBottom: 8 },
  h1: { fontSize: 16, fontWeight: 'bold', marginBottom: 4 },
  h2: { fontSize: 12, fontWeight: 'bold', marginTop: 10, marginBottom: 4 },
  h3: { fontSize: 10.5, fontWeight: 'bold' },
  mono: { fontFamily: 'DejaVu Sans Mono', fontSize: 8.5 },
  small: { fontSize: 8, color: SLATE },
  row: { flexDirection: 'row' },
  label: { width: 110, color: SLATE },
  cell: { paddingVertical: 1.5, paddingRight: 4 },
  tableHead: { flexDirection: 'row', borderBottomWidth: 0.5, borderBottomColor: RULE, color: SLATE, fontSize: 8 },
  tableRow: { flexDirection: 'row', borderBottomWidth: 0.25, borderBottomColor: RULE },
  block: { borderTopWidth: 0.75, borderTopColor: RULE, paddingTop: 6, marginTop: 8 },
  caution: { fontSize: 8, color: CLAY },
  error: { color: OXIDE },
  notice: { borderWidth: 0.75, borderColor: CLAY, padding: 5, marginTop: 6, fontSize: 8.5 },
});

function Meta({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <View style={styles.row}>
      <Text style={styles.label}>{label}</Text>
      <View style={{ flex: 1 }}>{typeof children === 'string' ? <Text>{children}</Text> : children}</View>
    </View>
  );
}

function Figure({ figure }: { figure: FigureModel }) {
  const { plot } = figure;
  const scale = 0.95;
  return (
    <View wrap={false} style={{ marginTop: 6 }}>
      <Text style={{ fontSize: 8.5, fontWeight: 'bold' }}>Figure: {figure.title}</Text>
      <Svg width={figure.width * scale} height={figure.height * scale} viewBox={`0 0 ${figure.width} ${figure.height}`}>
        <Rect x={plot.left} y={plot.top} width={plot.right - plot.left} height={plot.bottom - plot.top} stroke={RULE} strokeWidth={0.75} fill="none" />
        {figure.xTicks.map((tick) => (
          <G key={`x${tick.at}`}>
            <Line x1={tick.at} y1={plot.bottom} x2={tick.at} y2={plot.bottom + 4} stroke={SLATE} strokeWidth={0.75} />
            <Text x={tick.at} y={plot.bottom + 13} style={{ fontSize: 7 }} fill={SLATE} textAnchor="middle">
              {tick.label}
            </Text>
          </G>
        ))}
        {figure.yTicks.map((tick) => (
          <G key={`y${tick.at}`}>
            <Line x1={plot.left - 4} y1={tick.at} x2={plot.left} y2={tick.at} stroke={SLATE} strokeWidth={0.75} />
            <Text x={plot.left - 6} y={tick.at + 2.5} style={{ fontSize: 7 }} fill={SLATE} textAnchor="end">
              {tick.label}
            </Text>
          </G>
        ))}
        <Polyline points={figure.points} stroke={RIVER} strokeWidth={1.25} fill="none" />
        <Text x={(plot.left + plot.right) / 2} y={figure.height - 8} style={{ fontSize: 7.5 }} fill={INK} textAnchor="middle">
          {figure.xAxisLabel}
        </Text>
      </Svg>
      <Text style={styles.small}>
        Vertical axis: {figure.yAxisLabel}
        {figure.yDownward ? ' (increasing downward)' : ''}. Horizontal axis: {figure.xAxisLabel}.
      </Text>
    </View>
  );
}

function Block({ block, index }: { block: ReportBlock; index: number }) {
  const cites = block.sources.length ? ` [${block.sources.join(', ')}]` : '';
  return (
    <View style={styles.block}>
      <View wrap={false}>
        <Text style={styles.h3}>
          {index}. {block.name} <Text style={{ fontWeight: 'normal', color: SLATE }}>· {block.typeTitle}{cites}</Text>
        </Text>
        {block.note ? <PdfMarkdown text={block.note} /> : null}
        {block.status === 'note' ? null : (
          <>
            {block.formula ? (
              <Text style={[styles.mono, { marginTop: 3 }]}>{block.formula}</Text>
            ) : null}
            {block.inputs.length ? (
              <View style={{ marginTop: 4 }}>
                <View style={styles.tableHead}>
                  <Text style={[styles.cell, { width: '28%' }]}>Input</Text>
                  <Text style={[styles.cell, { width: '40%' }]}>As written</Text>
                  <Text style={[styles.cell, { width: '32%' }]}>As evaluated</Text>
                </View>
                {block.inputs.map((input) => (
                  <View key={input.name} style={styles.tableRow}>
                    <Text style={[styles.cell, { width: '28%' }]}>{input.label}</Text>
                    <Text style={[styles.cell, styles.mono, { width: '40%' }]}>{input.written}</Text>
                    <Text style={[styles.cell, styles.mono, { width: '32%' }]}>{input.evaluated}</Text>
                  </View>
                ))}
              </View>
            ) : null}
            {block.outputs.length ? (
              <View style={{ marginTop: 4 }}>
                <View style={styles.tableHead}>
                  <Text style={[styles.cell, { width: '34%' }]}>Output</Text>
                  <Text style={[styles.cell, { width: '33%' }]}>Value</Text>
                  <Text style={[styles.cell, { width: '33%' }]}>SI</Text>
                </View>
                {block.outputs.map((output) => (
                  <View key={output.name} style={styles.tableRow}>
                    <Text style={[styles.cell, { width: '34%' }]}>{output.label}</Text>
                    <View style={[styles.cell, { width: '33%' }]}>
                      <Text style={styles.mono}>
                        {output.value}
                        {output.unit ? ` ${output.unit}` : ''}
                      </Text>
                      {[output.spread, output.alternative].map((spread, k) =>
                        spread ? (
                          <Text key={k} style={styles.small}>
                            {k === 1 ? 'for comparison: ' : ''}
                            {spread.text} ({spread.label})
                            {spread.drivers ? `; ${spread.method === 'linear' ? 'shares of the variance' : 'rank correlations'}: ${spread.drivers}` : ''}
                          </Text>
                        ) : null,
                      )}
                    </View>
                    <Text style={[styles.cell, styles.mono, { width: '33%', color: SLATE }]}>
                      {output.si}
                      {output.siUnit ? ` ${output.siUnit}` : ''}
                    </Text>
                  </View>
                ))}
              </View>
            ) : null}
            <Text style={[{ marginTop: 3 }, block.status === 'ok' ? {} : styles.error]}>
              Status: {block.status}
              {block.error ? `: ${block.error}` : ''}
            </Text>
            {block.warnings.map((warning) => (
              <Text key={warning} style={styles.caution}>
                Warning: {warning}
              </Text>
            ))}
          </>
        )}
      </View>
      {block.figures.map((figure) => (
        <Figure key={figure.name} figure={figure} />
      ))}
      {block.status === 'note' ? null : (
        <View style={{ marginTop: 4 }}>
          {block.validity.length ? <Text style={styles.small}>Validity: {block.validity.join(' ')}</Text> : null}
          {block.cautions.map((caution) => (
            <Text key={caution} style={styles.caution}>
              Caution: {caution}
            </Text>
          ))}
          {block.verification ? <Text style={styles.small}>Method check: {block.verification}</Text> : null}
        </View>
      )}
    </View>
  );
}

export function ReportPdf({ model }: { model: ReportModel }) {
  const place = model.site
    ? [model.site.name, model.site.latitude !== undefined && model.site.longitude !== undefined ? `${model.site.latitude}, ${model.site.longitude}` : '']
        .filter(Boolean)
        .join(' · ')
    : '—';
  return (
    <Document title={`${model.title} r${model.revision.number}`} author={model.team} subject="Calculation report" creator="Denudata" producer="Denudata">
      <Page size="A4" style={styles.page} wrap>
        <View style={styles.header} fixed>
          <Text>{model.title}</Text>
          <Text>
            r{model.revision.number} · {model.revision.shortHash}
          </Text>
        </View>
        <View style={styles.footerRule} fixed />
        <Text style={styles.footerLeft} fixed>
          Denudata calculation report · {model.status === 'approved' ? 'approved' : model.statusWords.toLowerCase()}
        </Text>
        <Text style={styles.footerRight} fixed render={({ pageNumber, totalPages }) => `Page ${pageNumber} of ${totalPages}`} />
        {model.banner ? (
          <Text style={styles.banner} fixed>
            {model.banner}
          </Text>
        ) : null}

        <View style={styles.body}>
        <Text style={styles.h1}>{model.title}</Text>
        <Text style={[styles.small, { marginBottom: 6 }]}>Calculation report of revision {model.revision.number}</Text>
        <Meta label="Site">{place}</Meta>
        {model.site?.notes ? <Meta label="Site notes">{model.site.notes}</Meta> : null}
        <Meta label="Team">{model.team || '—'}</Meta>
        <Meta label="Revision">{`r${model.revision.number}, saved ${reportTime(model.revision.createdAt)}${model.revision.message ? `: “${model.revision.message}”` : ''}`}</Meta>
        <Meta label="SHA-256">
          <Text style={styles.mono}>{model.revision.hash}</Text>
        </Meta>
        <Meta label="Engine">{model.engine.changed ? `${model.engine.recorded} (recorded), ${model.engine.current} (current)` : model.engine.recorded}</Meta>
        <Meta label="Report made">{reportTime(model.generatedAt)}</Meta>
        <Meta label="Review status">{model.statusWords}</Meta>
        {model.uncertainty ? (
          <Meta label="Uncertainty">
            <Text>{model.uncertainty.method}</Text>
            {model.uncertainty.inputs.map((line) => (
              <Text key={line} style={styles.mono}>
                {line}
              </Text>
            ))}
            {model.uncertainty.note ? <Text style={styles.small}>{model.uncertainty.note}</Text> : null}
          </Meta>
        ) : null}

        <Text style={styles.h2}>Sign-off</Text>
        <View style={styles.tableHead}>
          <Text style={[styles.cell, { width: '18%' }]}>Role</Text>
          <Text style={[styles.cell, { width: '24%' }]}>Name</Text>
          <Text style={[styles.cell, { width: '22%' }]}>Date</Text>
          <Text style={[styles.cell, { width: '36%' }]}>Note</Text>
        </View>
        {model.signOff.map((row) => (
          <View key={row.role} style={styles.tableRow}>
            <Text style={[styles.cell, { width: '18%' }]}>{row.role}</Text>
            <Text style={[styles.cell, { width: '24%' }]}>{row.name ?? 'not yet'}</Text>
            <Text style={[styles.cell, { width: '22%' }]}>{row.name ? reportTime(row.at) : '—'}</Text>
            <Text style={[styles.cell, { width: '36%' }]}>{row.note || '—'}</Text>
          </View>
        ))}
        {model.trail.length ? (
          <View style={{ marginTop: 4 }}>
            <Text style={styles.small}>Review trail:</Text>
            {model.trail.map((entry, i) => (
              <Text key={i} style={styles.small}>
                {reportTime(entry.at)} · {entry.action} · {entry.by?.name ?? 'someone'}
                {entry.message ? `: ${entry.message}` : ''}
              </Text>
            ))}
          </View>
        ) : null}

        {model.recomputeNotice ? (
          <View style={styles.notice}>
            <Text>{model.recomputeNotice}</Text>
            {model.differences.slice(0, 40).map((d) => (
              <Text key={`${d.block}.${d.output}`} style={styles.mono}>
                {d.block}
                {d.output ? `.${d.output}` : ''}: recorded {d.recorded}, now {d.computed}
              </Text>
            ))}
          </View>
        ) : null}

        <View style={[styles.notice, { borderColor: RULE }]}>
          <Text style={{ fontWeight: 'bold' }}>Caution</Text>
          <Text>{model.generalCaution}</Text>
        </View>

        <Text style={styles.h2} break>
          Calculation
        </Text>
        {model.blocks.map((block, i) => (
          <Block key={block.id} block={block} index={i + 1} />
        ))}

        <View>
          <Text style={styles.h2} minPresenceAhead={60}>
            Sources
          </Text>
          {model.sources.length === 0 ? <Text style={styles.small}>No published sources: the sheet uses only free-form blocks.</Text> : null}
          {model.sources.map((source) => (
            <Text key={source.number} style={{ marginBottom: 2 }}>
              [{source.number}] {source.text} <Text style={styles.small}>(used by: {source.usedBy.join('; ')})</Text>
            </Text>
          ))}
          <Text style={[styles.h3, { marginTop: 8 }]}>Method checks (engine {model.verification.engine})</Text>
          {model.verification.lines.map((line) => (
            <Text key={line.typeTitle} style={line.pass ? styles.small : [styles.small, styles.error]}>
              {line.typeTitle}: {line.line}
            </Text>
          ))}
        </View>
        </View>
      </Page>
    </Document>
  );
}

/** The PDF bytes of a report. */
export async function renderReportPdf(model: ReportModel): Promise<Buffer> {
  registerFonts();
  return renderToBuffer(<ReportPdf model={model} />);
}
