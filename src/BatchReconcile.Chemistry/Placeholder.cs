namespace BatchReconcile.Chemistry;
internal static class Placeholder { }
