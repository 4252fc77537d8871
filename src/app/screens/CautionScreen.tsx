import { Caution } from '../components/Caution.js';

export default function CautionScreen() {
  return (
    <section aria-labelledby="caution-title">
      <h1 id="caution-title">What the results mean</h1>
      <Caution indicative />
      <p>
        Levels B, C and D are the ISO 5817 quality levels; “below D” means the seam does not meet level D. A
        value within the instrument's resolution of a limit is marked borderline: measure it again or with a
        finer instrument before deciding.
      </p>
    </section>
  );
}
