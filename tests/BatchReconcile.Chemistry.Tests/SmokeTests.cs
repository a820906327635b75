namespace BatchReconcile.Chemistry.Tests;
public class SmokeTests { [Fact] public void Runs() => Assert.True(1 + 1 == 2); }
