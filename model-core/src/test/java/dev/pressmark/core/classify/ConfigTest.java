package dev.pressmark.core.classify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.Map;
import org.junit.jupiter.api.Test;

class ConfigTest {

    @Test
    void an_svm_config_names_the_field_the_bound_and_the_bad_value() {
        assertThatThrownBy(() -> SvmConfig.defaults().withC(-1.0)).hasMessage("c must be > 0, was -1.0");
        assertThatThrownBy(() -> SvmConfig.defaults().withC(Double.NaN)).hasMessage("c must be > 0, was NaN");
        assertThatThrownBy(() -> SvmConfig.defaults().withC(Double.POSITIVE_INFINITY))
                .hasMessage("c must be finite, was Infinity");
        assertThatThrownBy(() -> SvmConfig.defaults().withTolerance(0.0)).hasMessage("tolerance must be > 0, was 0.0");
        assertThatThrownBy(() -> SvmConfig.defaults().withMaxIterations(0))
                .hasMessage("maxIterations must be >= 1, was 0");
        assertThatThrownBy(() -> SvmConfig.defaults().withBias(-0.5)).hasMessage("bias must be >= 0, was -0.5");
        assertThatThrownBy(() -> SvmConfig.defaults().withLoss(null)).hasMessage("loss");
    }

    @Test
    void a_logistic_config_names_the_field_the_bound_and_the_bad_value() {
        assertThatThrownBy(() -> new LogisticConfig(0.0, 0.1, 10, 1.0)).hasMessage("c must be > 0, was 0.0");
        assertThatThrownBy(() -> new LogisticConfig(1.0, -0.1, 10, 1.0)).hasMessage("tolerance must be > 0, was -0.1");
        assertThatThrownBy(() -> new LogisticConfig(1.0, 0.1, -3, 1.0)).hasMessage("maxIterations must be >= 1, was -3");
        assertThatThrownBy(() -> new LogisticConfig(1.0, 0.1, 10, Double.NaN)).hasMessage("bias must be >= 0, was NaN");
    }

    @Test
    void the_defaults_are_the_documented_ones() {
        assertThat(SvmConfig.defaults()).isEqualTo(new SvmConfig(1.0, SvmLoss.SQUARED_HINGE, 0.1, 1000, 1.0));
        assertThat(LogisticConfig.defaults()).isEqualTo(new LogisticConfig(1.0, 0.1, 1000, 1.0));
    }

    @Test
    void explicit_class_weights_refuse_bad_entries() {
        assertThatThrownBy(() -> ClassWeights.of(Map.of(0, -2.0))).hasMessage("weight of class 0 must be > 0, was -2.0");
        assertThatThrownBy(() -> ClassWeights.of(Map.of(-1, 2.0))).hasMessage("class weight key must be >= 0, was -1");
        assertThatThrownBy(() -> ClassWeights.of(Map.of(2, 2.0)).resolve(new int[] {0, 1}, 2))
                .hasMessage("class weight given for class 2, but classes are 0 .. 1");
    }
}
