/**
 * A page that mounts the diagram components with plain props, for tests/e2e/diagrams.test.ts.
 * The cycles and sweeps are computed by the engine in the page itself (it is pure), so what is
 * drawn is real engine output. `?units=us` switches the unit system. Never part of the app.
 */
import { AppRegistry, ScrollView, StyleSheet } from 'react-native';

import { SweepChart, TsDiagram, TsOverlay } from '@/components/diagrams';
import { Card } from '@/components/ui/card';
import { CautionLine } from '@/components/ui/caution-line';
import type { UnitSystem } from '@/components/ui/format';
import { Heading } from '@/components/ui/text';
import { ThemeProvider, useTheme } from '@/components/ui/theme';
import { candidateSeries, space } from '@/components/ui/tokens';
import { evaluateCycle, sweepCycle } from '@/server/engine';
import { irrCombustion, simpleAir, variant } from '@/tests/engine/cases';

const units: UnitSystem = new URLSearchParams(window.location.search).get('units') === 'us' ? 'us' : 'si';

const simple = evaluateCycle(simpleAir);
const irr = evaluateCycle(irrCombustion);
const regenerative = evaluateCycle(
  variant(simpleAir, (c) => {
    c.compressor.pressureRatio = 7;
    c.regenerator = { effectiveness: 0.85, airSidePressureLoss: 0.03, gasSidePressureLoss: 0.03 };
  }),
);
const inletSweep = sweepCycle({
  base: simpleAir,
  parameter: 'turbine.inletTemperatureK',
  from: 400,
  to: 1800,
  points: 15,
});
const ratioSweep = sweepCycle({ base: simpleAir, parameter: 'compressor.pressureRatio', from: 2, to: 80, points: 40 });

const candidates = [
  { id: 'simple', name: 'Simple', colour: candidateSeries[0], cycle: simple },
  { id: 'regen', name: 'Regenerative', colour: candidateSeries[1], cycle: regenerative },
  { id: 'irr', name: 'Intercooled + reheat + regenerative', colour: candidateSeries[2], cycle: irr },
];

function Page() {
  const t = useTheme();
  return (
    <ScrollView style={{ backgroundColor: t.surface }} contentContainerStyle={styles.page}>
      <Card style={styles.card} testID="card-simple">
        <Heading level={3}>Simple</Heading>
        <TsDiagram name="Simple" cycle={simple} colour={candidateSeries[0]} unitSystem={units} testID="ts-simple" />
      </Card>
      <Card style={styles.card} testID="card-irr">
        <Heading level={3}>Intercooled + reheat + regenerative</Heading>
        <TsDiagram
          name="Intercooled + reheat + regenerative"
          cycle={irr}
          colour={candidateSeries[2]}
          unitSystem={units}
          testID="ts-irr"
        />
      </Card>
      <Card style={styles.card}>
        <TsDiagram name="IRR detail" cycle={irr} size="large" unitSystem={units} testID="ts-irr-large" />
      </Card>
      <Card style={styles.card}>
        <TsOverlay candidates={candidates} unitSystem={units} testID="overlay" />
      </Card>
      <Card style={styles.card}>
        <SweepChart
          sweep={inletSweep}
          current={{ value: 1500, figures: simple }}
          colour={candidateSeries[0]}
          unitSystem={units}
          testID="sweep-inlet"
        />
      </Card>
      <Card style={styles.card}>
        <SweepChart sweep={ratioSweep} current={{ value: 15 }} unitSystem={units} testID="sweep-ratio" />
      </Card>
      <CautionLine />
    </ScrollView>
  );
}

function Root() {
  return (
    <ThemeProvider>
      <Page />
    </ThemeProvider>
  );
}

const styles = StyleSheet.create({
  page: { padding: space[2], gap: space[2], maxWidth: 900, width: '100%', alignSelf: 'center' },
  card: { padding: space[2], gap: space[1] },
});

AppRegistry.registerComponent('diagrams', () => Root);
AppRegistry.runApplication('diagrams', { rootTag: document.getElementById('root') });
